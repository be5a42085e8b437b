import { relations, sql } from "drizzle-orm";
import {
  check,
  date,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from "drizzle-orm/pg-core";

import { PAYMENT_KINDS } from "@/lib/domain/operations";
import { PART_CATEGORIES } from "@/lib/domain/parts";
import { PAYMENT_STATUSES, QUOTE_LINE_KINDS, QUOTE_STATUSES } from "@/lib/domain/quotes";

import { organization, user } from "./auth";
import { builds } from "./builds";
import { invoices } from "./operations";
import { customers } from "./shops";

/** One catalog part of a shop. Money in integer minor units (cents); specs validated per category. */
export const parts = pgTable(
  "parts",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    sku: text("sku").notNull(),
    category: text("category", { enum: PART_CATEGORIES }).notNull(),
    brand: text("brand").notNull(),
    name: text("name").notNull(),
    priceMinor: integer("price_minor").notNull(),
    costMinor: integer("cost_minor").notNull().default(0),
    stock: integer("stock").notNull().default(0),
    /** Held by accepted quotes; available = stock − reserved. */
    reserved: integer("reserved").notNull().default(0),
    reorderLevel: integer("reorder_level").notNull().default(0),
    /** Days from ordering to having it on the shelf; null: not known. */
    leadTimeDays: integer("lead_time_days"),
    /** The day a restock is expected (a supplier's promise); null: none announced. */
    restockOn: date("restock_on", { mode: "string" }),
    specs: jsonb("specs").notNull().default({}),
    /** Goes up with each saved edit or import change (not with stock held by quotes). */
    version: integer("version").notNull().default(1),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("parts_shop_sku_idx").on(t.shopId, t.sku),
    index("parts_shop_category_idx").on(t.shopId, t.category, t.name),
    check(
      "parts_money_nonneg",
      sql`${t.priceMinor} >= 0 and ${t.costMinor} >= 0 and ${t.reserved} >= 0`,
    ),
  ],
);

/** Per-shop gap-free counters (quote numbers): incremented inside the creating transaction. */
export const shopCounters = pgTable(
  "shop_counters",
  {
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    value: integer("value").notNull().default(0),
  },
  (t) => [primaryKey({ columns: [t.shopId, t.name] })],
);

export const quotes = pgTable(
  "quotes",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    number: integer("number").notNull(),
    /** 1 for the first issue; an accepted quote that needs changing gets a new revision. */
    revision: integer("revision").notNull().default(1),
    customerId: uuid("customer_id")
      .notNull()
      .references(() => customers.id, { onDelete: "restrict" }),
    buildId: uuid("build_id").references(() => builds.id, { onDelete: "set null" }),
    status: text("status", { enum: QUOTE_STATUSES }).notNull().default("draft"),
    currency: text("currency").notNull(),
    taxRateBp: integer("tax_rate_bp").notNull(),
    validUntil: date("valid_until", { mode: "string" }).notNull(),
    notes: text("notes"),
    subtotalMinor: integer("subtotal_minor").notNull().default(0),
    discountMinor: integer("discount_minor").notNull().default(0),
    taxMinor: integer("tax_minor").notNull().default(0),
    totalMinor: integer("total_minor").notNull().default(0),
    version: integer("version").notNull().default(1),
    statusChangedAt: timestamp("status_changed_at", { withTimezone: true }),
    statusChangedBy: text("status_changed_by").references(() => user.id, { onDelete: "set null" }),
    /** When it was accepted: back-orders are filled in this order as stock arrives. */
    acceptedAt: timestamp("accepted_at", { withTimezone: true }),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("quotes_shop_number_rev_idx").on(t.shopId, t.number, t.revision),
    index("quotes_shop_updated_idx").on(t.shopId, t.updatedAt),
    index("quotes_shop_customer_idx").on(t.shopId, t.customerId),
    index("quotes_build_idx").on(t.buildId),
  ],
);

