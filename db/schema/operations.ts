import { relations, sql } from "drizzle-orm";
import {
  check,
  index,
  integer,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from "drizzle-orm/pg-core";

import {
  INVOICE_STATUSES,
  JOB_STATUSES,
  MAIL_RECORDS,
  MAIL_STATUSES,
  NOTICE_KINDS,
  PO_STATUSES,
} from "@/lib/domain/operations";
import { QUOTE_LINE_KINDS } from "@/lib/domain/quotes";

import { organization, user } from "./auth";
import { builds } from "./builds";
import { parts, quoteLines, quotes } from "./catalog";
import { customers } from "./shops";

/** Money in integer minor units, quantities of parts in whole units, hours in thousandths. */

const shopId = () =>
  text("shop_id")
    .notNull()
    .references(() => organization.id, { onDelete: "cascade" });
const stamps = {
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
};

/** A shop's supplier of parts. */
export const suppliers = pgTable(
  "suppliers",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: shopId(),
    name: text("name").notNull(),
    contactName: text("contact_name"),
    /** Where purchase orders are e-mailed. */
    email: text("email"),
    phone: text("phone"),
    /** Days from ordering to the shelf, usually; a part's own lead time wins. */
    leadTimeDays: integer("lead_time_days"),
    notes: text("notes"),
    version: integer("version").notNull().default(1),
    ...stamps,
  },
  (t) => [uniqueIndex("suppliers_shop_name_idx").on(t.shopId, t.name)],
);

/** The supplier's SKU (and price to us) for one of our parts. */
export const supplierParts = pgTable(
  "supplier_parts",
  {
    shopId: shopId(),
    supplierId: uuid("supplier_id")
      .notNull()
      .references(() => suppliers.id, { onDelete: "cascade" }),
    partId: uuid("part_id")
      .notNull()
      .references(() => parts.id, { onDelete: "cascade" }),
    supplierSku: text("supplier_sku").notNull(),
    costMinor: integer("cost_minor"),
  },
  (t) => [
    primaryKey({ columns: [t.supplierId, t.partId] }),
    index("supplier_parts_part_idx").on(t.shopId, t.partId),
  ],
);

/** An order of parts from a supplier, numbered per shop (PO-0001). */
export const purchaseOrders = pgTable(
  "purchase_orders",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: shopId(),
    number: integer("number").notNull(),
    supplierId: uuid("supplier_id")
      .notNull()
      .references(() => suppliers.id, { onDelete: "restrict" }),
    status: text("status", { enum: PO_STATUSES }).notNull().default("draft"),
    currency: text("currency").notNull(),
    notes: text("notes"),
    totalMinor: integer("total_minor").notNull().default(0),
    sentAt: timestamp("sent_at", { withTimezone: true }),
    receivedAt: timestamp("received_at", { withTimezone: true }),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    version: integer("version").notNull().default(1),
    ...stamps,
  },
  (t) => [
    uniqueIndex("purchase_orders_shop_number_idx").on(t.shopId, t.number),
    index("purchase_orders_shop_status_idx").on(t.shopId, t.status),
  ],
);

export const purchaseOrderLines = pgTable(
  "purchase_order_lines",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: shopId(),
    purchaseOrderId: uuid("purchase_order_id")
      .notNull()
      .references(() => purchaseOrders.id, { onDelete: "cascade" }),
    position: integer("position").notNull(),
    partId: uuid("part_id")
      .notNull()
      .references(() => parts.id, { onDelete: "restrict" }),
    sku: text("sku").notNull(),
    supplierSku: text("supplier_sku"),
    description: text("description").notNull(),
    quantity: integer("quantity").notNull(),
    receivedQty: integer("received_qty").notNull().default(0),
    unitCostMinor: integer("unit_cost_minor").notNull().default(0),
  },
  (t) => [
    index("purchase_order_lines_po_idx").on(t.purchaseOrderId, t.position),
    index("purchase_order_lines_part_idx").on(t.shopId, t.partId),
    check(
      "purchase_order_lines_qty",
      sql`${t.quantity} > 0 and ${t.receivedQty} >= 0 and ${t.receivedQty} <= ${t.quantity}`,
    ),
  ],
);

