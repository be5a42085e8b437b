import { z } from "zod";

import { FuelSystemInputSchema, numberFromField } from "@/lib/calc";
import { converter } from "@/lib/calc/quantities";
import { ASPIRATIONS } from "@/lib/calc/schema";
import type { UnitSystem } from "@/lib/calc/units";
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
const goalNumber = (label: string, min: number, max: number, unit: string, whole = false) => {
  const n = z.number({
    error: (iss) =>
      iss.input === undefined ? `Enter the ${label.toLowerCase()}` : `${label} must be a number`,
  });
  // A whole-number field says so first (before its bounds): 0.5 cylinders is no count.
  return z.preprocess(
    asNumber,
    (whole ? n.int(`${label} must be a whole number`) : n)
      .min(min, `${label} must be between ${min} and ${max} ${unit}`.trim())
      .max(max, `${label} must be between ${min} and ${max} ${unit}`.trim()),
  );
};

/**
 * The caller's goal, as the counter takes it on the phone (canonical units: L, kW): the engine
 * (displacement, cylinders, aspiration), the power goal and the fuel. The bounds are the sizing
 * schema's (lib/calc/schema.ts).
 */
export const BuildGoalSchema = z.object(
  {
    displacementL: goalNumber("Displacement", 0.1, 20, "L"),
    cylinders: goalNumber("Cylinders", 1, 16, "", true),
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

/** The goal's canonical bounds (L, kW): BuildGoalSchema's, the sizing schema's. */
const GOAL_BOUNDS = { displacement: [0.1, 20], power: [1, 5000] } as const;

/**
 * The goal's bounds (lib/calc/schema.ts) as the person's units state them, rounded inwards to
 * the quantity's precision so every number said to be inside is (0.1–20 L: 7–1220 cu in).
 */
function goalBounds(q: "displacement" | "power", min: number, max: number, units: UnitSystem) {
  const c = converter(q, units);
  const k = 10 ** c.decimals;
  const low = Math.ceil(c.to(min) * k - 1e-9) / k;
  const high = Math.floor(c.to(max) * k + 1e-9) / k;
  return `between ${low} and ${high} ${c.unit}`;
}

/** A number typed in the form (in the person's units), checked only for being one above zero. */
const formGoalNumber = (label: string) =>
  z.preprocess(
    asNumber,
    z
      .number({
        error: (iss) =>
          iss.input === undefined
            ? `Enter the ${label.toLowerCase()}`
            : `${label} must be a number`,
      })
      .positive(`${label} must be above zero`),
  );

/**
 * The new-build page's form: flat fields named as the form names them (displacement and power in
 * the person's units, named by `units`; `vehicleId` "new" takes the `vehicle.*` fields), each
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
    displacement: formGoalNumber("Displacement"),
    cylinders: BuildGoalSchema.shape.cylinders,
    aspiration: BuildGoalSchema.shape.aspiration,
    power: formGoalNumber("Power goal"),
    measuredAt: BuildGoalSchema.shape.measuredAt,
    fuel: BuildGoalSchema.shape.fuel,
    "vehicle.year": z.preprocess(blank, z.unknown().optional()),
    "vehicle.make": formText(60, "Make"),
    "vehicle.model": formText(80, "Model"),
    "vehicle.engine": formText(120, "Engine"),
    "vehicle.vin": formText(40, "VIN"),
  })
  // The figures' bounds, in the person's units, beside the other fields' errors (not only once
  // every other field is right).
  .superRefine(
    (f, ctx) => {
      const units = f.units === "imperial" ? "imperial" : "metric";
      for (const [key, q, label] of [
        ["displacement", "displacement", "Displacement"],
        ["power", "power", "Power goal"],
      ] as const) {
        const v = f[key];
        if (typeof v !== "number") continue;
        const [min, max] = GOAL_BOUNDS[q];
        const canonical = converter(q, units).from(v);
        if (!(canonical >= min && canonical <= max))
          ctx.addIssue({
            code: "custom",
            path: [key],
            message: `${label} must be ${goalBounds(q, min, max, units)}`,
          });
      }
    },
    { when: (p) => typeof p.value === "object" && p.value !== null },
  )
  .transform((f, ctx) => {
    const goal = BuildGoalSchema.safeParse({
      displacementL: converter("displacement", f.units).from(f.displacement),
      cylinders: f.cylinders,
      aspiration: f.aspiration,
      powerKw: converter("power", f.units).from(f.power),
      measuredAt: f.measuredAt,
      fuel: f.fuel,
    });
    // Only the two converted figures can fail here: their bounds are the schema's (L, kW),
    // said in the person's units.
    if (!goal.success) {
      const failed = new Set(goal.error.issues.map((i) => String(i.path[0])));
      if (failed.has("displacementL"))
        ctx.addIssue({
          code: "custom",
          path: ["displacement"],
          message: `Displacement must be ${goalBounds("displacement", ...GOAL_BOUNDS.displacement, f.units)}`,
        });
      if (failed.has("powerKw"))
        ctx.addIssue({
          code: "custom",
          path: ["power"],
          message: `Power goal must be ${goalBounds("power", ...GOAL_BOUNDS.power, f.units)}`,
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
