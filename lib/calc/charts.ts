// Reference: docs/calculations.md §7.
import { fuelBlend } from "./fuel";
import {
  injectorDifferentialPressureKpa,
  injectorDutyPct,
  injectorFlowAtPressure,
  railPressureKpa,
} from "./injectors";
import { defaultBsfc, fuelMassFlowGPerMin } from "./power";
import { pumpSupplyFunction } from "./pumps";
import type { ParsedFuelSystemInput } from "./schema";
import { sizeParsedFuelSystem, type FuelSystemResult } from "./size";

/**
 * Duty across engine speed at the target, for a chart. Assumes the fuel per cycle that the
 * target needs at redline holds from mid-range up (a flat-torque engine), so duty rises in
 * proportion to rpm; below, it is the same line. The assumption is printed with the chart.
 * @example dutyAcrossRpm(result, 1000, 7000, 7)[6].dutyPctRich // = result.injector.dutyPct
 */
export function dutyAcrossRpm(
  result: FuelSystemResult,
  fromRpm: number,
  toRpm: number,
  points = 25,
) {
  const redline = result.blend.rich.pulseWidthRedline.rpm;
  const out: { rpm: number; dutyPctLean: number; dutyPctRich: number }[] = [];
  const count = Math.max(2, Math.min(200, Math.floor(points)));
  for (let i = 0; i < count; i++) {
    const rpm = fromRpm + ((toRpm - fromRpm) * i) / (count - 1);
    const k = rpm / redline;
    out.push({
      rpm,
      dutyPctLean: result.blend.lean.dutyPct * k,
      dutyPctRich: result.blend.rich.dutyPct * k,
    });
  }
  return out;
}

/**
 * Duty at the target across ethanol content E0…E100 (with the build's BSFC rule), for a chart.
 * @example dutyAcrossEthanol(input, 11).map((p) => p.ethanolVolPct) // [0, 10, …, 100]
 */
export function dutyAcrossEthanol(input: ParsedFuelSystemInput, crankPowerKw: number, points = 11) {
  const dp = injectorDifferentialPressureKpa({
    type: input.regulator.type,
    basePressureKpa: input.regulator.basePressureKpa,
    manifoldKpa: input.engine.maxBoostKpa,
    risingRateRatio: input.regulator.risingRateRatio,
  });
  const q = injectorFlowAtPressure({
    ratedFlowCcPerMin: input.injectors.ratedFlowCcPerMin,
    ratedPressureKpa: input.injectors.ratedPressureKpa,
    differentialPressureKpa: dp,
  });
  const out: { ethanolVolPct: number; dutyPct: number }[] = [];
  const count = Math.max(2, Math.min(101, Math.floor(points)));
  for (let i = 0; i < count; i++) {
    const e = (100 * i) / (count - 1);
    const b = fuelBlend(e, input.fuel.properties);
    const bsfc =
      input.fuel.bsfcGPerKwh ??
      defaultBsfc({
        ethanolVolPct: e,
        aspiration: input.engine.aspiration,
        targetLambda: input.fuel.targetLambda,
        defaults: input.fuel.bsfcDefaults,
      }).bsfcGPerKwh;
    const mdot = fuelMassFlowGPerMin({ powerKw: crankPowerKw, bsfcGPerKwh: bsfc });
    out.push({
      ethanolVolPct: e,
      dutyPct: injectorDutyPct({
        fuelMassFlowGPerMin: mdot,
        densityKgPerL: b.densityKgPerL,
        injectorCount: input.injectors.count,
        flowAtOperatingCcPerMin: q,
      }),
    });
  }
  return out;
}

/**
 * Pump supply against outlet pressure, with the engine's demand and working pressure marked.
 * @example pumpSupplyCurve(input, result)[0] // { pressureKpa: 0, supplyLPerH: …, demandLPerH: … }
 */
export function pumpSupplyCurve(
  input: ParsedFuelSystemInput,
  result: FuelSystemResult,
  points = 25,
) {
  const top = Math.max(
    result.pump.outletPressureKpa * 1.5,
    railPressureKpa({
      type: input.regulator.type,
      basePressureKpa: input.regulator.basePressureKpa,
      manifoldKpa: input.engine.maxBoostKpa,
      risingRateRatio: input.regulator.risingRateRatio,
    }) + 100,
  );
  const supplyAt = pumpSupplyFunction(input.pumps);
  const out: { pressureKpa: number; supplyLPerH: number; demandLPerH: number }[] = [];
  const count = Math.max(2, Math.min(200, Math.floor(points)));
  for (let i = 0; i < count; i++) {
    const p = (top * i) / (count - 1);
    out.push({
      pressureKpa: p,
      supplyLPerH: supplyAt(p, result.pump.voltageUsed, input.engine.maxBoostKpa).flowLPerH,
      demandLPerH: result.pump.demandLPerH,
    });
  }
  return out;
}

/** The sizing API's answer: the result and its three chart series (one function, so the benchmark's floor does the same work). */
export function sizingAnswer(input: ParsedFuelSystemInput) {
  const result = sizeParsedFuelSystem(input);
  return {
    result,
    charts: {
      dutyVsRpm: dutyAcrossRpm(result, input.engine.idleRpm, input.engine.redlineRpm),
      dutyVsEthanol: dutyAcrossEthanol(input, result.crankPowerKw),
      pumpSupply: pumpSupplyCurve(input, result),
    },
  };
}
