import { z } from "zod";

import {
  FuelSystemInputSchema,
  type FuelSystemInput,
  type ParsedFuelSystemInput,
} from "@/lib/calc";

import { effectiveInputs, LIBRARY_SIZING_SETTINGS, type SizingSettings } from "./fill-inputs";

// The pure part (no schema library): what the browser's live results and quick tools import.
export * from "./fill-inputs";

const pct = z.number().finite();
const props = z.object({
  densityKgPerL: z.number().finite().optional(),
  stoichAfr: z.number().finite().optional(),
});

/**
 * The sizing part of a shop's settings, in canonical units. A revision keeps a copy of it
 * (`sizing_settings`), so its figures can always be worked out again as they were.
 */
export const SizingSettingsSchema = z.object({
  limits: z.object({
    designDutyPct: pct,
    dutyCautionPct: pct,
    dutyDangerPct: pct,
    minPumpMarginPct: pct,
    maxLineDropKpa: pct,
  }),
  /** Rule-of-thumb BSFC anchors, g/kWh, with the lambdas they are stated at. */
  bsfc: z.object({
    gasolineNaGPerKwh: pct,
    gasolineBoostedGPerKwh: pct,
    e85NaGPerKwh: pct,
    e85BoostedGPerKwh: pct,
    referenceLambdaNa: pct,
    referenceLambdaBoosted: pct,
  }),
  /** Drivetrain loss by drive type, % of crank power. */
  drivetrainLossPct: z.object({ manual: pct, automatic: pct, awd: pct }),
  /** Fuel component properties the shop overrides; a property left out is the library's. */
  fuel: z.object({ gasoline: props, ethanol: props }),
});
// The schema and the hand-written type say the same, both ways.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const sameSettings: Same<z.infer<typeof SizingSettingsSchema>, SizingSettings> = true;
void sameSettings;

/** `effectiveInputs`, validated: what sizeParsedFuelSystem takes (throws ZodError on bad input). */
export function parsedEffectiveInputs(
  settings: SizingSettings,
  build: FuelSystemInput,
): ParsedFuelSystemInput {
  return FuelSystemInputSchema.parse(effectiveInputs(settings, build));
}

/** A stored snapshot read back; none (sized before shop settings reached the sizing) is the library's. */
export function readSizingSettings(stored: unknown): SizingSettings {
  if (stored === null || stored === undefined) return LIBRARY_SIZING_SETTINGS;
  return SizingSettingsSchema.parse(stored);
}
