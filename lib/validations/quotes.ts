import { z } from "zod";

import { QUOTE_LINE_KINDS, QUOTE_STATUSES } from "@/lib/domain/quotes";

const isoDate = z.iso.date({ error: "Give a date as YYYY-MM-DD" });

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

export const QuoteUpdateSchema = z.object({
  version: z.number({ error: "version is required" }).int().min(1),
  validUntil: isoDate,
  notes: z.string().trim().max(2000, "Notes are too long").optional(),
  lines: z.array(QuoteLineSchema).max(200, "At most 200 lines"),
});

export const QuoteStatusSchema = z.object({
  status: z.enum(QUOTE_STATUSES, { error: "Unknown status" }),
});
