// Reference: docs/calculations.md §3.6, §3.7 (stage "idle" of §7).
import type { FuelBlend } from "../fuel";
import {
  gaugeFromAbsKpa,
  idleFuelPerCylinderMg,
  injectorDifferentialPressureKpa,
  injectorFlowAtPressure,
  injectorFlowForFuel,
  pulseWidthForFuelMs,
} from "../injectors";
import { RATING_FLUID } from "./blend-ends";
import type { SizingContext } from "./context";
import { commandedPulseSteps, type InjectorOperatingPoint } from "./injector-stage";
import type { BlendEnd } from "./result";

export interface IdleStage {
  /** Idle manifold pressure, kPa gauge (negative: vacuum). */
  manifoldGaugeKpa: number;
  dpIdle: number;
  fuelPerCylinderMg: number;
  airPerCylinderMg: number;
  fuelPerInjectionMg: number;
  effectiveMs: number;
  deadMs: number | null;
  /** Effective + dead time where the dead time is known (the minimum pulse is a commanded one). */
  commandedMs: number | null;
}

/**
 * Stage "idle": the least fuel is needed at the lowest ethanol content, λ 1; the pressure
 * across the injector at idle manifold pressure; the opening and commanded pulse.
 */
export function idleStage(
  ctx: SizingContext,
  op: InjectorOperatingPoint,
  lean: BlendEnd,
  leanProps: FuelBlend,
): IdleStage {
  const { input, t } = ctx;
  const { engine, injectors, regulator } = input;
  const manifoldGaugeKpa = gaugeFromAbsKpa(engine.idleManifoldKpaAbs, engine.ambientKpaAbs);
  const dpIdle = injectorDifferentialPressureKpa({
    type: regulator.type,
    basePressureKpa: regulator.basePressureKpa,
    manifoldKpa: manifoldGaugeKpa,
    risingRateRatio: regulator.risingRateRatio,
  });
  const idleFuel = idleFuelPerCylinderMg({
    displacementL: engine.displacementL,
    cylinders: engine.cylinders,
    volumetricEfficiency: engine.idleVolumetricEfficiency,
    manifoldKpaAbs: engine.idleManifoldKpaAbs,
    intakeTempC: engine.intakeTempC,
    stoichAfr: leanProps.stoichAfr,
  });
  const fuelPerInjectionMg = (idleFuel.fuelMg * engine.cylinders) / injectors.count;
  const qIdleRated = injectorFlowAtPressure({
    ratedFlowCcPerMin: injectors.ratedFlowCcPerMin,
    ratedPressureKpa: injectors.ratedPressureKpa,
    differentialPressureKpa: dpIdle,
  });
  const qIdle =
    injectors.ratingFluidDensityKgPerL === undefined
      ? qIdleRated
      : injectorFlowForFuel({
          flowCcPerMin: qIdleRated,
          ratingFluidDensityKgPerL: injectors.ratingFluidDensityKgPerL,
          fuelDensityKgPerL: leanProps.densityKgPerL,
        });
  const effectiveMs = t.add({
    id: "pulse-idle",
    label: "Effective pulse width at idle ({ethanol}, λ 1)",
    params: { ethanol: { value: lean.ethanolVolPct, quantity: "ethanol" } },
    formula: "fuel per injection ÷ (density × injector flow at idle pressure) × 60",
    formulaImperial:
      "fuel per injection ÷ (injector flow at idle pressure × density ÷ rating fluid density) × 514.3 (ms per gr at 1 lb/h)",
    inputs: [
      { label: "air per cylinder", value: idleFuel.airMg, quantity: "mass" },
      { label: "fuel per injection", value: fuelPerInjectionMg, quantity: "mass", decimals: 2 },
      { label: "density", value: leanProps.densityKgPerL, quantity: "density" },
      { label: "pressure across at idle", value: dpIdle, quantity: "pressure" },
      { label: "injector flow at idle", value: qIdle, quantity: "injectorFlow" },
      RATING_FLUID,
    ],
    value: pulseWidthForFuelMs({
      fuelMg: fuelPerInjectionMg,
      densityKgPerL: leanProps.densityKgPerL,
      flowCcPerMin: qIdle,
    }),
    quantity: "time",
  });
  const deadMs = op.dead(dpIdle);
  if (deadMs !== null)
    commandedPulseSteps(ctx, "idle", dpIdle, deadMs, effectiveMs, effectiveMs + deadMs);
  return {
    manifoldGaugeKpa,
    dpIdle,
    fuelPerCylinderMg: idleFuel.fuelMg,
    airPerCylinderMg: idleFuel.airMg,
    fuelPerInjectionMg,
    effectiveMs,
    deadMs,
    commandedMs: deadMs === null ? null : effectiveMs + deadMs,
  };
}
