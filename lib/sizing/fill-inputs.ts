import type { ShopSizingColumns } from "@/db/schema/shops";
import type { DRIVE_TYPES } from "@/lib/calc/input-codes";
import { DEFAULT_BSFC } from "@/lib/calc/power";
import type { FuelSystemInput } from "@/lib/calc/schema";
import { DEFAULT_DRIVETRAIN_LOSS_PCT, DEFAULT_LIMITS } from "@/lib/calc/sizing/context";

/**
 * What a shop's settings give the sizing: the one place where shop settings and a build's own
 * inputs become what lib/calc is given. Pure (no database, no clock, no schema library): the
 * browser's live results and quick tools, the server's save, the API, the kit, the spec sheet and
 * the dyno comparison all call `effectiveInputs`. Precedence, field by field: a value the build
 * states > the shop's setting > the library's default. The settings' schema and the validated
 * variant live in `effective-inputs.ts`, which re-exports all of this.
 */

export type DriveType = (typeof DRIVE_TYPES)[number];
/** The drive type assumed when a build names none. */
export const DEFAULT_DRIVE_TYPE: DriveType = "manual";

/**
 * The sizing part of a shop's settings, in canonical units. A revision keeps a copy of it
 * (`sizing_settings`), so its figures can always be worked out again as they were.
 * (`effective-inputs.ts#SizingSettingsSchema` validates it; a type test keeps the two equal.)
 */
export interface SizingSettings {
  limits: {
    designDutyPct: number;
    dutyCautionPct: number;
    dutyDangerPct: number;
    minPumpMarginPct: number;
    maxLineDropKpa: number;
  };
  /** Rule-of-thumb BSFC anchors, g/kWh, with the lambdas they are stated at. */
  bsfc: {
    gasolineNaGPerKwh: number;
    gasolineBoostedGPerKwh: number;
    e85NaGPerKwh: number;
    e85BoostedGPerKwh: number;
    referenceLambdaNa: number;
    referenceLambdaBoosted: number;
  };
  /** Drivetrain loss by drive type, % of crank power. */
  drivetrainLossPct: { manual: number; automatic: number; awd: number };
  /** Fuel component properties the shop overrides; a property left out is the library's. */
  fuel: { gasoline: FuelOverride; ethanol: FuelOverride };
}
interface FuelOverride {
  densityKgPerL?: number;
  stoichAfr?: number;
}

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

/**
 * The shop settings columns the sizing reads: the settings row's own type, picked by
 * `db/schema/shops.ts#SHOP_SIZING_COLUMNS` (a type only: nothing of the schema reaches a page).
 */
export type { ShopSizingColumns };

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
