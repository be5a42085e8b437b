import { z } from "zod";

import {
  DatalogMappingSchema,
  numberFromField,
  POWER_MEASURED_AT,
  TuneLimitsOverrideSchema,
} from "@/lib/calc";

/** A number from a form field, a query parameter (text) or a JSON body (number). */
const number = (label: string, min: number, max: number, unit: string) =>
  z.preprocess(
    numberFromField,
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

const powerAt = z.enum(POWER_MEASURED_AT, {
  error: "Say where the dyno measured the power: crank, wheel or hub",
});
export const PULL_NOTES_MAX = 2000;
const notes = z.string().max(PULL_NOTES_MAX, `Notes: at most ${PULL_NOTES_MAX} characters`);

/** What a pull states beside its log: fuel, boost asked, where power was measured, notes. */
export const TunePullFields = z.object({
  ethanolPct: number("Ethanol content", 0, 100, "%"),
  /** kPa gauge; blank: not stated. */
  boostTargetKpa: number("Boost target", 0, 500, "kPa").optional(),
  powerMeasuredAt: powerAt,
  notes: notes.optional(),
});

/**
 * A pull added to a build's tune session: the CSV is the body (the route), the rest comes in the
 * query string; `mapping` (JSON, optional) overrides the shop's remembered mapping for the logger.
 */
export const TunePullUploadSchema = TunePullFields.extend({
  buildId: z.uuid("Unknown build"),
  fileName: z.string().optional(),
  csv: z.string(),
  mapping: DatalogMappingSchema.optional(),
});

/** Change a pull: any of its fields, or exclude it from the session (it stays listed). */
export const TunePullUpdateSchema = z.object(
  {
    id: z.uuid("Unknown pull"),
    ethanolPct: number("Ethanol content", 0, 100, "%").optional(),
    boostTargetKpa: number("Boost target", 0, 500, "kPa").nullable().optional(),
    powerMeasuredAt: powerAt.optional(),
    notes: notes.optional(),
    excluded: z.boolean({ error: "Excluded is true or false" }).optional(),
  },
  { error: "Send the pull's changes as a JSON object" },
);

export const TunePullRefSchema = z.object({ id: z.uuid("Unknown pull") });

/**
 * The build's own limits (any of the fields; null: back to the shop's), or — the owner, with
 * `scope: "shop"` and no build needed — the shop's defaults (null: back to the library's).
 */
export const TuneLimitsSaveSchema = z.object(
  {
    buildId: z.uuid("Unknown build").optional(),
    limits: TuneLimitsOverrideSchema.nullable(),
    scope: z.enum(["build", "shop"], { error: "Scope is build or shop" }).default("build"),
  },
  { error: "Send { limits }" },
);

/** `GET /api/v1/builds/:id/tune?nextBoostKpa=…`, `?nextPowerKw=…` (crank) or `?nextBy=boost|power` (the build's target): the step to predict. */
export const TuneSessionQuery = z.object({
  nextBoostKpa: number("Next boost", 0, 500, "kPa").optional(),
  nextPowerKw: number("Next power target", 1, 5000, "kW").optional(),
  /** Neither given: step by the build's boost target or by its power target (none: as before). */
  nextBy: z.enum(["boost", "power"], { error: "Step by boost or power" }).optional(),
});

/** "Copy as next power step": a new build from this one with a new power target (the build's own terms). */
export const NextPowerStepSchema = z.object(
  {
    buildId: z.uuid("Unknown build"),
    powerKw: number("New power target", 1, 5000, "kW"),
    pullId: z.uuid("Unknown pull").optional(),
  },
  { error: "Send { powerKw }" },
);
