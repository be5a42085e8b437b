import { and, desc, eq } from "drizzle-orm";

import { db } from "@/db";
import { paymentEvents, payments, quotes } from "@/db/schema";

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

export async function listPayments(shopId: string, quoteId: string) {
  return db
    .select()
    .from(payments)
    .where(and(eq(payments.shopId, shopId), eq(payments.quoteId, quoteId)))
    .orderBy(desc(payments.createdAt));
}

export async function recordPendingPayment(v: {
  shopId: string;
  quoteId: string;
  checkoutSessionId: string;
  amountMinor: number;
  currency: string;
  createdBy: string;
}) {
  const [row] = await db.insert(payments).values(v).onConflictDoNothing().returning();
  return row;
}

/** What the provider's own record of a paid checkout says it paid for. */
export interface CheckoutClaim {
  checkoutSessionId: string;
  shopId: string;
  quoteId: string;
  amountMinor: number;
  /** ISO 4217, upper case. */
  currency: string;
}

/**
 * Records a paid checkout once: the payment row turns paid and an accepted quote moves to
 * "deposit paid". Only when the provider's record matches the checkout the app opened: the
 * same shop and quote, the deposit amount the app computed for it and the quote's currency —
 * else "mismatch" and nothing changes. A session the app never opened is "unknown". A second
 * call for the same session (a redelivered or out-of-order event, or the customer's return after
 * the webhook) changes nothing and says "already".
 */
export async function markPaymentPaid(
  tx: Tx,
  claim: CheckoutClaim,
  eventId: string,
): Promise<"paid" | "already" | "unknown" | "mismatch"> {
  const [p] = await tx
    .select()
    .from(payments)
    .where(eq(payments.checkoutSessionId, claim.checkoutSessionId))
    .for("update")
    .limit(1);
  if (!p) return "unknown";
  const [q] = await tx
    .select()
    .from(quotes)
    .where(and(eq(quotes.id, p.quoteId), eq(quotes.shopId, p.shopId)))
    .for("update")
    .limit(1);
  if (
    !q ||
    claim.shopId !== p.shopId ||
    claim.quoteId !== p.quoteId ||
    claim.amountMinor !== p.amountMinor ||
    claim.currency !== p.currency.toUpperCase() ||
    q.currency.toUpperCase() !== p.currency.toUpperCase()
  )
    return "mismatch";
  if (p.status === "paid") return "already";
  await tx
    .update(payments)
    .set({ status: "paid", paidAt: new Date(), paidEventId: eventId })
    .where(eq(payments.id, p.id));
  if (q.status === "accepted") {
    await tx
      .update(quotes)
      .set({
        status: "deposit_paid",
        statusChangedAt: new Date(),
        statusChangedBy: null,
        version: q.version + 1,
        updatedAt: new Date(),
      })
      .where(eq(quotes.id, q.id));
  }
  return "paid";
}

export async function markPaymentExpired(tx: Tx, checkoutSessionId: string) {
  await tx
    .update(payments)
    .set({ status: "expired" })
    .where(and(eq(payments.checkoutSessionId, checkoutSessionId), eq(payments.status, "pending")));
}

/** Runs `fn` once per provider event id, in one transaction with the event's record; a repeat returns null. */
export async function onceForEvent<T>(
  event: { id: string; type: string; checkoutSessionId: string | null },
  fn: (tx: Tx) => Promise<T>,
): Promise<T | null> {
  return db.transaction(async (tx) => {
    const [fresh] = await tx
      .insert(paymentEvents)
      .values({ id: event.id, type: event.type, checkoutSessionId: event.checkoutSessionId })
      .onConflictDoNothing()
      .returning({ id: paymentEvents.id });
    if (!fresh) return null;
    return fn(tx);
  });
}

export async function confirmPayment(claim: CheckoutClaim, eventId: string) {
  return db.transaction((tx) => markPaymentPaid(tx, claim, eventId));
}
