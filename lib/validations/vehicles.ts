import { z } from "zod";

import { normaliseVin, vinProblem } from "@/lib/domain/vin";

/** A number from a form field (text) or a JSON body (number); a blank field is no number. */
const asNumber = (v: unknown) =>
  typeof v === "string" && v.trim() !== "" ? Number(v.trim()) : v === "" ? undefined : v;

/** Blank or null is none (an API client sends back the nulls it read). */
const optionalText = (max: number, label: string) =>
  z
    .string()
    .trim()
    .max(max, `${label} is too long (at most ${max} characters)`)
    .nullish()
    .transform((v) => (v ? v.replace(/\r\n?/g, "\n") : null));

const required = (max: number, label: string) =>
  z
    .string({ error: `Enter the ${label.toLowerCase()}` })
    .trim()
    .min(1, `Enter the ${label.toLowerCase()}`)
    .max(max, `${label} is too long (at most ${max} characters)`);

/** The first model year a vehicle may have, and how far ahead of this year a model year may be. */
export const VEHICLE_YEAR_MIN = 1900;
const yearMax = () => new Date().getUTCFullYear() + 2;

const year = z.preprocess(
  asNumber,
  z
    .number({
      error: (iss) => (iss.input === undefined ? "Enter the model year" : "Year must be a number"),
    })
    .int("Year must be a whole number")
    .min(VEHICLE_YEAR_MIN, `Year must be ${VEHICLE_YEAR_MIN} or later`)
    .refine((y) => y <= yearMax(), { message: "Year is too far in the future" }),
);

const vin = z
  .string()
  .max(40, "VIN is too long")
  .nullish()
  .transform((v) => (v ? normaliseVin(v) : null))
  .transform((v) => v || null);

/** A vehicle's fields: year, make, model, optional engine, VIN (checked) and notes. */
export const VehicleFields = z.object({
  year,
  make: required(60, "Make"),
  model: required(80, "Model"),
  engine: optionalText(120, "Engine"),
  vin,
  notes: optionalText(1000, "Notes"),
});

type VinCheck = { year?: number; vin?: string | null };
/** The VIN is checked against the year it was built in (17 characters from 1981). */
function checkVin(v: VinCheck, ctx: z.RefinementCtx) {
  if (!v.vin) return;
  const problem = vinProblem(v.vin, v.year);
  if (problem) ctx.addIssue({ code: "custom", path: ["vin"], message: problem });
}

export const VehicleSchema = VehicleFields.superRefine(checkVin);
export type VehicleInput = z.output<typeof VehicleSchema>;

/** "Add a vehicle" on the customer page. */
export const VehicleAddSchema = VehicleFields.extend({
  customerId: z.uuid("Unknown customer"),
}).superRefine(checkVin);

/**
 * A change to one vehicle: any of its fields (one left out keeps its value; a blank optional one
 * clears it). The VIN is checked against the year sent or, when none is sent, as a modern one
 * by the command (which knows the stored year).
 */
export const VehicleUpdateSchema = VehicleFields.partial()
  .extend({ id: z.uuid("Unknown vehicle") })
  .superRefine(checkVin);
export type VehicleUpdate = z.output<typeof VehicleUpdateSchema>;

export const VehicleIdSchema = z.object({ id: z.uuid("Unknown vehicle") });

/**
 * A customer's vehicles as the API's `PATCH /api/v1/customers/:id` takes them: the whole list.
 * One with an `id` is that stored vehicle (the fields sent change), one without is added (year,
 * make and model needed), a stored one left out is removed.
 */
export const VehicleListItemSchema = VehicleFields.partial()
  .extend({ id: z.uuid("Unknown vehicle").optional() })
  .superRefine((v, ctx) => {
    if (!v.id)
      for (const k of ["year", "make", "model"] as const)
        if (v[k] === undefined)
          ctx.addIssue({
            code: "custom",
            path: [k],
            message: `A new vehicle needs its ${k}`,
          });
    checkVin(v, ctx);
  });
export type VehicleListItem = z.output<typeof VehicleListItemSchema>;

export const VehicleListSchema = z
  .array(VehicleListItemSchema, { error: "vehicles is a list of vehicles" })
  .max(50, "At most 50 vehicles per customer");
