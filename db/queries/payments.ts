import { and, desc, eq, sql } from "drizzle-orm";

import { db } from "@/db";
import { invoices, paymentEvents, payments, quotes } from "@/db/schema";
import type { PaymentKind } from "@/lib/domain/operations";

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

/** The deposit checkouts of a quote, newest first (a balance checkout is the invoice's). */
export async function listPayments(shopId: string, quoteId: string) {
  return db
    .select()
    .from(payments)
    .where(
      and(eq(payments.shopId, shopId), eq(payments.quoteId, quoteId), eq(payments.kind, "deposit")),
    )
    .orderBy(desc(payments.createdAt));
}

/** The balance checkouts of an invoice, newest first. */
export async function listInvoicePayments(shopId: string, invoiceId: string) {
  return db
    .select()
    .from(payments)
    .where(and(eq(payments.shopId, shopId), eq(payments.invoiceId, invoiceId)))
    .orderBy(desc(payments.createdAt));
}

/** One payment by its checkout session (for the notices after it is recorded). */
export async function paymentBySession(checkoutSessionId: string) {
  const [p] = await db
    .select()
    .from(payments)
    .where(eq(payments.checkoutSessionId, checkoutSessionId))
    .limit(1);
  return p ?? null;
}

export async function recordPendingPayment(v: {
  shopId: string;
  quoteId: string;
  checkoutSessionId: string;
  amountMinor: number;
  currency: string;
  createdBy: string;
  kind?: PaymentKind;
  invoiceId?: string;
  /** "stripe" (the default) or "counter": taken by the shop in person (recordCounterDeposit). */
  provider?: string;
}) {
  const [row] = await db.insert(payments).values(v).onConflictDoNothing().returning();
  return row;
}

/** What the provider's own record of a paid checkout says it paid for. */
export interface CheckoutClaim {
  checkoutSessionId: string;
  shopId: string;
  quoteId: string;
  /** The invoice a balance checkout names in its metadata; "" for a deposit. */
  invoiceId: string;
  /** `client_reference_id`: the quote (a deposit) or the invoice (a balance) the app named. */
  reference: string;
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
  const balance = p.kind === "balance";
  if (
    !q ||
    claim.shopId !== p.shopId ||
    claim.quoteId !== p.quoteId ||
    claim.reference !== (balance ? p.invoiceId : p.quoteId) ||
    claim.invoiceId !== (balance ? p.invoiceId : "") ||
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
  if (balance) {
    await settleInvoice(tx, p.invoiceId!);
    return "paid";
  }
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

/**
 * An issued invoice whose ledger is settled (total − deposit − credit notes − balance payments
 * ≤ 0) becomes paid, inside the payment's transaction.
 */
async function settleInvoice(tx: Tx, invoiceId: string) {
  const [inv] = await tx
    .select()
    .from(invoices)
    .where(eq(invoices.id, invoiceId))
    .for("update")
    .limit(1);
  if (!inv || inv.status !== "issued") return;
  const [row] = await tx
    .select({
      paid: sql<number>`coalesce((select sum(amount_minor) from payments where invoice_id = ${invoiceId} and status = 'paid'), 0)::int`,
      credited: sql<number>`coalesce((select sum(amount_minor) from credit_notes where invoice_id = ${invoiceId}), 0)::int`,
    })
    .from(invoices)
    .where(eq(invoices.id, invoiceId));
  if (inv.totalMinor - inv.depositMinor - row!.credited - row!.paid > 0) return;
  await tx
    .update(invoices)
    .set({ status: "paid", paidAt: new Date(), version: inv.version + 1, updatedAt: new Date() })
    .where(eq(invoices.id, inv.id));
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
