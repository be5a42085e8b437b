"use server";

import { revalidatePath } from "next/cache";

import { memberAction } from "@/lib/actions/member-action";
import {
  CreditNoteCreateSchema,
  IdSchema,
  InvoiceCreateSchema,
  InvoiceEditSchema,
  InvoiceIssueSchema,
} from "@/lib/validations/operations";

import {
  createCreditNote,
  createInvoice,
  editInvoice,
  issueInvoice,
  startBalancePayment,
} from "./invoice-commands";
import { invoiceData } from "./invoice-data";

/** The server actions of invoices: thin adapters over lib/invoices/invoice-commands.ts. */

function revalidateInvoice(id: string) {
  revalidatePath(`/invoices/${id}`);
  revalidatePath(`/my/invoices/${id}`);
  revalidatePath("/jobs");
}

/** { jobId } of a fitted job → its draft invoice. */
export const createInvoiceAction = memberAction(InvoiceCreateSchema, async (m, input) => {
  const inv = invoiceData(await createInvoice(m, input));
  revalidateInvoice(inv.id);
  revalidatePath(`/jobs/${input.jobId}`);
  return inv;
});

/** { id, version, lines?, notes? } of a draft → the draft as saved (an issued one: 422 invoice_issued). */
export const editInvoiceAction = memberAction(InvoiceEditSchema, async (m, input) => {
  const inv = invoiceData(await editInvoice(m, input));
  revalidateInvoice(inv.id);
  return inv;
});

/** { id, version } of a draft → issued, numbered and e-mailed. */
export const issueInvoiceAction = memberAction(InvoiceIssueSchema, async (m, input) => {
  const inv = invoiceData(await issueInvoice(m, input));
  revalidateInvoice(inv.id);
  return inv;
});

/** { id, reason, amountMinor } → a credit note on the issued invoice. */
export const createCreditNoteAction = memberAction(CreditNoteCreateSchema, async (m, input) => {
  const inv = invoiceData(await createCreditNote(m, input));
  revalidateInvoice(inv.id);
  return inv;
});

/** The customer's { id } of their issued invoice → { url, amountMinor } of the checkout. */
export const startBalanceAction = memberAction(IdSchema, (m, input) =>
  startBalancePayment(m, input),
);
