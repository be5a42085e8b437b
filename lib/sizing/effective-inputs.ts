import { z } from "zod";

import {
  DEFAULT_BSFC,
  DEFAULT_DRIVETRAIN_LOSS_PCT,
  DEFAULT_LIMITS,
  DRIVE_TYPES,
  FuelSystemInputSchema,
  type FuelSystemInput,
  type ParsedFuelSystemInput,
} from "@/lib/calc";

/**
 * What a shop's settings give the sizing: the one place where shop settings and a build's own
 * inputs become what lib/calc is given. Pure (no database, no clock): the browser's live results,
 * the server's save, the API, the kit, the spec sheet and the dyno comparison all call
 * `effectiveInputs`. Precedence, field by field: a value the build states > the shop's setting >
 * the library's default.
 */

export type DriveType = (typeof DRIVE_TYPES)[number];
/** The drive type assumed when a build names none. */
export const DEFAULT_DRIVE_TYPE: DriveType = "manual";

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
export type SizingSettings = z.infer<typeof SizingSettingsSchema>;

/**
 * The library's own defaults: what every build was sized with before shop settings reached the
 * sizing (a revision with no `sizing_settings` reads as this).
 */
export const LIBRARY_SIZING_SETTINGS: SizingSettings = {
  limits: { ...DEFAULT_LIMITS },
  bsfc: { ...DEFAULT_BSFC },
  drivetrainLossPct: {
    manual: DEFAULT_DRIVETRAIN_LOSS_PCT,
    automatic: DEFAULT_DRIVETRAIN_LOSS_PCT,
    awd: DEFAULT_DRIVETRAIN_LOSS_PCT,
  },
  fuel: { gasoline: {}, ethanol: {} },
};

/** The shop settings columns the sizing reads (db/schema/shops.ts#shopSettings). */
export interface ShopSizingColumns {
  designDutyPct: number;
  dutyCautionPct: number;
  dutyDangerPct: number;
  minPumpMarginPct: number;
  maxLineDropKpa: number;
  bsfcGasolineNa: number;
  bsfcGasolineBoosted: number;
  bsfcE85Na: number;
  bsfcE85Boosted: number;
  lossManualPct: number;
  lossAutomaticPct: number;
  lossAwdPct: number;
  gasolineDensityKgPerL: number | null;
  gasolineStoichAfr: number | null;
  ethanolDensityKgPerL: number | null;
  ethanolStoichAfr: number | null;
}

const given = <T extends Record<string, number | null | undefined>>(o: T) =>
  Object.fromEntries(Object.entries(o).filter(([, v]) => v !== null && v !== undefined)) as {
    [K in keyof T]?: number;
  };

/** A shop's settings row → the settings the sizing uses. */
export function sizingSettingsOf(s: ShopSizingColumns): SizingSettings {
  return {
    limits: {
      designDutyPct: s.designDutyPct,
      dutyCautionPct: s.dutyCautionPct,
      dutyDangerPct: s.dutyDangerPct,
      minPumpMarginPct: s.minPumpMarginPct,
      maxLineDropKpa: s.maxLineDropKpa,
    },
    bsfc: {
      gasolineNaGPerKwh: s.bsfcGasolineNa,
      gasolineBoostedGPerKwh: s.bsfcGasolineBoosted,
      e85NaGPerKwh: s.bsfcE85Na,
      e85BoostedGPerKwh: s.bsfcE85Boosted,
      referenceLambdaNa: DEFAULT_BSFC.referenceLambdaNa,
      referenceLambdaBoosted: DEFAULT_BSFC.referenceLambdaBoosted,
    },
    drivetrainLossPct: {
      manual: s.lossManualPct,
      automatic: s.lossAutomaticPct,
      awd: s.lossAwdPct,
    },
    fuel: {
      gasoline: given({ densityKgPerL: s.gasolineDensityKgPerL, stoichAfr: s.gasolineStoichAfr }),
      ethanol: given({ densityKgPerL: s.ethanolDensityKgPerL, stoichAfr: s.ethanolStoichAfr }),
    },
  };
}

/**
 * The inputs lib/calc sizes: the build's own inputs with every value it leaves out taken from
 * the shop's settings — limits (design duty, caution and danger bands, minimum pump margin,
 * line-drop limit), BSFC rules of thumb, drivetrain loss for the build's drive type (manual when
 * it names none) and fuel component properties. Whatever the build states wins; what neither
 * gives, lib/calc's defaults fill in. A typed BSFC (or the shop's measured one the tuner chose,
 * which the editor writes into the build) is the build's and wins over the rule of thumb.
 *
 * @example effectiveInputs(shop, build).limits?.designDutyPct // 75 when the shop says 75 and the build says nothing
 */
/** The parts of a build the shop's settings speak for (a quick tool passes only these). */
export type SettingsBearingInputs = Pick<FuelSystemInput, "target" | "fuel" | "limits">;

export function effectiveInputs<B extends SettingsBearingInputs>(
  settings: SizingSettings,
  build: B,
): B {
  const driveType = build.target.driveType ?? DEFAULT_DRIVE_TYPE;
  const own = build.fuel.properties;
  const gasoline = { ...settings.fuel.gasoline, ...given({ ...own?.gasoline }) };
  const ethanol = { ...settings.fuel.ethanol, ...given({ ...own?.ethanol }) };
  const properties = {
    ...(Object.keys(gasoline).length ? { gasoline } : {}),
    ...(Object.keys(ethanol).length ? { ethanol } : {}),
  };
  return {
    ...build,
    target: {
      ...build.target,
      driveType,
      drivetrainLossPct: build.target.drivetrainLossPct ?? settings.drivetrainLossPct[driveType],
    },
    fuel: {
      ...build.fuel,
      bsfcDefaults: build.fuel.bsfcDefaults ?? { ...settings.bsfc },
      ...(Object.keys(properties).length ? { properties } : {}),
    },
    limits: { ...settings.limits, ...given({ ...build.limits }) },
  };
}

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
