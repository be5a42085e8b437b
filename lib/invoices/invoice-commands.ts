import "server-only";

import {
  getInvoice,
  insertCreditNote,
  insertInvoice,
  issueInvoiceRow,
  updateInvoiceDraft,
  type InvoiceRow,
} from "@/db/queries/invoices";
import { getJob } from "@/db/queries/jobs";
import { getPartsByIds } from "@/db/queries/parts";
import { listInvoicePayments, recordPendingPayment } from "@/db/queries/payments";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { Conflict, Invalid, InvalidTransition, NotFound } from "@/lib/domain/errors";
import { invoiceLinesFromJob } from "@/lib/domain/jobs";
import { invoiceLabel } from "@/lib/domain/operations";
import { serverEnv } from "@/lib/env";
import { deliverNotice } from "@/lib/notices/notice-commands";
import { noticeFiles } from "@/lib/notices/notice-files";
import { confirmCheckoutReturn, openCheckout } from "@/lib/payments/payment-commands";
import { invoiceSheetTitle, ledgerPdfName } from "@/lib/pdf/ledger-sheet-data";
import { quoteSizeIssue } from "@/lib/quotes/quote-limits";
import type { CreditNoteCreate, InvoiceEdit } from "@/lib/validations/operations";

/**
 * Every write on invoices: raised as a draft from a fitted job (the fitted parts and the labour
 * used at the quote's prices, tax, the deposit paid deducted), edited only while a draft,
 * issued (numbered, frozen, e-mailed with its PDF and the portal link), corrected by credit
 * notes, and its balance paid by the customer through the payment provider.
 */

async function invoiceOf(m: Member, id: string, own = false): Promise<InvoiceRow> {
  const inv = await getInvoice(m.shopId, id, own ? m.user.id : undefined);
  if (!inv) throw new NotFound("That invoice");
  return inv;
}

export async function createInvoice(m: Member, input: { jobId: string }) {
  authorize(m, "invoices:write");
  const job = await getJob(m.shopId, input.jobId);
  if (!job) throw Invalid.field("jobId", "That job is not in this shop");
  if (job.job.status !== "fitted")
    throw new InvalidTransition(
      "An invoice is raised once the job is fitted",
      "not_fitted",
      "jobId",
    );
  const inv = await insertInvoice(m.shopId, m.user.id, job.job.id, (j, other, quoted) =>
    invoiceLinesFromJob(j, job.lines, other, quoted),
  );
  return invoiceOf(m, inv.id);
}

/** Edits a draft (its lines and notes); an issued invoice is never edited (422 invoice_issued). */
export async function editInvoice(m: Member, input: InvoiceEdit) {
  authorize(m, "invoices:write");
  const inv = await invoiceOf(m, input.id);
  if (inv.invoice.status !== "draft")
    throw new InvalidTransition(
      "An issued invoice is never edited; raise a credit note to correct it",
      "invoice_issued",
    );
  if (input.lines) {
    const too = quoteSizeIssue(input.lines, inv.invoice.currency);
    if (too) throw Invalid.field("lines", too);
    // A part line names a part of this shop's catalog.
    const named = [...new Set(input.lines.flatMap((l) => (l.partId ? [l.partId] : [])))];
    const known = new Set((await getPartsByIds(m.shopId, named)).map((p) => p.id));
    const issues = input.lines.flatMap((l, i) =>
      l.partId && !known.has(l.partId)
        ? [{ path: `lines.${i}.partId`, message: "That part is not in this shop's catalog" }]
        : [],
    );
    if (issues.length) throw new Invalid(issues[0]!.message, issues);
  }
  await updateInvoiceDraft(m.shopId, input.id, input.version, {
    notes: input.notes,
    lines: input.lines?.map((l) => ({
      kind: l.kind,
      partId: l.partId ?? null,
      sku: l.sku ?? null,
      description: l.description,
      quantityMilli: l.quantityMilli,
      unitPriceMinor: l.unitPriceMinor,
      discountBp: l.discountBp,
    })),
  });
  return invoiceOf(m, input.id);
}

