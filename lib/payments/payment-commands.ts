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
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { Conflict, Invalid, NotFound, Unavailable } from "@/lib/domain/errors";
import { isoDay, pastValidity, quoteLabel } from "@/lib/domain/quotes";
import { serverEnv } from "@/lib/env";

import { depositOf } from "./deposit";
import { payments } from "./provider";

/**
 * Every write on payments: the customer's deposit checkout and return, and the provider's
 * webhook events. The webhook has no member: its signature (checked by the route before this
 * runs) is the authentication, so its command takes the verified event.
 */

/** The deposit share when the shop has no settings row yet (basis points). */
const DEFAULT_DEPOSIT_BP = 3000;

async function provider<T>(call: () => Promise<T>): Promise<T> {
  try {
    return await call();
  } catch (e) {
    console.error("payment provider:", (e as Error).message);
    throw new Unavailable(
      "The payment service is not answering; nothing was charged. Try again in a moment.",
      "payments_unavailable",
      "upstream",
    );
  }
}

/**
 * Opens (or reopens) a checkout for the deposit on the customer's own accepted quote, while it
 * is valid (judged now, whatever the stored status), and returns the provider's page.
 */
export async function startDeposit(
  member: Member,
  input: { id: string },
): Promise<{ url: string; amountMinor: number }> {
  authorize(member, "quotes:pay");
  const { shopId } = member;
  const quoteId = input.id;
  const q = await getQuote(shopId, quoteId, member.user.id);
  if (!q) throw new NotFound("That quote");
  if (q.quote.status !== "accepted")
    throw new Conflict(
      q.quote.status === "deposit_paid"
        ? "The deposit on this quote is already paid"
        : "Accept the quote before paying its deposit",
      "not_awaiting_deposit",
    );
  if (pastValidity(q.quote, isoDay()))
    throw new Conflict(
      `This quote was valid until ${q.quote.validUntil}; its deposit can no longer be paid. Ask the shop for a new one`,
      "quote_expired",
    );
  const settings = await getShopSettings(shopId);
  const depositBp = settings?.settings.depositBp ?? DEFAULT_DEPOSIT_BP;
  const amountMinor = depositOf(q.quote.totalMinor, depositBp);
  if (amountMinor <= 0) throw new Invalid("This quote asks for no deposit", [], "no_deposit");
  const stripe = payments();
  for (const p of await listPayments(shopId, quoteId)) {
    if (p.status !== "pending" || p.amountMinor !== amountMinor) continue;
    const open = await provider(() => stripe.checkout.sessions.retrieve(p.checkoutSessionId));
    if (open.status === "open" && open.url) return { url: open.url, amountMinor };
  }
  const appUrl = serverEnv().APP_URL;
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
              name: `Deposit (${depositBp / 100} %) on quote ${quoteLabel(q.quote.number, q.quote.revision)}`,
            },
          },
        },
      ],
      customer_email: q.customerEmail ?? undefined,
      client_reference_id: quoteId,
      metadata: { shop_id: shopId, quote_id: quoteId },
      success_url: `${appUrl}/api/v1/quotes/${quoteId}/deposit?session={CHECKOUT_SESSION_ID}`,
      cancel_url: `${appUrl}/my/quotes/${quoteId}?payment=cancelled`,
    }),
  );
  if (!session.url)
    throw new Unavailable(
      "The payment service gave no checkout page",
      "payments_unavailable",
      "upstream",
    );
  await recordPendingPayment({
    shopId,
    quoteId,
    checkoutSessionId: session.id,
    amountMinor,
    currency: q.quote.currency,
    createdBy: member.user.id,
  });
  return { url: session.url, amountMinor };
}

/**
 * The customer is back from checkout: ask the provider, and record the payment if it is paid
 * (once, whether or not the webhook came first).
 */
export async function confirmDepositReturn(
  member: Member,
  input: { id: string; session: string },
): Promise<"paid" | "already" | "unpaid"> {
  authorize(member, "quotes:pay");
  const q = await getQuote(member.shopId, input.id, member.user.id);
  if (!q) throw new NotFound("That quote");
  const mine = (await listPayments(member.shopId, input.id)).some(
    (p) => p.checkoutSessionId === input.session,
  );
  if (!mine) throw new NotFound("That payment");
  const session = await provider(() => payments().checkout.sessions.retrieve(input.session));
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
 * A verified provider event: each event id is handled once, in one transaction with its
 * effect; a completed checkout records one payment whatever order or number of times events
 * arrive.
 */
export async function recordPaymentEvent(event: Stripe.Event) {
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
