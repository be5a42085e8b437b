import "server-only";

import { getPartsByIds } from "@/db/queries/parts";
import { getShopSettings } from "@/db/queries/shops";
import {
  holdSummary,
  promiseLines,
  type LinePromise,
  type PromiseLine,
  type StockFacts,
} from "@/lib/catalog/stock";
import { QUOTE_HOLDS_STOCK, type QuoteStatus } from "@/lib/domain/quotes";
import { calendarDay } from "@/lib/format/dates";

/** Statuses (as of today) whose page says what the parts are promised: offered, or held. */
export const STOCK_SHOWN: readonly QuoteStatus[] = ["draft", "sent", ...QUOTE_HOLDS_STOCK];

export interface QuoteStock {
  /** The quote holds stock now (accepted, deposit paid, ordered): `promises` say what it holds. */
  holding: boolean;
  /** Per line; null for labour, fees and parts no longer in the catalog. */
  promises: (LinePromise | null)[];
  /** One sentence: what accepting holds (or holds now) and what is back-ordered until when. */
  summary: string;
}

/**
 * What a quote's part lines are promised, as the counter and the customer read it: for a quote
 * that holds stock, what it holds (stored per line at acceptance); before that, what accepting it
 * now would hold from the free stock, the rest back-ordered with its expected day counted in the
 * shop's time zone. Reads only.
 */
export async function quoteStock(
  shopId: string,
  status: QuoteStatus,
  lines: (PromiseLine & { heldQty: number; description: string })[],
): Promise<QuoteStock> {
  const ids = [...new Set(lines.flatMap((l) => (l.kind === "part" && l.partId ? [l.partId] : [])))];
  const [found, settings] = await Promise.all([
    getPartsByIds(shopId, ids),
    getShopSettings(shopId),
  ]);
  const parts = new Map<string, StockFacts>(
    found.map((p) => [
      p.id,
      {
        stock: p.stock,
        reserved: p.reserved,
        leadTimeDays: p.leadTimeDays,
        restockOn: p.restockOn,
      },
    ]),
  );
  const holding = QUOTE_HOLDS_STOCK.includes(status);
  const today = calendarDay(new Date(), settings?.settings.timeZone ?? "UTC");
  const promises = promiseLines(lines, parts, { holding, today });
  return { holding, promises, summary: holdSummary(lines, promises) };
}
