import type { InvoiceRow } from "@/db/queries/invoices";
import { creditNoteLabel, invoiceLabel } from "@/lib/domain/operations";

/**
 * An invoice as the API answers it: the document, its lines, credit notes, the payments of its
 * balance and the ledger (`balanceMinor` = total − deposit − credits − payments); no e-mail
 * addresses, sign-in ids or checkout ids.
 */
export function invoiceData(r: InvoiceRow) {
  return {
    ...r.invoice,
    label: invoiceLabel(r.invoice.number),
    customerName: r.customerName,
    jobNumber: r.jobNumber,
    lines: r.lines,
    creditNotes: r.creditNotes.map((c) => ({ ...c, label: creditNoteLabel(c.number) })),
    payments: r.payments.map((p) => ({
      id: p.id,
      amountMinor: p.amountMinor,
      currency: p.currency,
      status: p.status,
      paidAt: p.paidAt,
      createdAt: p.createdAt,
    })),
    ...r.ledger,
  };
}
