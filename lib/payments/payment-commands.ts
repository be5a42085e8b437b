import "server-only";

import { randomUUID } from "node:crypto";

import type Stripe from "stripe";

import { getInvoice } from "@/db/queries/invoices";
import {
  confirmPayment,
  listPayments,
  markPaymentExpired,
  markPaymentPaid,
  onceForEvent,
  paymentBySession,
  recordPendingPayment,
  type CheckoutClaim,
} from "@/db/queries/payments";
import { getQuote } from "@/db/queries/quotes";
import { getShopSettings } from "@/db/queries/shops";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { Conflict, Invalid, NotFound, Unavailable } from "@/lib/domain/errors";
import { invoiceLabel } from "@/lib/domain/operations";
import { pastValidity, quoteLabel } from "@/lib/domain/quotes";
import { serverEnv } from "@/lib/env";
import { deliverNotice, notifyShop } from "@/lib/notices/notice-commands";
import { shopToday } from "@/lib/shop/shop-zone";

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
  if (pastValidity(q.quote, await shopToday(shopId)))
    throw new Conflict(
      `This quote was valid until ${q.quote.validUntil}; its deposit can no longer be paid. Ask the shop for a new one`,
      "quote_expired",
    );
  const settings = await getShopSettings(shopId);
  const depositBp = settings?.settings.depositBp ?? DEFAULT_DEPOSIT_BP;
  const amountMinor = depositOf(q.quote.totalMinor, depositBp);
  if (amountMinor <= 0) throw new Invalid("This quote asks for no deposit", [], "no_deposit");
  const appUrl = serverEnv().APP_URL;
  const open = await openCheckout(await listPayments(shopId, quoteId), amountMinor, {
    name: `Deposit (${depositBp / 100} %) on quote ${quoteLabel(q.quote.number, q.quote.revision)}`,
    currency: q.quote.currency,
    email: q.customerEmail,
    reference: quoteId,
    metadata: { shop_id: shopId, quote_id: quoteId },
    successUrl: `${appUrl}/api/v1/quotes/${quoteId}/deposit?session={CHECKOUT_SESSION_ID}`,
    cancelUrl: `${appUrl}/my/quotes/${quoteId}?payment=cancelled`,
  });
  if (open.created)
    await recordPendingPayment({
      shopId,
      quoteId,
      checkoutSessionId: open.sessionId,
      amountMinor,
      currency: q.quote.currency,
      createdBy: member.user.id,
    });
  return { url: open.url, amountMinor };
}

/**
 * The deposit on a staff member's accepted quote taken at the counter (cash or the shop's card
 * terminal): a payment of exactly the deposit the shop asks (worked out here, never given by the
 * caller) is recorded paid, by whom and when, and the quote moves to "deposit paid" in the same
 * transaction — so a quote is never "deposit paid" without the payment that paid it, and the
 * invoice deducts what was taken. The customer's receipt and the shop's notice follow, once.
 */
export async function recordCounterDeposit(
  member: Member,
  quoteId: string,
): Promise<{ amountMinor: number }> {
  authorize(member, "quotes:write");
  const { shopId } = member;
  const q = await getQuote(shopId, quoteId);
  if (!q) throw new NotFound("That quote");
  if (q.quote.status !== "accepted")
    throw new Conflict(
      q.quote.status === "deposit_paid"
        ? "The deposit on this quote is already paid"
        : "Only an accepted quote takes a deposit",
      "not_awaiting_deposit",
    );
  if (pastValidity(q.quote, await shopToday(shopId)))
    throw new Conflict(
      `This quote was valid until ${q.quote.validUntil}; its deposit can no longer be taken. Revise it or make a new one`,
      "quote_expired",
    );
  const settings = await getShopSettings(shopId);
  const amountMinor = depositOf(
    q.quote.totalMinor,
    settings?.settings.depositBp ?? DEFAULT_DEPOSIT_BP,
  );
  if (amountMinor <= 0) throw new Invalid("This quote asks for no deposit", [], "no_deposit");
  const sessionId = `counter_${randomUUID()}`;
  const currency = q.quote.currency;
  await recordPendingPayment({
    shopId,
    quoteId,
    checkoutSessionId: sessionId,
    amountMinor,
    currency,
    createdBy: member.user.id,
    provider: "counter",
  });
  const r = await confirmPayment(
    {
      checkoutSessionId: sessionId,
      shopId,
      quoteId,
      invoiceId: "",
      reference: quoteId,
      amountMinor,
      currency: currency.toUpperCase(),
    },
    `counter:${member.user.id}`,
  );
  if (r !== "paid") throw new Conflict("The deposit could not be recorded; reload and try again");
  await paymentNotices(sessionId);
  return { amountMinor };
}