/** The work on a car after its quote's deposit is paid, numbered per shop (J-0001). */
export const jobs = pgTable(
  "jobs",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: shopId(),
    number: integer("number").notNull(),
    quoteId: uuid("quote_id")
      .notNull()
      .references(() => quotes.id, { onDelete: "restrict" }),
    customerId: uuid("customer_id")
      .notNull()
      .references(() => customers.id, { onDelete: "restrict" }),
    buildId: uuid("build_id").references(() => builds.id, { onDelete: "set null" }),
    status: text("status", { enum: JOB_STATUSES }).notNull().default("waiting_parts"),
    /** Labour actually used, in thousandths of an hour; null until fitted. */
    labourMilli: integer("labour_milli"),
    readyAt: timestamp("ready_at", { withTimezone: true }),
    fittedAt: timestamp("fitted_at", { withTimezone: true }),
    fittedBy: text("fitted_by").references(() => user.id, { onDelete: "set null" }),
    notes: text("notes"),
    version: integer("version").notNull().default(1),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    ...stamps,
  },
  (t) => [
    uniqueIndex("jobs_shop_number_idx").on(t.shopId, t.number),
    uniqueIndex("jobs_quote_idx").on(t.quoteId),
    index("jobs_shop_status_idx").on(t.shopId, t.status),
  ],
);

/**
 * One part of a job: the units the quote asked for, the units allocated to it (the quote line's
 * `held_qty`, moved together), and once fitted the units actually fitted. A part fitted that the
 * quote did not name is a line of its own with no quote line.
 */
export const jobLines = pgTable(
  "job_lines",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: shopId(),
    jobId: uuid("job_id")
      .notNull()
      .references(() => jobs.id, { onDelete: "cascade" }),
    quoteLineId: uuid("quote_line_id").references(() => quoteLines.id, { onDelete: "set null" }),
    position: integer("position").notNull(),
    partId: uuid("part_id").references(() => parts.id, { onDelete: "set null" }),
    sku: text("sku"),
    description: text("description").notNull(),
    quantity: integer("quantity").notNull(),
    allocatedQty: integer("allocated_qty").notNull().default(0),
    fittedQty: integer("fitted_qty"),
    unitPriceMinor: integer("unit_price_minor").notNull(),
    discountBp: integer("discount_bp").notNull().default(0),
  },
  (t) => [index("job_lines_job_idx").on(t.jobId, t.position)],
);

/** A bill raised from a fitted job; numbered when issued (INV-0001) and never edited after. */
export const invoices = pgTable(
  "invoices",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: shopId(),
    number: integer("number"),
    jobId: uuid("job_id")
      .notNull()
      .references(() => jobs.id, { onDelete: "restrict" }),
    quoteId: uuid("quote_id")
      .notNull()
      .references(() => quotes.id, { onDelete: "restrict" }),
    customerId: uuid("customer_id")
      .notNull()
      .references(() => customers.id, { onDelete: "restrict" }),
    status: text("status", { enum: INVOICE_STATUSES }).notNull().default("draft"),
    currency: text("currency").notNull(),
    taxRateBp: integer("tax_rate_bp").notNull(),
    subtotalMinor: integer("subtotal_minor").notNull().default(0),
    discountMinor: integer("discount_minor").notNull().default(0),
    taxMinor: integer("tax_minor").notNull().default(0),
    totalMinor: integer("total_minor").notNull().default(0),
    /** The deposit paid on the quote, taken off the total. */
    depositMinor: integer("deposit_minor").notNull().default(0),
    notes: text("notes"),
    issuedAt: timestamp("issued_at", { withTimezone: true }),
    issuedBy: text("issued_by").references(() => user.id, { onDelete: "set null" }),
    paidAt: timestamp("paid_at", { withTimezone: true }),
    version: integer("version").notNull().default(1),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    ...stamps,
  },
  (t) => [
    uniqueIndex("invoices_shop_number_idx").on(t.shopId, t.number),
    uniqueIndex("invoices_job_idx").on(t.jobId),
    index("invoices_shop_customer_idx").on(t.shopId, t.customerId),
  ],
);

export const invoiceLines = pgTable(
  "invoice_lines",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: shopId(),
    invoiceId: uuid("invoice_id")
      .notNull()
      .references(() => invoices.id, { onDelete: "cascade" }),
    position: integer("position").notNull(),
    kind: text("kind", { enum: QUOTE_LINE_KINDS }).notNull(),
    partId: uuid("part_id").references(() => parts.id, { onDelete: "set null" }),
    sku: text("sku"),
    description: text("description").notNull(),
    quantityMilli: integer("quantity_milli").notNull(),
    unitPriceMinor: integer("unit_price_minor").notNull(),
    discountBp: integer("discount_bp").notNull().default(0),
  },
  (t) => [index("invoice_lines_invoice_idx").on(t.invoiceId, t.position)],
);

