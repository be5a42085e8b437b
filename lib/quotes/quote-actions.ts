"use server";

import { revalidatePath } from "next/cache";

import { memberAction } from "@/lib/actions/member-action";
import { startDeposit } from "@/lib/payments/payment-commands";
import {
  QuoteCreateSchema,
  QuoteEditSchema,
  QuoteIdSchema,
  QuoteResponseSchema,
  QuoteStatusSchema,
} from "@/lib/validations/quotes";

import {
  changeQuoteStatus,
  createQuote,
  editQuote,
  respondToQuote,
  reviseQuote,
  sendQuote,
} from "./quote-commands";

/**
 * The server actions of quotes and deposits: thin adapters over lib/quotes/quote-commands.ts
 * and lib/payments/payment-commands.ts, called with a plain object through `useTransition`.
 * Each gives the same result as its /api/v1/quotes route, as an ActionState.
 */

/** The pages that show a quote (the shop's and the customer's) and the lists. */
function revalidateQuote(id?: string) {
  revalidatePath("/quotes");
  revalidatePath("/my");
  if (id) {
    revalidatePath(`/quotes/${id}`);
    revalidatePath(`/my/quotes/${id}`);
  }
}

/** { buildId } or { customerId } → the new draft (data: the quote). */
export const createQuoteAction = memberAction(QuoteCreateSchema, async (m, input) => {
  const quote = await createQuote(m, input);
  revalidateQuote();
  return quote;
});

/**
 * { id, version, validUntil?, notes?, lines? } → the saved quote (for a sent quote: its new
 * revision, another id); a stale version → 409 with `current`.
 */
export const editQuoteAction = memberAction(QuoteEditSchema, async (m, input) => {
  const quote = await editQuote(m, input);
  revalidateQuote(input.id);
  if (quote.id !== input.id) revalidateQuote(quote.id);
  return quote;
});

/** { id } → e-mailed to the customer: { to, subject, invited }. */
export const sendQuoteAction = memberAction(QuoteIdSchema, async (m, input) => {
  const sent = await sendQuote(m, input);
  revalidateQuote(input.id);
  return sent;
});

/** { id, status } → the quote in its new status. */
export const changeQuoteStatusAction = memberAction(QuoteStatusSchema, async (m, input) => {
  const quote = await changeQuoteStatus(m, input);
  revalidateQuote(quote.id);
  return quote;
});

/** { id } of an accepted quote → its new revision (a draft). */
export const reviseQuoteAction = memberAction(QuoteIdSchema, async (m, input) => {
  const revision = await reviseQuote(m, input);
  revalidateQuote(input.id);
  return revision;
});

/** The customer's { id, decision } on their own sent quote → the quote. */
export const respondToQuoteAction = memberAction(QuoteResponseSchema, async (m, input) => {
  const quote = await respondToQuote(m, input);
  revalidateQuote(quote.id);
  return quote;
});

/** The customer's { id } of their accepted quote → { url, amountMinor } of the checkout to open. */
export const startDepositAction = memberAction(QuoteIdSchema, (m, input) => startDeposit(m, input));