/**
 * A checkout page for `amountMinor`: an open one of `existing` (pending, same amount) is reused,
 * else the provider makes a new one (`created`: the caller records it pending).
 */
export async function openCheckout(
  existing: { status: string; amountMinor: number; checkoutSessionId: string }[],
  amountMinor: number,
  spec: {
    name: string;
    currency: string;
    email: string | null;
    /** `client_reference_id`: the quote (deposit) or invoice (balance) it pays. */
    reference: string;
    metadata: Record<string, string>;
    successUrl: string;
    cancelUrl: string;
  },
): Promise<{ url: string; sessionId: string; created: boolean }> {
  const stripe = payments();
  for (const p of existing) {
    if (p.status !== "pending" || p.amountMinor !== amountMinor) continue;
    const open = await provider(() => stripe.checkout.sessions.retrieve(p.checkoutSessionId));
    if (open.status === "open" && open.url)
      return { url: open.url, sessionId: open.id, created: false };
  }
  const session = await provider(() =>
    stripe.checkout.sessions.create({
      mode: "payment",
      line_items: [
        {
          quantity: 1,
          price_data: {
            currency: spec.currency.toLowerCase(),
            unit_amount: amountMinor,
            product_data: { name: spec.name },
          },
        },
      ],
      customer_email: spec.email ?? undefined,
      client_reference_id: spec.reference,
      metadata: spec.metadata,
      success_url: spec.successUrl,
      cancel_url: spec.cancelUrl,
    }),
  );
  if (!session.url)
    throw new Unavailable(
      "The payment service gave no checkout page",
      "payments_unavailable",
      "upstream",
    );
  return { url: session.url, sessionId: session.id, created: true };
}

/** A checkout session id as the provider makes them; anything else is not worth asking about. */
const SESSION_ID = /^cs_[A-Za-z0-9_]{1,200}$/;

/**
 * The provider's own record of a checkout, asked through the SDK (an event's copy is never
 * trusted); null when the provider does not know the session. An outage is Unavailable (502), so
 * the provider delivers the event again later.
 */
async function retrieveCheckout(id: string): Promise<Stripe.Checkout.Session | null> {
  if (!SESSION_ID.test(id)) return null;
  try {
    return await payments().checkout.sessions.retrieve(id);
  } catch (e) {
    const err = e as { type?: string; statusCode?: number };
    if (err.type === "StripeInvalidRequestError" && err.statusCode === 404) return null;
    return provider(() => Promise.reject(e));
  }
}

/** What a paid checkout says it paid for, as the app checks it against its own payment row. */
function claimOf(session: Stripe.Checkout.Session): CheckoutClaim {
  return {
    checkoutSessionId: session.id,
    shopId: session.metadata?.shop_id ?? "",
    // What the app named when it opened the checkout: the quote (and, for a balance, the
    // invoice) in the metadata and the one it is for as the reference; all must agree.
    quoteId: session.metadata?.quote_id ?? "",
    invoiceId: session.metadata?.invoice_id ?? "",
    reference: session.client_reference_id ?? "",
    amountMinor: session.amount_total ?? -1,
    currency: (session.currency ?? "").toUpperCase(),
  };
}

function warnRefused(outcome: string, sessionId: string, via: string) {
  if (outcome === "mismatch" || outcome === "unknown")
    console.warn(
      `payments: ${via} for checkout ${JSON.stringify(sessionId)} refused (${outcome === "mismatch" ? "the provider's record does not match the deposit the app opened" : "no such checkout"}); nothing recorded as paid`,
    );
}

/**
 * The customer is back from checkout: ask the provider, and record the payment if it is paid
 * for this quote's deposit (once, whether or not the webhook came first).
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
  return confirmCheckoutReturn(input.session);
}

/**
 * The customer's return from a checkout (deposit or balance; the caller checked it is theirs):
 * the provider is asked, and a paid checkout recorded once (with its receipts), whether or not
 * the webhook came first.
 */
export async function confirmCheckoutReturn(
  sessionId: string,
): Promise<"paid" | "already" | "unpaid"> {
  const session = await retrieveCheckout(sessionId);
  if (session?.payment_status !== "paid") return "unpaid";
  const r = await confirmPayment(claimOf(session), `return:${session.id}`);
  warnRefused(r, session.id, "the customer's return");
  if (r === "paid") await paymentNotices(session.id);
  return r === "paid" ? "paid" : r === "already" ? "already" : "unpaid";
}

