import { z } from "zod";

import { FuelSystemInputSchema, numberFromField } from "@/lib/calc";
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
const asNumber = numberFromField;
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

/** A blank form field is no value. */
const blank = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);
const formText = (max: number, label: string) =>
  z.preprocess(blank, z.string().trim().max(max, `${label} is too long`).optional());

/**
 * The new-build page's form: flat fields named as the form names them (the power in the
 * person's units, named by `units`; `vehicleId` "new" takes the `vehicle.*` fields), each
 * checked under its own name, then put into BuildDraftSchema's shape for the command.
 */
export const BuildDraftFormSchema = z
  .object({
    customerId: z.uuid("Choose a customer"),
    vehicleId: z.preprocess(
      blank,
      z.union([z.literal("new"), z.uuid("Pick a vehicle")]).optional(),
    ),
    title: formText(120, "Title"),
    units: z.enum(["metric", "imperial"], { error: "Unknown units" }).default("metric"),
    displacementL: BuildGoalSchema.shape.displacementL,
    cylinders: BuildGoalSchema.shape.cylinders,
    aspiration: BuildGoalSchema.shape.aspiration,
    power: z.preprocess(
      asNumber,
      z
        .number({
          error: (iss) =>
            iss.input === undefined ? "Enter the power goal" : "Power goal must be a number",
        })
        .positive("Power goal must be above zero"),
    ),
    measuredAt: BuildGoalSchema.shape.measuredAt,
    fuel: BuildGoalSchema.shape.fuel,
    "vehicle.year": z.preprocess(blank, z.unknown().optional()),
    "vehicle.make": formText(60, "Make"),
    "vehicle.model": formText(80, "Model"),
    "vehicle.engine": formText(120, "Engine"),
    "vehicle.vin": formText(40, "VIN"),
  })
  .transform((f, ctx) => {
    const powerKw = converter("power", f.units).from(f.power);
    const goal = BuildGoalSchema.safeParse({
      displacementL: f.displacementL,
      cylinders: f.cylinders,
      aspiration: f.aspiration,
      powerKw,
      measuredAt: f.measuredAt,
      fuel: f.fuel,
    });
    // Only the power can fail here: its bounds are the schema's, in kW.
    if (!goal.success) {
      ctx.addIssue({
        code: "custom",
        path: ["power"],
        message: "Power goal must be between 1 and 5000 kW (about 1.3 to 6700 hp)",
      });
      return z.NEVER;
    }
    let newVehicle: z.output<typeof VehicleSchema> | undefined;
    if (f.vehicleId === "new") {
      const v = VehicleSchema.safeParse({
        year: f["vehicle.year"],
        make: f["vehicle.make"],
        model: f["vehicle.model"],
        engine: f["vehicle.engine"],
        vin: f["vehicle.vin"],
      });
      if (!v.success) {
        for (const i of v.error.issues)
          ctx.addIssue({
            code: "custom",
            path: [`vehicle.${String(i.path[0])}`],
            message: i.message,
          });
        return z.NEVER;
      }
      newVehicle = v.data;
    }
    return {
      customerId: f.customerId,
      vehicleId: f.vehicleId && f.vehicleId !== "new" ? f.vehicleId : undefined,
      newVehicle,
      title: f.title || undefined,
      goal: goal.data,
    } satisfies BuildDraft;
  });
