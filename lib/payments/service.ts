import "server-only";

import type Stripe from "stripe";

import {
  confirmPayment,
  listPayments,
  markPaymentExpired,
  markPaymentPaid,
  onceForEvent,
  recordPendingPayment,
} from "@/db/queries/payments";
import { getQuote } from "@/db/queries/quotes";
import { getShopSettings } from "@/db/queries/shops";
import { NotFound } from "@/lib/domain/errors";
import { quoteLabel } from "@/lib/domain/quotes";
import { serverEnv } from "@/lib/env";
import { HttpError } from "@/lib/http/http-error";

import { depositOf } from "./deposit";
import { payments, verifiedEvent } from "./provider";

async function provider<T>(call: () => Promise<T>): Promise<T> {
  try {
    return await call();
  } catch (e) {
    console.error("payment provider:", (e as Error).message);
    throw new HttpError(
      502,
      "payments_unavailable",
      "The payment service is not answering; nothing was charged. Try again in a moment.",
    );
  }
}

/**
 * Opens (or reopens) a checkout for the deposit on the customer's own accepted quote and returns
 * the provider's page to send them to.
 */
export async function startDeposit(
  shopId: string,
  userId: string,
  quoteId: string,
): Promise<{ url: string; amountMinor: number }> {
  const q = await getQuote(shopId, quoteId, userId);
  if (!q) throw new NotFound("That quote");
  if (q.quote.status !== "accepted")
    throw new HttpError(
      409,
      "not_awaiting_deposit",
      q.quote.status === "deposit_paid"
        ? "The deposit on this quote is already paid"
        : "Accept the quote before paying its deposit",
    );
  const settings = await getShopSettings(shopId);
  const amountMinor = depositOf(q.quote.totalMinor, settings?.settings.depositBp ?? 3000);
  if (amountMinor <= 0) throw new HttpError(422, "no_deposit", "This quote asks for no deposit");
  const stripe = payments();
  for (const p of await listPayments(shopId, quoteId)) {
    if (p.status !== "pending" || p.amountMinor !== amountMinor) continue;
    const open = await provider(() => stripe.checkout.sessions.retrieve(p.checkoutSessionId));
    if (open.status === "open" && open.url) return { url: open.url, amountMinor };
  }
  const base = `${serverEnv().APP_URL}/api/v1/quotes/${quoteId}/deposit`;
  const pct = (settings?.settings.depositBp ?? 3000) / 100;
  const session = await provider(() =>
    stripe.checkout.sessions.create({
      mode: "payment",
      line_items: [
        {
          quantity: 1,
          price_data: {
            currency: q.quote.currency.toLowerCase(),
            unit_amount: amountMinor,
            product_data: {
              name: `Deposit (${pct} %) on quote ${quoteLabel(q.quote.number, q.quote.revision)}`,
            },
          },
        },
      ],
      customer_email: q.customerEmail ?? undefined,
      client_reference_id: quoteId,
      metadata: { shop_id: shopId, quote_id: quoteId },
      success_url: `${base}?session={CHECKOUT_SESSION_ID}`,
      cancel_url: `${serverEnv().APP_URL}/my/quotes/${quoteId}?payment=cancelled`,
    }),
  );
  if (!session.url)
    throw new HttpError(502, "payments_unavailable", "The payment service gave no checkout page");
  await recordPendingPayment({
    shopId,
    quoteId,
    checkoutSessionId: session.id,
    amountMinor,
    currency: q.quote.currency,
    createdBy: userId,
  });
  return { url: session.url, amountMinor };
}

/** The customer is back from checkout: ask the provider, and record the payment if it is paid. */
export async function confirmReturn(
  shopId: string,
  userId: string,
  quoteId: string,
  sessionId: string,
): Promise<"paid" | "already" | "unpaid"> {
  const q = await getQuote(shopId, quoteId, userId);
  if (!q) throw new NotFound("That quote");
  const mine = (await listPayments(shopId, quoteId)).some((p) => p.checkoutSessionId === sessionId);
  if (!mine) throw new NotFound("That payment");
  const session = await provider(() => payments().checkout.sessions.retrieve(sessionId));
  if (session.payment_status !== "paid") return "unpaid";
  const r = await confirmPayment(session.id, `return:${session.id}`);
  return r === "paid" ? "paid" : "already";
}

function sessionOf(event: Stripe.Event): Stripe.Checkout.Session | null {
  return event.type.startsWith("checkout.session.")
    ? (event.data.object as Stripe.Checkout.Session)
    : null;
}

/**
 * A provider webhook: signature checked, each event id handled once, a completed checkout records
 * one payment whatever order or number of times events arrive.
 */
export async function handlePaymentWebhook(rawBody: string, signature: string | null) {
  const event = verifiedEvent(rawBody, signature);
  const session = sessionOf(event);
  const outcome = await onceForEvent(
    { id: event.id, type: event.type, checkoutSessionId: session?.id ?? null },
    async (tx) => {
      if (!session) return "ignored";
      if (
        event.type === "checkout.session.completed" ||
        event.type === "checkout.session.async_payment_succeeded"
      ) {
        return session.payment_status === "paid"
          ? markPaymentPaid(tx, session.id, event.id)
          : "unpaid";
      }
      if (event.type === "checkout.session.expired") {
        await markPaymentExpired(tx, session.id);
        return "expired";
      }
      return "ignored";
    },
  );
  return { received: true, event: event.id, outcome: outcome ?? "duplicate" };
}