/**
 * Issues a draft: numbered, frozen, and e-mailed to the customer with its PDF and the portal
 * link to pay the balance. A failed e-mail is logged on the invoice to send again; the invoice
 * stays issued.
 */
export async function issueInvoice(m: Member, input: { id: string; version: number }) {
  authorize(m, "invoices:write");
  const before = await invoiceOf(m, input.id);
  if (before.invoice.status !== "draft")
    throw new InvalidTransition("This invoice is issued already", "invoice_issued");
  if (before.lines.length === 0)
    throw new Invalid("An invoice with no lines is not issued", [], "empty_invoice");
  await issueInvoiceRow(m.shopId, input.id, m.user.id, input.version);
  const inv = await invoiceOf(m, input.id);
  const files = noticeFiles("invoice", m.shopId, input.id);
  const label = invoiceLabel(inv.invoice.number);
  await deliverNotice(
    { shopId: m.shopId, recordKind: "invoice", recordId: input.id },
    [inv.customerEmail],
    {
      kind: "invoice",
      shopName: m.shopName,
      customerName: inv.customerName,
      invoice: label,
      totalMinor: inv.invoice.totalMinor,
      depositMinor: inv.invoice.depositMinor,
      creditedMinor: inv.ledger.creditedMinor,
      balanceMinor: inv.ledger.balanceMinor,
      currency: inv.invoice.currency,
      link: `${serverEnv().APP_URL}/my/invoices/${input.id}`,
      attachments: files ? [ledgerPdfName(invoiceSheetTitle(inv.invoice.number))] : [],
    },
    files,
  );
  return inv;
}

/** A credit note correcting an issued invoice (which itself never changes). */
export async function createCreditNote(m: Member, input: CreditNoteCreate) {
  authorize(m, "invoices:write");
  const inv = await invoiceOf(m, input.id);
  if (inv.invoice.status === "draft")
    throw new InvalidTransition("A draft invoice is edited, not credited", "invoice_draft");
  await insertCreditNote(m.shopId, input.id, m.user.id, input);
  return invoiceOf(m, input.id);
}

/**
 * The customer pays the balance of their own issued invoice: a checkout for what the ledger
 * says is owed (reused while open), recorded pending like the deposit.
 */
export async function startBalancePayment(m: Member, input: { id: string }) {
  authorize(m, "invoices:pay");
  const inv = await invoiceOf(m, input.id, true);
  if (inv.invoice.status !== "issued" || inv.ledger.balanceMinor <= 0)
    throw new Conflict("Nothing is owed on this invoice", "nothing_owed");
  const amountMinor = inv.ledger.balanceMinor;
  const label = invoiceLabel(inv.invoice.number);
  const appUrl = serverEnv().APP_URL;
  const open = await openCheckout(await listInvoicePayments(m.shopId, input.id), amountMinor, {
    name: `Balance of invoice ${label}`,
    currency: inv.invoice.currency,
    email: inv.customerEmail,
    reference: input.id,
    metadata: { shop_id: m.shopId, quote_id: inv.invoice.quoteId, invoice_id: input.id },
    successUrl: `${appUrl}/api/v1/invoices/${input.id}/payment?session={CHECKOUT_SESSION_ID}`,
    cancelUrl: `${appUrl}/my/invoices/${input.id}?payment=cancelled`,
  });
  if (open.created)
    await recordPendingPayment({
      shopId: m.shopId,
      quoteId: inv.invoice.quoteId,
      invoiceId: input.id,
      kind: "balance",
      checkoutSessionId: open.sessionId,
      amountMinor,
      currency: inv.invoice.currency,
      createdBy: m.user.id,
    });
  return { url: open.url, amountMinor };
}

/** The customer is back from the balance checkout: confirmed with the provider, recorded once. */
export async function confirmBalanceReturn(m: Member, input: { id: string; session: string }) {
  authorize(m, "invoices:pay");
  await invoiceOf(m, input.id, true);
  const mine = (await listInvoicePayments(m.shopId, input.id)).some(
    (p) => p.checkoutSessionId === input.session,
  );
  if (!mine) throw new NotFound("That payment");
  return confirmCheckoutReturn(input.session);
}
