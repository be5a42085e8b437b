import { z } from "zod";

import { QUOTE_LINE_KINDS, QUOTE_SORTS, QUOTE_STATUSES } from "@/lib/domain/quotes";

import {
  calendarDate,
  QUOTE_LINE_PRICE_MAX_MINOR,
  QUOTE_LINE_QTY_MAX_MILLI,
  versionNumber,
} from "./column-bounds";
import { searchText } from "./search";

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
    .max(QUOTE_LINE_QTY_MAX_MILLI, "Quantity must be at most 100,000"),
  unitPriceMinor: z
    .number({ error: "Unit price must be a number" })
    .int("Unit price is in cents")
    .min(0, "Unit price must not be negative")
    .max(QUOTE_LINE_PRICE_MAX_MINOR, "Unit price must be at most 1,000,000.00"),
  discountBp: z
    .number({ error: "Discount must be a number" })
    .int()
    .min(0, "Discount must be 0 % or more")
    .max(10000, "Discount must be at most 100 %")
    .default(0),
});

/**
 * A quote's lines: at most 200. That they add up to what one quote can hold is checked by the
 * quote commands (`lib/quotes/quote-limits.ts#quoteSizeIssue`), which know the quote's currency
 * and so can say the limit as money.
 */
const QuoteLinesSchema = z.array(QuoteLineSchema).max(200, "At most 200 lines");

const notesText = z.string().trim().max(2000, "Notes are too long");

/** What a person edits on a quote: validity, notes and lines. */
export const QuoteFieldsSchema = z.object({
  validUntil: isoDate,
  notes: notesText,
  lines: QuoteLinesSchema,
});

/**
 * A new draft: from a build (its kit's parts and a labour line, for the build's customer), or a
 * parts-only quote for a customer — straight from the catalog, with the lines given (none: an
 * empty draft to fill in). `labourHours` adds one labour line at the shop's rate, unless the
 * lines already carry labour.
 */
export const QuoteCreateSchema = z
  .object({
    buildId: z.uuid("Choose a build").optional(),
    customerId: z.uuid("Choose a customer").optional(),
    validUntil: isoDate.optional(),
    labourHours: z
      .number({ error: "Labour hours must be a number" })
      .min(0, "Labour hours must be 0 or more")
      .max(1000, "Labour hours must be at most 1000")
      .optional(),
    notes: notesText.optional(),
    lines: QuoteLinesSchema.optional(),
  })
  .refine((q) => q.buildId || q.customerId, {
    path: ["customerId"],
    message: "Choose a build or a customer",
  })
  .refine((q) => !(q.buildId && q.lines), {
    path: ["lines"],
    message:
      "A quote from a build takes its lines from the build's kit; leave out lines or the build",
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

/** How the quotes list sorts: newest number first (the default), oldest, total, validity, customer. */
export { QUOTE_SORT_LABELS, QUOTE_SORTS, type QuoteSort } from "@/lib/domain/quotes";

/**
 * The quotes list's filters (the page's searchParams and GET /api/v1/quotes alike): `q` finds a
 * quote by its number ("Q-0007", "7", "Q-0007-r2"), its customer's name or its build's title or
 * vehicle; `status` is the status as of today (a sent quote past its date is expired).
 */
export const QuoteListQuery = z.object({
  q: searchText().optional(),
  status: z.enum(QUOTE_STATUSES, { error: "Unknown status" }).optional(),
  sort: z.enum(QUOTE_SORTS, { error: `Sort by ${QUOTE_SORTS.join(", ")}` }).default("newest"),
});
export type QuoteListFilters = z.output<typeof QuoteListQuery>;

/** "Q-0007-r2", "q7", "0007" → { number: 7, revision: 2 } (revision only when named); else null. */
export function parseQuoteNumber(q: string): { number: number; revision?: number } | null {
  const m = /^(?:q\s*-?\s*)?0*(\d{1,9})(?:\s*-?\s*r(\d{1,4}))?$/i.exec(q.trim());
  if (!m) return null;
  return { number: Number(m[1]), ...(m[2] ? { revision: Number(m[2]) } : {}) };
}

export type QuoteCreate = z.output<typeof QuoteCreateSchema>;
export type QuoteEdit = z.output<typeof QuoteEditSchema>;
export type QuoteLineInput = z.output<typeof QuoteLineSchema>;
