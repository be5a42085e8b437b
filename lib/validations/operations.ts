import { z } from "zod";

import { versionNumber } from "./column-bounds";
import { QuoteLineSchema } from "./quotes";

/** Schemas of suppliers, purchase orders, jobs, invoices and credit notes (forms and API alike). */

const name = (what: string, max = 120) =>
  z
    .string({ error: `${what} is required` })
    .trim()
    .min(1, `${what} is required`)
    .max(max, `${what} is too long`);
const optionalText = (what: string, max = 200) =>
  z.string().trim().max(max, `${what} is too long`).optional();
const units = (what = "Quantity") =>
  z
    .number({ error: `${what} must be a whole number` })
    .int(`${what} must be a whole number`)
    .min(0, `${what} must be 0 or more`)
    .max(100_000, `${what} must be at most 100,000`);
const moneyMinor = (what: string) =>
  z
    .number({ error: `${what} must be a number` })
    .int(`${what} is in cents`)
    .min(0, `${what} must not be negative`)
    .max(100_000_000, `${what} must be at most 1,000,000.00`);

export const SupplierPartSchema = z.object({
  partId: z.uuid("Choose a part"),
  supplierSku: name("Supplier's SKU", 60),
  costMinor: moneyMinor("Cost").nullish(),
});

export const SupplierFieldsSchema = z.object({
  name: name("Name"),
  contactName: optionalText("Contact"),
  email: z
    .union([z.literal(""), z.email("Enter an e-mail address").max(254, "E-mail is too long")])
    .optional(),
  phone: optionalText("Phone", 40),
  leadTimeDays: z
    .number({ error: "Lead time must be a whole number of days" })
    .int("Lead time must be a whole number of days")
    .min(0, "Lead time must be 0 days or more")
    .max(3650, "Lead time must be at most 3650 days")
    .nullish(),
  notes: optionalText("Notes", 2000),
  /** The supplier's SKUs for our parts: the whole list (a part left out is no longer theirs). */
  parts: z.array(SupplierPartSchema).max(500, "At most 500 parts").optional(),
});
export const SupplierCreateSchema = SupplierFieldsSchema;
export const SupplierUpdateSchema = SupplierFieldsSchema.partial().extend({
  id: z.uuid(),
  version: versionNumber().optional(),
});
export type SupplierCreate = z.output<typeof SupplierCreateSchema>;
export type SupplierUpdate = z.output<typeof SupplierUpdateSchema>;

export const PurchaseOrderCreateSchema = z.object({
  supplierId: z.uuid("Choose a supplier"),
  notes: optionalText("Notes", 2000),
  lines: z
    .array(
      z.object({
        partId: z.uuid("Choose a part"),
        quantity: units().min(1, "Quantity must be at least 1"),
        unitCostMinor: moneyMinor("Unit cost").optional(),
      }),
    )
    .min(1, "Add at least one line")
    .max(200, "At most 200 lines")
    // The order's total is kept in a 32-bit column of minor units.
    .refine(
      (lines) =>
        lines.reduce((t, l) => t + l.quantity * (l.unitCostMinor ?? 0), 0) <= 2_147_483_647,
      { message: "The lines add up to more than an order can hold: split it" },
    ),
});
export type PurchaseOrderCreate = z.output<typeof PurchaseOrderCreateSchema>;

export const PurchaseOrderReceiveSchema = z.object({
  id: z.uuid(),
  lines: z
    .array(z.object({ lineId: z.uuid("Choose a line"), quantity: units() }))
    .min(1, "Receive at least one line")
    .max(200, "At most 200 lines"),
});
export type PurchaseOrderReceive = z.output<typeof PurchaseOrderReceiveSchema>;

export const IdSchema = z.object({ id: z.uuid() });

/** Cancelling an order: the version the person saw (a stale one is a 409, nothing cancelled). */
export const PurchaseOrderCancelSchema = z.object({ id: z.uuid(), version: versionNumber() });
export type PurchaseOrderCancel = z.output<typeof PurchaseOrderCancelSchema>;

export const JobOpenSchema = z.object({ quoteId: z.uuid("Choose a quote") });

export const JobFitSchema = z.object({
  id: z.uuid(),
  version: versionNumber(),
  /** The parts actually fitted (may differ from the quote). */
  parts: z
    .array(z.object({ partId: z.uuid("Choose a part"), quantity: units().min(1) }))
    .max(200, "At most 200 parts"),
  /** Labour used, in thousandths of an hour (2.5 h = 2500). */
  labourMilli: z
    .number({ error: "Labour must be a number" })
    .int("Labour has at most three decimals")
    .min(0, "Labour must be 0 or more")
    .max(1_000_000, "Labour must be at most 1000 h"),
  notes: optionalText("Notes", 2000),
});
export type JobFit = z.output<typeof JobFitSchema>;

export const InvoiceCreateSchema = z.object({ jobId: z.uuid("Choose a job") });

/** A draft invoice's lines and notes; an issued one is never edited. */
export const InvoiceEditSchema = z.object({
  id: z.uuid(),
  version: versionNumber(),
  notes: optionalText("Notes", 2000),
  lines: z.array(QuoteLineSchema).max(200, "At most 200 lines").optional(),
});
export type InvoiceEdit = z.output<typeof InvoiceEditSchema>;

export const CreditNoteCreateSchema = z.object({
  id: z.uuid(),
  reason: name("Reason", 500),
  amountMinor: moneyMinor("Amount").min(1, "Amount must be above 0"),
});
export type CreditNoteCreate = z.output<typeof CreditNoteCreateSchema>;

export const BalanceReturnSchema = z.object({
  id: z.uuid(),
  session: z.string().min(1, "session is required").max(255),
});

export const MailRetrySchema = z.object({ id: z.uuid() });
export const NoticeOptSchema = z.object({ on: z.boolean() });
export const InvoiceIssueSchema = z.object({ id: z.uuid(), version: versionNumber() });
