import { z } from "zod";

const optionalText = (max: number, label: string) =>
  z
    .string()
    .trim()
    .max(max, `${label} is too long (at most ${max} characters)`)
    .optional()
    .transform((v) => (v ? v : null));

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

export const CustomerUpdateSchema = CustomerSchema.extend({ id: z.uuid("Unknown customer") });

/** PATCH over the API: only the fields sent change; an empty string clears an optional one. */
export const CustomerPatchSchema = CustomerSchema.partial().refine(
  (o) => Object.values(o).some((v) => v !== undefined),
  { message: "Send at least one of name, email, phone or notes" },
);

export const CustomerListQuery = z.object({
  q: z.string().trim().max(100, "Search is too long").optional(),
  limit: z.coerce.number().int().min(1).max(100).default(50),
});
