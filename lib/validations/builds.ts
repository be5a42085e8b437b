import { z } from "zod";

import { FuelSystemInputSchema } from "@/lib/calc";
import { converter } from "@/lib/calc/quantities";
import { ASPIRATIONS } from "@/lib/calc/schema";
import { BUILD_STATUSES, FUEL_CHOICES } from "@/lib/domain/builds";

import { versionNumber, versionParam } from "./column-bounds";
import { searchText } from "./search";
import { VehicleSchema } from "./vehicles";

const text = (label: string, max: number) =>
  z.string().trim().max(max, `${label} is too long (at most ${max} characters)`);

export const BuildCreateSchema = z.object({
  customerId: z.uuid("Choose a customer"),
  title: text("Title", 120).min(1, "Give the build a title"),
  vehicle: text("Vehicle", 200).optional(),
  inputs: FuelSystemInputSchema.optional(),
});

/**
 * A save: any of the sheet's fields (one left out keeps its stored value; an empty vehicle clears
 * it), the status to move to, a revision note, and the version the edit started from.
 */
export const BuildSaveSchema = BuildCreateSchema.omit({ customerId: true })
  .partial()
  .extend({
    id: z.uuid("Unknown build"),
    version: versionNumber(),
    status: z.enum(BUILD_STATUSES, { error: "Unknown status" }).optional(),
    note: text("Note", 500).optional(),
  });

/** One build, named by its id (copy as the next power step). */
export const BuildRefSchema = z.object({ id: z.uuid("Unknown build") });

/** Restore an earlier revision as a new one, from the version the page showed as current. */
export const RevisionRestoreSchema = z.object({
  buildId: z.uuid("Unknown build"),
  version: versionNumber(),
  currentVersion: versionNumber("currentVersion"),
});

export const BuildListQuery = z.object({
  q: searchText().optional(),
  status: z.enum(BUILD_STATUSES, { error: "Unknown status" }).optional(),
  tuner: z.string().trim().min(1).max(64, "Unknown tuner").optional(),
  sort: z
    .enum(["updated", "created", "title"], { error: "Sort by updated, created or title" })
    .default("updated"),
  cursor: z.string().max(400).optional(),
  limit: z.coerce.number().int().min(1).max(100).default(25),
});

/** `GET /api/v1/builds/:id/spec-sheet?version=N`: the revision to print (the latest without one). */
export const SpecSheetQuery = z.object({ version: versionParam().optional() });

/** A number from a form field (text) or a JSON body (number); a blank field is no number. */
const asNumber = (v: unknown) =>
  typeof v === "string" ? (v.trim() === "" ? undefined : Number(v.trim().replace(",", "."))) : v;
const goalNumber = (label: string, min: number, max: number, unit: string) =>
  z.preprocess(
    asNumber,
    z
      .number({
        error: (iss) =>
          iss.input === undefined
            ? `Enter the ${label.toLowerCase()}`
            : `${label} must be a number`,
      })
      .min(min, `${label} must be between ${min} and ${max} ${unit}`.trim())
      .max(max, `${label} must be between ${min} and ${max} ${unit}`.trim()),
  );

/**
 * The caller's goal, as the counter takes it on the phone (canonical units: L, kW): the engine
 * (displacement, cylinders, aspiration), the power goal and the fuel. The bounds are the sizing
 * schema's (lib/calc/schema.ts).
 */
export const BuildGoalSchema = z.object(
  {
    displacementL: goalNumber("Displacement", 0.1, 20, "L"),
    cylinders: goalNumber("Cylinders", 1, 16, "").pipe(
      z.number().int("Cylinders must be a whole number"),
    ),
    aspiration: z.enum(ASPIRATIONS, { error: "Choose the aspiration" }),
    powerKw: goalNumber("Power goal", 1, 5000, "kW"),
    measuredAt: z
      .enum(["wheel", "crank"], { error: "Say whether the power is at the wheels or the crank" })
      .default("wheel"),
    fuel: z.enum(FUEL_CHOICES, { error: "Choose the fuel" }),
  },
  { error: "Give the goal: engine, power and fuel" },
);
export type BuildGoal = z.output<typeof BuildGoalSchema>;

/**
 * A draft build from a caller's goal, for the tuner to size (`POST /api/v1/builds` with `goal`;
 * open to the counter): the customer, one of their vehicles (`vehicleId`) or a new one
 * (`newVehicle`), an optional title (else one made from the goal) and the goal. The sizing
 * inputs are the tuner's: a draft takes no `inputs`.
 */
export const BuildDraftSchema = z
  .object({
    customerId: z.uuid("Choose a customer"),
    vehicleId: z.uuid("Unknown vehicle").optional(),
    newVehicle: VehicleSchema.optional(),
    title: text("Title", 120).optional(),
    goal: BuildGoalSchema,
  })
  .refine((d) => !(d.vehicleId && d.newVehicle), {
    path: ["vehicleId"],
    message: "Pick a vehicle or add a new one, not both",
  });
export type BuildDraft = z.output<typeof BuildDraftSchema>;

/** Blank form fields are not sent. */
const blankless = (o: Record<string, unknown>) =>
  Object.fromEntries(Object.entries(o).filter(([, v]) => v !== "" && v !== undefined));

/**
 * The new-build page's form (flat fields; the power in the person's units, named by `units`):
 * `vehicleId` "new" takes the vehicle's fields (`vehicle.year` …). Turned into BuildDraftSchema's
 * shape, so the form and the API share its rules.
 */
export const BuildDraftFormSchema = z
  .object({
    customerId: z.string().optional(),
    vehicleId: z.string().optional(),
    title: z.string().optional(),
    units: z.enum(["metric", "imperial"]).default("metric"),
    displacementL: z.unknown().optional(),
    cylinders: z.unknown().optional(),
    aspiration: z.unknown().optional(),
    power: z.unknown().optional(),
    measuredAt: z.unknown().optional(),
    fuel: z.unknown().optional(),
    "vehicle.year": z.unknown().optional(),
    "vehicle.make": z.string().optional(),
    "vehicle.model": z.string().optional(),
    "vehicle.engine": z.string().optional(),
    "vehicle.vin": z.string().optional(),
  })
  .transform((f) => {
    const power = asNumber(f.power);
    return blankless({
      customerId: f.customerId || undefined,
      vehicleId: f.vehicleId && f.vehicleId !== "new" ? f.vehicleId : undefined,
      newVehicle:
        f.vehicleId === "new"
          ? blankless({
              year: f["vehicle.year"],
              make: f["vehicle.make"],
              model: f["vehicle.model"],
              engine: f["vehicle.engine"],
              vin: f["vehicle.vin"],
            })
          : undefined,
      title: f.title?.trim() || undefined,
      goal: blankless({
        displacementL: f.displacementL,
        cylinders: f.cylinders,
        aspiration: f.aspiration,
        powerKw:
          typeof power === "number" && Number.isFinite(power)
            ? converter("power", f.units).from(power)
            : power,
        measuredAt: f.measuredAt,
        fuel: f.fuel,
      }),
    });
  })
  .pipe(BuildDraftSchema);