/** Corrects an issued invoice (which is never edited): an amount credited, tax included. */
export const creditNotes = pgTable(
  "credit_notes",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: shopId(),
    number: integer("number").notNull(),
    invoiceId: uuid("invoice_id")
      .notNull()
      .references(() => invoices.id, { onDelete: "restrict" }),
    reason: text("reason").notNull(),
    /** Credited, tax included. */
    amountMinor: integer("amount_minor").notNull(),
    /** The tax inside the amount, at the invoice's rate. */
    taxMinor: integer("tax_minor").notNull(),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("credit_notes_shop_number_idx").on(t.shopId, t.number),
    index("credit_notes_invoice_idx").on(t.invoiceId),
    check("credit_notes_amount_pos", sql`${t.amountMinor} > 0`),
  ],
);

/**
 * Every e-mail about a job, invoice or purchase order (and the shop's notices about quotes):
 * one row per notice and recipient (unique), so a notice goes out once; a failed one stays
 * `failed` and can be sent again.
 */
export const mailLog = pgTable(
  "mail_log",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    shopId: shopId(),
    recordKind: text("record_kind", { enum: MAIL_RECORDS }).notNull(),
    recordId: uuid("record_id").notNull(),
    notice: text("notice", { enum: NOTICE_KINDS }).notNull(),
    /** Tells apart two notices of one kind on one record (a receipt per payment). */
    occasion: text("occasion").notNull().default(""),
    to: text("to").notNull(),
    subject: text("subject").notNull(),
    /** The message's text as sent (a retry sends it again; attachments are made again). */
    body: text("body").notNull().default(""),
    status: text("status", { enum: MAIL_STATUSES }).notNull().default("pending"),
    messageId: text("message_id"),
    error: text("error"),
    attempts: integer("attempts").notNull().default(0),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp("sent_at", { withTimezone: true }),
  },
  (t) => [
    uniqueIndex("mail_log_once_idx").on(t.recordId, t.notice, t.occasion, t.to),
    index("mail_log_record_idx").on(t.shopId, t.recordKind, t.recordId),
  ],
);

/** Shop members who asked for the shop's notices (quote answered, payment in, PO received). */
export const shopNoticeSubscribers = pgTable(
  "shop_notice_subscribers",
  {
    shopId: shopId(),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.shopId, t.userId] })],
);

export const purchaseOrderRelations = relations(purchaseOrders, ({ many, one }) => ({
  lines: many(purchaseOrderLines),
  supplier: one(suppliers, { fields: [purchaseOrders.supplierId], references: [suppliers.id] }),
}));
export const purchaseOrderLineRelations = relations(purchaseOrderLines, ({ one }) => ({
  purchaseOrder: one(purchaseOrders, {
    fields: [purchaseOrderLines.purchaseOrderId],
    references: [purchaseOrders.id],
  }),
}));
export const jobRelations = relations(jobs, ({ many }) => ({ lines: many(jobLines) }));
export const jobLineRelations = relations(jobLines, ({ one }) => ({
  job: one(jobs, { fields: [jobLines.jobId], references: [jobs.id] }),
}));
export const invoiceRelations = relations(invoices, ({ many }) => ({
  lines: many(invoiceLines),
  creditNotes: many(creditNotes),
}));
export const invoiceLineRelations = relations(invoiceLines, ({ one }) => ({
  invoice: one(invoices, { fields: [invoiceLines.invoiceId], references: [invoices.id] }),
}));
export const creditNoteRelations = relations(creditNotes, ({ one }) => ({
  invoice: one(invoices, { fields: [creditNotes.invoiceId], references: [invoices.id] }),
}));

export type Supplier = typeof suppliers.$inferSelect;
export type PurchaseOrder = typeof purchaseOrders.$inferSelect;
export type PurchaseOrderLine = typeof purchaseOrderLines.$inferSelect;
export type Job = typeof jobs.$inferSelect;
export type JobLine = typeof jobLines.$inferSelect;
export type Invoice = typeof invoices.$inferSelect;
export type InvoiceLine = typeof invoiceLines.$inferSelect;
export type CreditNote = typeof creditNotes.$inferSelect;
export type MailLogRow = typeof mailLog.$inferSelect;
