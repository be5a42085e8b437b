import { fuelBlend } from "@/lib/calc/fuel";
import {
  injectorDutyPct,
  injectorFlowAtPressure,
  requiredInjectorFlowCcPerMin,
} from "@/lib/calc/injectors";
import { crankPowerFromWheel, defaultBsfc } from "@/lib/calc/power";
import type { FuelSystemInput } from "@/lib/calc/schema";
import { DEFAULT_LIMITS } from "@/lib/calc/sizing/context";

// The browser runs this: the narrow modules, not the barrel or the settings' schema.
import { effectiveInputs, type DriveType, type SizingSettings } from "./fill-inputs";

/**
 * The quick injector check of the tools page (pure: the browser runs it as the user types). A
 * boosted engine on a boost-referenced regulator, so the pressure across the injectors is the
 * base pressure. Its inputs go through `effectiveInputs` like a build's: the shop's design duty
 * and duty bands, drivetrain loss for the drive type, BSFC rules of thumb and fuel properties,
 * unless the user gives a drivetrain loss of their own. All figures canonical (kW, kPa, cc/min).
 */
export interface QuickCheckInput {
  wheelPowerKw: number;
  driveType: DriveType;
  /** Left out: the shop's loss for the drive type. */
  drivetrainLossPct?: number;
  /** The richest blend the engine sees, % ethanol by volume. */
  ethanolVolPct: number;
  injectorCount: number;
  ratedFlowCcPerMin: number;
  ratedPressureKpa: number;
  basePressureKpa: number;
}

export interface QuickCheckResult {
  /** What was used (from the user, else the shop's settings, else the library's). */
  drivetrainLossPct: number;
  designDutyPct: number;
  dutyCautionPct: number;
  dutyDangerPct: number;
  bsfcGPerKwh: number;
  /** Duty at the target power, %. */
  dutyPct: number;
  level: "ok" | "caution" | "danger";
  /** The smallest injector rating (at `ratedPressureKpa`) that meets the design duty, cc/min. */
  smallestRatingCcPerMin: number;
  /** Wheel power these injectors carry at the design duty, kW. */
  ceilingWheelKw: number;
}

/** The settings-bearing part of a build for the quick check: what `effectiveInputs` fills in. */
export function quickCheckInputs(q: QuickCheckInput) {
  const build: Pick<FuelSystemInput, "target" | "fuel" | "limits"> = {
    target: {
      powerKw: q.wheelPowerKw,
      measuredAt: "wheel",
      driveType: q.driveType,
      ...(q.drivetrainLossPct === undefined ? {} : { drivetrainLossPct: q.drivetrainLossPct }),
    },
    fuel: { ethanolMinVolPct: q.ethanolVolPct, ethanolMaxVolPct: q.ethanolVolPct },
  };
  return build;
}

export function quickInjectorCheck(settings: SizingSettings, q: QuickCheckInput): QuickCheckResult {
  const eff = effectiveInputs(settings, quickCheckInputs(q));
  const limits = { ...DEFAULT_LIMITS, ...eff.limits };
  const loss = eff.target.drivetrainLossPct!;
  const crankKw = crankPowerFromWheel({ wheelPowerKw: q.wheelPowerKw, drivetrainLossPct: loss });
  const bsfc = defaultBsfc({
    ethanolVolPct: q.ethanolVolPct,
    aspiration: "turbo",
    defaults: eff.fuel.bsfcDefaults,
  }).bsfcGPerKwh;
  const density = fuelBlend(q.ethanolVolPct, eff.fuel.properties).densityKgPerL;
  const mdot = (crankKw * bsfc) / 60;
  const atBase = injectorFlowAtPressure({
    ratedFlowCcPerMin: q.ratedFlowCcPerMin,
    ratedPressureKpa: q.ratedPressureKpa,
    differentialPressureKpa: q.basePressureKpa,
  });
  const dutyPct = injectorDutyPct({
    fuelMassFlowGPerMin: mdot,
    densityKgPerL: density,
    injectorCount: q.injectorCount,
    flowAtOperatingCcPerMin: atBase,
  });
  const needAtBase = requiredInjectorFlowCcPerMin({
    fuelMassFlowGPerMin: mdot,
    densityKgPerL: density,
    injectorCount: q.injectorCount,
    designDutyPct: limits.designDutyPct,
  });
  const ceilingCrankKw =
    ((limits.designDutyPct / 100) * q.injectorCount * atBase * density * 60) / bsfc;
  return {
    drivetrainLossPct: loss,
    designDutyPct: limits.designDutyPct,
    dutyCautionPct: limits.dutyCautionPct,
    dutyDangerPct: limits.dutyDangerPct,
    bsfcGPerKwh: bsfc,
    dutyPct,
    level:
      dutyPct > limits.dutyDangerPct
        ? "danger"
        : dutyPct > limits.dutyCautionPct
          ? "caution"
          : "ok",
    smallestRatingCcPerMin: needAtBase * Math.sqrt(q.ratedPressureKpa / q.basePressureKpa),
    ceilingWheelKw: ceilingCrankKw * (1 - loss / 100),
  };
}
