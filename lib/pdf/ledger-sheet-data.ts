import "server-only";

import { getInvoice } from "@/db/queries/invoices";
import { pdfLogo } from "@/db/queries/logos";
import { getPurchaseOrder } from "@/db/queries/purchasing";
import { getShopSettings } from "@/db/queries/shops";
import { formatMoney } from "@/lib/catalog/money";
import { NotFound } from "@/lib/domain/errors";
import {
  creditNoteLabel,
  INVOICE_STATUS_LABELS,
  invoiceLabel,
  PO_STATUS_LABELS,
  poLabel,
} from "@/lib/domain/operations";
import { quoteLabel } from "@/lib/domain/quotes";
import { formatDate } from "@/lib/format/dates";
import { formatDeduction, presentQuote } from "@/lib/quotes/quote-presentation";

import type { LedgerSheetData } from "./ledger-sheet";

async function shopOf(shopId: string) {
  const [settings, logo] = await Promise.all([getShopSettings(shopId), pdfLogo(shopId)]);
  return {
    shop: {
      name: settings?.name ?? "",
      address: settings?.settings.address ?? null,
      phone: settings?.settings.phone ?? null,
      logo,
    },
    paper: settings?.settings.paperSize ?? "a4",
    timeZone: settings?.settings.timeZone ?? "UTC",
  };
}

/**
 * What an invoice PDF prints: its lines as the quote presents them, the totals, the deposit
 * deducted, credit notes and balance payments from the ledger, and the balance due. A customer
 * (with `portalUserId`) gets only their own issued invoice.
 */
export async function invoiceSheetData(
  shopId: string,
  id: string,
  portalUserId?: string,
): Promise<LedgerSheetData> {
  const inv = await getInvoice(shopId, id, portalUserId);
  if (!inv) throw new NotFound("That invoice");
  const { shop, paper, timeZone } = await shopOf(shopId);
  const i = inv.invoice;
  const money = (m: number) => formatMoney(m, i.currency);
  const p = presentQuote(i, inv.lines);
  const paid = inv.payments.filter((x) => x.status === "paid");
  return {
    shop,
    paper,
    title: invoiceSheetTitle(i.number),
    headLines: [
      `${INVOICE_STATUS_LABELS[i.status]}${i.issuedAt ? ` · issued ${formatDate(i.issuedAt, { timeZone })}` : ""}`,
      `Job J-${String(inv.jobNumber).padStart(4, "0")} · quote ${quoteLabel(inv.quoteNumber, inv.quoteRevision)}`,
    ],
    party: {
      heading: "Bill to",
      name: inv.customerName,
      lines: inv.customerEmail ? [inv.customerEmail] : [],
    },
    columns: [
      // As the quote's PDF: the discount column says the rate and the amount taken off.
      { label: "Item", width: "38%" },
      { label: "Qty", width: "8%", num: true },
      { label: "Unit price", width: "15%", num: true },
      { label: "Discount", width: "22%", num: true },
      { label: "Line total", width: "17%", num: true },
    ],
    rows: p.lines.map((l) => ({
      cells: [
        l.description,
        l.quantity,
        l.unitPrice,
        l.discountRate ? l.discount : "-",
        l.lineTotal,
      ],
      note: l.sku,
    })),
    figures: [
      { label: "Subtotal", value: p.subtotal },
      ...(p.discountNote ? [{ label: p.discountNote, value: "" }] : []),
      { label: p.taxLabel, value: p.tax },
      { label: "Total", value: p.total },
      { label: "Deposit paid", value: formatDeduction(i.depositMinor, i.currency) },
      ...inv.creditNotes.map((c) => ({
        label: `Credit note ${creditNoteLabel(c.number)}`,
        value: formatDeduction(c.amountMinor, i.currency),
      })),
      ...paid.map((x) => ({
        label: `Paid ${x.paidAt ? formatDate(x.paidAt, { timeZone }) : ""}`.trim(),
        value: formatDeduction(x.amountMinor, i.currency),
      })),
      { label: "Balance due", value: money(Math.max(0, inv.ledger.balanceMinor)), strong: true },
    ],
    notes: [
      ...(i.notes ? [i.notes] : []),
      ...inv.creditNotes.map((c) => `${creditNoteLabel(c.number)}: ${c.reason}`),
      ...(i.status === "issued" && inv.ledger.balanceMinor > 0
        ? ["Pay the balance from your portal."]
        : []),
    ],
    footer: `Invoice ${invoiceLabel(i.number)} · ${shop.name} · prices in ${i.currency}`,
  };
}

/** What a purchase order PDF prints: the supplier's SKUs, quantities, our costs and the total. */
export async function purchaseOrderSheetData(shopId: string, id: string): Promise<LedgerSheetData> {
  const po = await getPurchaseOrder(shopId, id);
  if (!po) throw new NotFound("That purchase order");
  const { shop, paper, timeZone } = await shopOf(shopId);
  const money = (m: number) => formatMoney(m, po.po.currency);
  return {
    shop,
    paper,
    title: purchaseOrderSheetTitle(po.po.number),
    headLines: [
      `${PO_STATUS_LABELS[po.po.status]} · made ${formatDate(po.po.createdAt, { timeZone })}`,
    ],
    party: {
      heading: "Supplier",
      name: po.supplierName,
      lines: [po.supplierContact, po.supplierEmail].filter((x): x is string => Boolean(x)),
    },
    columns: [
      { label: "Item", width: "50%" },
      { label: "Their SKU", width: "16%" },
      { label: "Qty", width: "10%", num: true },
      { label: "Unit cost", width: "12%", num: true },
      { label: "Amount", width: "12%", num: true },
    ],
    rows: po.lines.map((l) => ({
      cells: [
        l.description,
        l.supplierSku ?? "-",
        String(l.quantity),
        money(l.unitCostMinor),
        money(l.quantity * l.unitCostMinor),
      ],
      note: `Our SKU ${l.sku}`,
    })),
    figures: [{ label: "Total", value: money(po.po.totalMinor), strong: true }],
    notes: po.po.notes ? [po.po.notes] : [],
    footer: `Purchase order ${poLabel(po.po.number)} · ${shop.name} · prices in ${po.po.currency}`,
  };
}

/** The sheet's title, which names its PDF file too. */
export const invoiceSheetTitle = (n: number | null) => `Invoice ${invoiceLabel(n)}`;
export const purchaseOrderSheetTitle = (n: number) => `Purchase order ${poLabel(n)}`;

/** The PDF's file name, the same in the download, the attachment and the e-mail that names it. */
export const ledgerPdfName = (title: string) => `${title.replace(/[^\w.-]+/g, "-")}.pdf`;