export const quoteLines = pgTable(
  "quote_lines",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    quoteId: uuid("quote_id")
      .notNull()
      .references(() => quotes.id, { onDelete: "cascade" }),
    position: integer("position").notNull(),
    kind: text("kind", { enum: QUOTE_LINE_KINDS }).notNull(),
    partId: uuid("part_id").references(() => parts.id, { onDelete: "set null" }),
    sku: text("sku"),
    description: text("description").notNull(),
    /** Quantity in thousandths (1.5 h of labour = 1500). */
    quantityMilli: integer("quantity_milli").notNull(),
    unitPriceMinor: integer("unit_price_minor").notNull(),
    /** Line discount in basis points (1000 = 10 %). */
    discountBp: integer("discount_bp").notNull().default(0),
    /**
     * Units of the part held for this line while the quote holds stock (accepted, deposit paid,
     * ordered): at most what was free when it was accepted; the rest is back-ordered. Leaving
     * those states releases exactly this many and sets it back to 0.
     */
    heldQty: integer("held_qty").notNull().default(0),
  },
  (t) => [
    index("quote_lines_quote_idx").on(t.quoteId, t.position),
    index("quote_lines_shop_idx").on(t.shopId),
  ],
);

/** Every e-mail sent about a quote. */
export const quoteMessages = pgTable(
  "quote_messages",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    quoteId: uuid("quote_id")
      .notNull()
      .references(() => quotes.id, { onDelete: "cascade" }),
    to: text("to").notNull(),
    subject: text("subject").notNull(),
    messageId: text("message_id"),
    sentBy: text("sent_by").references(() => user.id, { onDelete: "set null" }),
    sentAt: timestamp("sent_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("quote_messages_quote_idx").on(t.quoteId)],
);

export const quoteRelations = relations(quotes, ({ many, one }) => ({
  lines: many(quoteLines),
  messages: many(quoteMessages),
  customer: one(customers, { fields: [quotes.customerId], references: [customers.id] }),
}));
export const quoteLineRelations = relations(quoteLines, ({ one }) => ({
  quote: one(quotes, { fields: [quoteLines.quoteId], references: [quotes.id] }),
}));
export const quoteMessageRelations = relations(quoteMessages, ({ one }) => ({
  quote: one(quotes, { fields: [quoteMessages.quoteId], references: [quotes.id] }),
}));

export type Part = typeof parts.$inferSelect;
export type Quote = typeof quotes.$inferSelect;
export type QuoteLine = typeof quoteLines.$inferSelect;

/** A link to one build's spec sheet for someone without an account. Only the token's hash is kept. */
export const shareLinks = pgTable(
  "share_links",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    buildId: uuid("build_id")
      .notNull()
      .references(() => builds.id, { onDelete: "cascade" }),
    tokenHash: text("token_hash").notNull(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("share_links_token_idx").on(t.tokenHash),
    index("share_links_build_idx").on(t.shopId, t.buildId),
  ],
);
export type ShareLink = typeof shareLinks.$inferSelect;

/**
 * A payment asked of the customer through the card-payment provider, one row per checkout
 * session: the deposit on a quote, or the balance of an invoice (`invoice_id`). The paid rows
 * are the ledger every document's totals agree with.
 */
export const payments = pgTable(
  "payments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: text("shop_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    quoteId: uuid("quote_id")
      .notNull()
      .references(() => quotes.id, { onDelete: "cascade" }),
    kind: text("kind", { enum: PAYMENT_KINDS }).notNull().default("deposit"),
    invoiceId: uuid("invoice_id").references(() => invoices.id, { onDelete: "restrict" }),
    provider: text("provider").notNull().default("stripe"),
    /** The provider's checkout session id (unique: one payment per session, whatever arrives twice). */
    checkoutSessionId: text("checkout_session_id").notNull(),
    amountMinor: integer("amount_minor").notNull(),
    currency: text("currency").notNull(),
    status: text("status", { enum: PAYMENT_STATUSES }).notNull().default("pending"),
    /** The provider event (or retrieval) that recorded the payment. */
    paidEventId: text("paid_event_id"),
    paidAt: timestamp("paid_at", { withTimezone: true }),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("payments_session_idx").on(t.checkoutSessionId),
    index("payments_quote_idx").on(t.shopId, t.quoteId),
    index("payments_invoice_idx").on(t.invoiceId),
  ],
);
export type Payment = typeof payments.$inferSelect;

/** Every provider webhook event handled once: a redelivered event id is acknowledged and ignored. */
export const paymentEvents = pgTable("payment_events", {
  id: text("id").primaryKey(),
  type: text("type").notNull(),
  checkoutSessionId: text("checkout_session_id"),
  receivedAt: timestamp("received_at", { withTimezone: true }).notNull().defaultNow(),
});
