import { z } from "zod";

import { isCountryCode } from "@/lib/domain/countries";

import { editVersion } from "./column-bounds";
import { searchText } from "./search";
import { VehicleListSchema, VehicleSchema } from "./vehicles";

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
  /** As typed; the command reads it with the shop's country and stores E.164 (lib/format/phone). */
  phone: optionalText(40, "Phone"),
  notes: optionalText(2000, "Notes"),
  addressLine1: optionalText(120, "Address"),
  addressLine2: optionalText(120, "Address line 2"),
  city: optionalText(80, "City"),
  region: optionalText(80, "State or region"),
  postcode: optionalText(20, "Postcode"),
  /** Blank: the shop's country. */
  country: z
    .string()
    .trim()
    .max(2, "Choose a country")
    .optional()
    .transform((v) => (v ? v.toUpperCase() : null))
    .refine((v) => v === null || isCountryCode(v), "Choose a country"),
  taxId: optionalText(40, "Tax number"),
});
export type CustomerInput = z.output<typeof CustomerSchema>;

/** `POST /api/v1/customers`: a customer, optionally with their vehicles. */
export const CustomerCreateSchema = CustomerSchema.extend({
  vehicles: z.array(VehicleSchema).max(50, "At most 50 vehicles per customer").optional(),
});
export type CustomerCreate = z.output<typeof CustomerCreateSchema>;

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
      message: "Send at least one of the customer's fields",
    },
  );
export type CustomerUpdate = z.output<typeof CustomerUpdateSchema>;

/**
 * `PATCH /api/v1/customers/:id`: the form's change, and optionally `vehicles`, the whole list
 * (lib/validations/vehicles.ts#VehicleListSchema).
 */
export const CustomerPatchSchema = CustomerSchema.partial()
  .extend({
    id: z.uuid("Unknown customer"),
    version: editVersion(),
    vehicles: VehicleListSchema.optional(),
  })
  .refine(
    (o) => Object.entries(o).some(([k, v]) => !["id", "version"].includes(k) && v !== undefined),
    { message: "Send at least one of the customer's fields or vehicles" },
  );
export type CustomerPatch = z.output<typeof CustomerPatchSchema>;

export const CustomerIdSchema = z.object({ id: z.uuid("Unknown customer") });

export const CustomerListQuery = z.object({
  q: searchText().optional(),
  limit: z.coerce.number().int().min(1).max(100).default(50),
});
