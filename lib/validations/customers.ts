import { z } from "zod";

import { editVersion } from "./column-bounds";
import { searchText } from "./search";

/** Blank is none (null); line breaks as one `\n` (a browser posts a textarea's as `\r\n`). */
const optionalText = (max: number, label: string) =>
  z
    .string()
    .trim()
    .max(max, `${label} is too long (at most ${max} characters)`)
    .optional()
    .transform((v) => (v ? v.replace(/\r\n?/g, "\n") : null));

export const CustomerSchema = z.object({
  name: z
    .string()
    .trim()
    .min(1, "Enter the customer's name")
    .max(120, "Name is too long (at most 120 characters)"),
  email: z
    .string()
    .trim()
    .max(200)
    .optional()
    .transform((v) => (v ? v.toLowerCase() : null))
    .pipe(z.email("Enter a valid e-mail address").nullable()),
  phone: optionalText(40, "Phone"),
  notes: optionalText(2000, "Notes"),
});
export type CustomerInput = z.output<typeof CustomerSchema>;

/**
 * A change to a customer, from the edit form or `PATCH /api/v1/customers/:id`: the `.partial()`
 * of the create schema plus the id and, optionally, the `version` the edit started from (the
 * form always sends it; a stale one is 409). Only the fields sent change; an empty string clears
 * an optional one; sending none is refused.
 */
export const CustomerUpdateSchema = CustomerSchema.partial()
  .extend({ id: z.uuid("Unknown customer"), version: editVersion() })
  .refine(
    (o) => Object.entries(o).some(([k, v]) => !["id", "version"].includes(k) && v !== undefined),
    {
      message: "Send at least one of name, email, phone or notes",
    },
  );
export type CustomerUpdate = z.output<typeof CustomerUpdateSchema>;

export const CustomerIdSchema = z.object({ id: z.uuid("Unknown customer") });

export const CustomerListQuery = z.object({
  q: searchText().optional(),
  limit: z.coerce.number().int().min(1).max(100).default(50),
});
