import "server-only";

import { fittedJobOfQuote } from "@/db/queries/jobs";
import { getPartsByIds } from "@/db/queries/parts";
import { getShopSettings } from "@/db/queries/shops";
import {
  holdSummary,
  promiseLines,
  type LinePromise,
  type PromiseLine,
  type StockFacts,
} from "@/lib/catalog/stock";
import { fittedSummary } from "@/lib/domain/jobs";
import type { InvoiceStatus } from "@/lib/domain/operations";
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

/** What became of a quote's parts once its job is fitted: they were issued, not promised. */
export interface QuoteFitted {
  jobId: string;
  jobNumber: number;
  fittedAt: Date | null;
  /** "Fitted: 1 × Pump A. Quoted, not fitted: Filter B." (lib/domain/jobs.ts#fittedSummary) */
  summary: string;
  /** The invoice raised from the job, if any (a customer is shown only an issued one). */
  invoice: { id: string; number: number | null; status: InvoiceStatus } | null;
}

/**
 * What a quote's page says about its parts, as of now: once its job is fitted (the parts issued
 * from stock, then invoiced), what was fitted (`fitted`) and no stock sentence; before that, for
 * a quote offered or holding stock (`shown`, its status as of today, in STOCK_SHOWN), what
 * accepting holds or what it holds (`stock`). Only an ordered quote has a job. For the customer
 * (`customer`), an invoice still a draft is not named.
 */
export async function quoteParts(
  shopId: string,
  quote: { id: string; status: QuoteStatus },
  shown: QuoteStatus,
  lines: (PromiseLine & { heldQty: number; description: string })[],
  { customer = false }: { customer?: boolean } = {},
): Promise<{ stock: QuoteStock | null; fitted: QuoteFitted | null }> {
  const job = quote.status === "ordered" ? await fittedJobOfQuote(shopId, quote.id) : null;
  // A labour-only job had no parts to promise or fit: nothing to say.
  if (job && job.lines.length === 0) return { stock: null, fitted: null };
  if (job)
    return {
      stock: null,
      fitted: {
        jobId: job.id,
        jobNumber: job.number,
        fittedAt: job.fittedAt,
        summary: fittedSummary(job.lines),
        invoice:
          job.invoiceId && job.invoiceStatus && !(customer && job.invoiceStatus === "draft")
            ? { id: job.invoiceId, number: job.invoiceNumber, status: job.invoiceStatus }
            : null,
      },
    };
  const stock = STOCK_SHOWN.includes(shown) ? await quoteStock(shopId, quote.status, lines) : null;
  return { stock, fitted: null };
}