const PAID_EVENTS = new Set([
  "checkout.session.completed",
  "checkout.session.async_payment_succeeded",
]);

/** The checkout an event points at: only its id is used (the provider is asked for the rest). */
function sessionIdOf(event: Stripe.Event): string | null {
  if (!event.type.startsWith("checkout.session.")) return null;
  const id = (event.data?.object as { id?: unknown } | undefined)?.id;
  return typeof id === "string" ? id : null;
}

/**
 * A provider event whose signature checked out: each event id is handled once, in one
 * transaction with its effect. The event only points at a checkout; what happened is read from
 * the provider's own record of it (retrieved through the SDK), and a completed checkout counts
 * only when that record says paid, for the shop and quote the app opened it for, with the deposit
 * amount and currency the app asked — so a forged or tampered event marks nothing paid. A
 * completed checkout records one payment whatever order or number of times events arrive.
 */
export async function recordPaymentEvent(event: Stripe.Event) {
  const sessionId = sessionIdOf(event);
  const acts = PAID_EVENTS.has(event.type) || event.type === "checkout.session.expired";
  // Asked before the transaction: no network call holds a database connection.
  const session = sessionId && acts ? await retrieveCheckout(sessionId) : null;
  const outcome = await onceForEvent(
    { id: event.id, type: event.type, checkoutSessionId: sessionId },
    async (tx) => {
      if (!sessionId || !acts) return "ignored";
      if (!session) return "unknown";
      if (PAID_EVENTS.has(event.type)) {
        return session.payment_status === "paid"
          ? markPaymentPaid(tx, claimOf(session), event.id)
          : "unpaid";
      }
      if (session.status !== "expired") return "ignored";
      await markPaymentExpired(tx, session.id);
      return "expired";
    },
  );
  if (outcome && sessionId) warnRefused(outcome, sessionId, `event ${event.id}`);
  if (outcome === "paid" && sessionId) await paymentNotices(sessionId);
  return { received: true, event: event.id, outcome: outcome ?? "duplicate" };
}

/**
 * After a payment is recorded: the customer's receipt (on the quote for a deposit, on the
 * invoice for a balance, with what is left to pay) and the shop's notice to its subscribers.
 * Each once per payment; a failed send is logged to retry and changes nothing.
 */
async function paymentNotices(sessionId: string) {
  try {
    const p = await paymentBySession(sessionId);
    if (!p || p.status !== "paid") return;
    const shop = await getShopSettings(p.shopId);
    const shopName = shop?.name ?? "Your shop";
    const appUrl = serverEnv().APP_URL;
    if (p.kind === "balance" && p.invoiceId) {
      const inv = await getInvoice(p.shopId, p.invoiceId);
      if (!inv) return;
      const target = {
        shopId: p.shopId,
        recordKind: "invoice" as const,
        recordId: p.invoiceId,
        occasion: p.id,
      };
      const document = `invoice ${invoiceLabel(inv.invoice.number)}`;
      await deliverNotice(target, [inv.customerEmail], {
        kind: "balance_receipt",
        shopName,
        customerName: inv.customerName,
        document,
        amountMinor: p.amountMinor,
        currency: p.currency,
        leftMinor: Math.max(0, inv.ledger.balanceMinor),
        link: `${appUrl}/my/invoices/${p.invoiceId}`,
      });
      await notifyShop(target, {
        kind: "staff_payment_received",
        shopName,
        customerName: inv.customerName,
        document,
        amountMinor: p.amountMinor,
        currency: p.currency,
        link: `${appUrl}/invoices/${p.invoiceId}`,
      });
      return;
    }
    const q = await getQuote(p.shopId, p.quoteId);
    if (!q) return;
    const target = {
      shopId: p.shopId,
      recordKind: "quote" as const,
      recordId: p.quoteId,
      occasion: p.id,
    };
    const document = `quote ${quoteLabel(q.quote.number, q.quote.revision)}`;
    await deliverNotice(target, [q.customerEmail], {
      kind: "deposit_receipt",
      shopName,
      customerName: q.customerName,
      document,
      amountMinor: p.amountMinor,
      currency: p.currency,
      link: `${appUrl}/my/quotes/${p.quoteId}`,
    });
    await notifyShop(target, {
      kind: "staff_payment_received",
      shopName,
      customerName: q.customerName,
      document,
      amountMinor: p.amountMinor,
      currency: p.currency,
      link: `${appUrl}/quotes/${p.quoteId}`,
    });
  } catch (e) {
    // The payment stands; its notices are logged where they got to.
    console.error("payment notices:", (e as Error).message);
  }
}
