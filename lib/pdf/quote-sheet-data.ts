import "server-only";

import { pdfLogo } from "@/db/queries/logos";
import { listPayments } from "@/db/queries/payments";
import { getQuote } from "@/db/queries/quotes";
import { getShopSettings } from "@/db/queries/shops";
import { formatMoney } from "@/lib/catalog/money";
import { NotFound } from "@/lib/domain/errors";
import { isoDay, QUOTE_STATUS_LABELS, quoteLabel, quoteStatusOn } from "@/lib/domain/quotes";
import { formatDate } from "@/lib/format/dates";
import { depositOf } from "@/lib/payments/deposit";
import { formatRateBp, presentQuote } from "@/lib/quotes/quote-presentation";

import type { QuoteSheetData } from "./quote-sheet";

/**
 * Everything a quote PDF prints; with `portalUserId`, only that customer's own quote. With
 * `asSent`, a draft prints as the customer receives it once sent (the e-mail's attachment).
 */
export async function quoteSheetData(
  shopId: string,
  id: string,
  portalUserId?: string,
  opts: { asSent?: boolean } = {},
): Promise<QuoteSheetData> {
  const q = await getQuote(shopId, id, portalUserId);
  if (!q) throw new NotFound("That quote");
  const [settings, logo, payments] = await Promise.all([
    getShopSettings(shopId),
    pdfLogo(shopId),
    listPayments(shopId, id),
  ]);
  const qt = q.quote;
  const money = (v: number) => formatMoney(v, qt.currency);
  const presented = presentQuote(qt, q.lines);
  const depositBp = settings?.settings.depositBp ?? 3000;
  const timeZone = settings?.settings.timeZone ?? "UTC";
  const paid = payments.find((p) => p.status === "paid");
  // As of today: past its date a sent or accepted quote prints as expired, asking no deposit.
  const stored = opts.asSent && qt.status === "draft" ? { ...qt, status: "sent" as const } : qt;
  const shown = quoteStatusOn(stored, isoDay(new Date(), timeZone));
  const showDeposit =
    depositBp > 0 && ["sent", "accepted", "deposit_paid", "ordered"].includes(shown);
  return {
    shop: {
      name: settings?.name ?? "",
      address: settings?.settings.address ?? null,
      phone: settings?.settings.phone ?? null,
      logo,
    },
    quote: {
      label: quoteLabel(qt.number, qt.revision),
      status: QUOTE_STATUS_LABELS[shown],
      createdAt: qt.createdAt,
      validUntil: qt.validUntil,
      notes: qt.notes,
      currency: qt.currency,
    },
    customer: { name: q.customerName, email: q.customerEmail },
    buildTitle: q.buildTitle,
    presented,
    deposit: paid
      ? {
          rate: formatRateBp(depositBp),
          amount: money(paid.amountMinor),
          paid: paid.paidAt ? formatDate(paid.paidAt, { timeZone }) : "",
        }
      : showDeposit
        ? {
            rate: formatRateBp(depositBp),
            amount: money(depositOf(qt.totalMinor, depositBp)),
            paid: null,
          }
        : null,
    paper: settings?.settings.paperSize ?? "a4",
    timeZone,
  };
}

export const quotePdfName = (label: string) => `quote-${label.replace(/[^\w.-]+/g, "-")}.pdf`;
