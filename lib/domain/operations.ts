/**
 * The vocabulary of what happens after the deposit: purchase orders, jobs, invoices, credit
 * notes and the notices sent about them. Imported by db/schema, validations and the UI.
 */

export const PO_STATUSES = ["draft", "sent", "partly_received", "received", "cancelled"] as const;
export type PoStatus = (typeof PO_STATUSES)[number];
export const PO_STATUS_LABELS: Record<PoStatus, string> = {
  draft: "Draft",
  sent: "Sent to supplier",
  partly_received: "Partly received",
  received: "Received",
  cancelled: "Cancelled",
};
/** A purchase order stock is received against: one the supplier has (or one not yet e-mailed). */
export const PO_RECEIVABLE: readonly PoStatus[] = ["draft", "sent", "partly_received"];

export const JOB_STATUSES = ["waiting_parts", "ready", "fitted"] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];
export const JOB_STATUS_LABELS: Record<JobStatus, string> = {
  waiting_parts: "Waiting for parts",
  ready: "Ready to fit",
  fitted: "Fitted",
};

export const INVOICE_STATUSES = ["draft", "issued", "paid"] as const;
export type InvoiceStatus = (typeof INVOICE_STATUSES)[number];
export const INVOICE_STATUS_LABELS: Record<InvoiceStatus, string> = {
  draft: "Draft",
  issued: "Issued",
  paid: "Paid",
};

/** What a payment row pays: the deposit on a quote, or the balance of an invoice. */
export const PAYMENT_KINDS = ["deposit", "balance"] as const;
export type PaymentKind = (typeof PAYMENT_KINDS)[number];

/** The records an e-mail is logged on. */
export const MAIL_RECORDS = ["quote", "job", "invoice", "purchase_order"] as const;
export type MailRecord = (typeof MAIL_RECORDS)[number];

/** Every notice the product sends after the deposit, to the customer or to shop members. */
export const NOTICE_KINDS = [
  "deposit_receipt",
  "parts_arrived",
  "ready_to_fit",
  "fitted",
  "invoice",
  "balance_receipt",
  "po_to_supplier",
  "staff_quote_accepted",
  "staff_quote_declined",
  "staff_payment_received",
  "staff_po_received",
] as const;
export type NoticeKind = (typeof NOTICE_KINDS)[number];
export const NOTICE_LABELS: Record<NoticeKind, string> = {
  deposit_receipt: "Deposit receipt",
  parts_arrived: "Parts arrived",
  ready_to_fit: "Ready to fit",
  fitted: "Fitted",
  invoice: "Invoice",
  balance_receipt: "Payment receipt",
  po_to_supplier: "Purchase order to the supplier",
  staff_quote_accepted: "Quote accepted (shop)",
  staff_quote_declined: "Quote declined (shop)",
  staff_payment_received: "Payment received (shop)",
  staff_po_received: "Purchase order received (shop)",
};
export const MAIL_STATUSES = ["pending", "sent", "failed"] as const;
export type MailStatus = (typeof MAIL_STATUSES)[number];

const pad = (n: number) => String(n).padStart(4, "0");
/** PO-0003 */
export const poLabel = (n: number) => `PO-${pad(n)}`;
/** J-0003 */
export const jobLabel = (n: number) => `J-${pad(n)}`;
/** INV-0003; a draft has no number yet. */
export const invoiceLabel = (n: number | null) => (n === null ? "Draft invoice" : `INV-${pad(n)}`);
/** CN-0003 */
export const creditNoteLabel = (n: number) => `CN-${pad(n)}`;
