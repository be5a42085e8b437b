import "server-only";

import { pdfLogo } from "@/db/queries/logos";
import { listPayments } from "@/db/queries/payments";
import { getQuote } from "@/db/queries/quotes";
import { getShopSettings } from "@/db/queries/shops";
import { formatMoney, formatScaled } from "@/lib/catalog/money";
import { quoteTotals } from "@/lib/catalog/quote-totals";
import { NotFound } from "@/lib/domain/errors";
import { isoDay, QUOTE_STATUS_LABELS, quoteLabel, quoteStatusOn } from "@/lib/domain/quotes";
import { formatDate } from "@/lib/format/dates";
import { depositOf } from "@/lib/payments/deposit";

import type { QuoteSheetData } from "./quote-sheet";

/** Everything a quote PDF prints; with `portalUserId`, only that customer's own quote. */
export async function quoteSheetData(
  shopId: string,
  id: string,
  portalUserId?: string,
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
  const t = quoteTotals(q.lines, qt.taxRateBp);
  const depositBp = settings?.settings.depositBp ?? 3000;
  const timeZone = settings?.settings.timeZone ?? "UTC";
  const paid = payments.find((p) => p.status === "paid");
  // As of today: past its date a sent or accepted quote prints as expired, asking no deposit.
  const shown = quoteStatusOn(qt, isoDay());
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
    lines: q.lines.map((l, i) => ({
      sku: l.sku,
      description: l.description,
      quantity: formatScaled(l.quantityMilli, 3),
      unitPrice: money(l.unitPriceMinor),
      discount: l.discountBp ? `${l.discountBp / 100} %` : null,
      net: money(t.lines[i]!.netMinor),
    })),
    totals: {
      subtotal: money(qt.subtotalMinor),
      discount: qt.discountMinor ? money(qt.discountMinor) : null,
      taxRatePct: String(qt.taxRateBp / 100),
      tax: money(qt.taxMinor),
      total: money(qt.totalMinor),
    },
    deposit: paid
      ? {
          pct: String(depositBp / 100),
          amount: money(paid.amountMinor),
          paid: paid.paidAt ? formatDate(paid.paidAt, { timeZone }) : "",
        }
      : showDeposit
        ? {
            pct: String(depositBp / 100),
            amount: money(depositOf(qt.totalMinor, depositBp)),
            paid: null,
          }
        : null,
    paper: settings?.settings.paperSize ?? "a4",
    timeZone,
  };
}

export const quotePdfName = (label: string) => `quote-${label.replace(/[^\w.-]+/g, "-")}.pdf`;
