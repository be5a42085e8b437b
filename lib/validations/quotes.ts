import { z } from "zod";

import { minorToPlain } from "@/lib/catalog/money";
import { quoteTotals } from "@/lib/catalog/quote-totals";
import { QUOTE_LINE_KINDS, QUOTE_STATUSES } from "@/lib/domain/quotes";

import { calendarDate, QUOTE_SUBTOTAL_MAX_MINOR, versionNumber } from "./column-bounds";

const isoDate = calendarDate();

export const QuoteLineSchema = z.object({
  kind: z.enum(QUOTE_LINE_KINDS, { error: "A line is a part, labour or a fee" }),
  partId: z.uuid().nullish(),
  sku: z.string().max(60).nullish(),
  description: z
    .string({ error: "Describe the line" })
    .trim()
    .min(1, "Describe the line")
    .max(200, "Description is too long"),
  /** Thousandths: 1.5 h = 1500. */
  quantityMilli: z
    .number({ error: "Quantity must be a number" })
    .int("Quantity has at most three decimals")
    .min(1, "Quantity must be above 0")
    .max(100_000_000, "Quantity is too large"),
  unitPriceMinor: z
    .number({ error: "Unit price must be a number" })
    .int("Unit price is in cents")
    .min(0, "Unit price must not be negative")
    .max(100_000_000, "Unit price is too large"),
  discountBp: z
    .number({ error: "Discount must be a number" })
    .int()
    .min(0, "Discount must be 0 % or more")
    .max(10000, "Discount must be at most 100 %")
    .default(0),
});

export const QuoteCreateSchema = z
  .object({
    buildId: z.uuid("Choose a build").optional(),
    customerId: z.uuid("Choose a customer").optional(),
    validUntil: isoDate.optional(),
    labourHours: z.number().min(0).max(1000).optional(),
  })
  .refine((q) => q.buildId || q.customerId, {
    path: ["customerId"],
    message: "Choose a build or a customer",
  });

/** What a person edits on a quote: validity, notes and lines. */
export const QuoteFieldsSchema = z.object({
  validUntil: isoDate,
  notes: z.string().trim().max(2000, "Notes are too long"),
  lines: z
    .array(QuoteLineSchema)
    .max(200, "At most 200 lines")
    .superRefine((lines, ctx) => {
      const subtotal = quoteTotals(lines, 0).grossMinor;
      if (subtotal > QUOTE_SUBTOTAL_MAX_MINOR)
        ctx.addIssue({
          code: "custom",
          message: `The lines add up to more than ${minorToPlain(QUOTE_SUBTOTAL_MAX_MINOR)}, the most one quote can hold`,
        });
    }),
});

const quoteId = z.uuid({ error: "That quote was not found" });

/**
 * An edit: any of the quote's fields (an absent one is left as it is) and the `version` the
 * edit started from.
 */
export const QuoteEditSchema = QuoteFieldsSchema.partial().extend({
  id: quoteId,
  version: versionNumber(),
});

/** A command on one quote that needs nothing else (send, revise, deposit). */
export const QuoteIdSchema = z.object({ id: quoteId });

export const QuoteStatusSchema = z.object({
  id: quoteId,
  status: z.enum(QUOTE_STATUSES, { error: "Unknown status" }),
});

/** The customer's answer to their own sent quote. */
export const QuoteResponseSchema = z.object({
  id: quoteId,
  decision: z.enum(["accept", "decline"], { error: "Say accept or decline" }),
});

/** Where the checkout sends the customer back: the quote and the checkout session. */
export const DepositReturnSchema = z.object({
  id: quoteId,
  session: z
    .string({ error: "session is required" })
    .regex(/^cs_[A-Za-z0-9_]{4,200}$/, "session is not a checkout session id"),
});

export type QuoteCreate = z.output<typeof QuoteCreateSchema>;
export type QuoteEdit = z.output<typeof QuoteEditSchema>;
export type QuoteLineInput = z.output<typeof QuoteLineSchema>;
