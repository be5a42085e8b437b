// Reference: docs/calculations.md §7.4.
import { fuelBlend } from "./fuel";
import {
  injectorDifferentialPressureKpa,
  injectorDutyPct,
  injectorFlowAtPressure,
  railPressureKpa,
} from "./injectors";
import { defaultBsfc, fuelMassFlowGPerMin } from "./power";
import { pumpSupplyFunction } from "./pumps";
import { formatValue, toShown, unitOf } from "./quantities";
import type { ParsedFuelSystemInput } from "./schema";
import { sizeParsedFuelSystem, type FuelSystemResult } from "./size";
import type { UnitSystem } from "./units";

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

/** One axis of a chart as the reader sees it: unit, range and tick values, in the reader's units. */
export interface ChartAxis {
  /** What the axis measures, lower case ("boost", "fuel pressure"). */
  label: string;
  /** The unit of its ticks in the reader's system ("psi", "L/h"), from the quantities registry. */
  unit: string;
  min: number;
  max: number;
  ticks: number[];
  /** Decimals the ticks are printed with (the tick step's). */
  decimals: number;
}

/** A chart's data, in the reader's units: one row per x, one column per line. */
export interface BoostChart {
  title: string;
  /** One sentence, no full stop, saying what the chart shows (screen readers; the PDF's note). */
  summary: string;
  x: ChartAxis;
  y: ChartAxis;
  /** The lines in legend order; `key` names a column of `rows`. */
  lines: { key: string; label: string; dashed: boolean }[];
  rows: ({ x: number } & Record<string, number>)[];
  /** A boost marked with a vertical line (the least pump margin), or none. */
  marker: { x: number; label: string } | null;
  /** Fewer than two points (no boost range, or nothing to draw): say `summary` instead. */
  drawable: boolean;
}

const NICE_STEPS = [1, 2, 2.5, 5, 10];

/**
 * Round tick values for an axis from `min` to `max` (about `count` of them): steps of 1, 2, 2.5
 * or 5 × 10ⁿ, the first at or above `min`, the last at or below `max` (or past it, to the next
 * step, with `extend`). An empty or reversed range (all values 0) gives the ticks of 0…1, and a
 * value that is no finite number is read as 0: never NaN.
 * @example niceTicks(0, 43.5) // { ticks: [0, 20, 40], step: 20, decimals: 0 }
 */
export function niceTicks(min: number, max: number, count = 5, extend = false) {
  let lo = Number.isFinite(min) ? min : 0;
  let hi = Number.isFinite(max) ? max : 0;
  if (!(hi > lo)) [lo, hi] = [Math.min(lo, hi), Math.min(lo, hi) + 1];
  const raw = (hi - lo) / (Math.max(2, Math.min(20, Math.floor(count) || 5)) - 1);
  let mag = 10 ** Math.floor(Math.log10(raw));
  let f = NICE_STEPS.find((s) => s * mag >= raw * (1 - 1e-9))!;
  if (f === 10) [mag, f] = [mag * 10, 1];
  const step = f * mag;
  const decimals = Math.max(0, -Math.floor(Math.log10(mag) + 1e-9) + (f === 2.5 ? 1 : 0));
  const first = Math.ceil(lo / step - 1e-9);
  const last = extend ? Math.ceil(hi / step - 1e-9) : Math.floor(hi / step + 1e-9);
  const ticks: number[] = [];
  for (let i = first; i <= last; i++) ticks.push(+(i * step).toFixed(decimals));
  return { ticks, step, decimals };
}

/** An axis from 0 to the largest value (`extend`: up to the next round tick). */
function axisTo(label: string, unit: string, values: number[], extend: boolean): ChartAxis {
  const top = Math.max(0, ...values.filter(Number.isFinite));
  const t = niceTicks(0, top, 5, extend);
  return {
    label,
    unit,
    min: 0,
    max: extend ? t.ticks[t.ticks.length - 1]! : top > 0 ? top : t.ticks[t.ticks.length - 1]!,
    ticks: t.ticks,
    decimals: t.decimals,
  };
}

/** Rows whose every figure is a finite number (a stored result read back never draws NaN). */
const finiteRows = <R extends Record<string, number>>(rows: R[]) =>
  rows.filter((r) => Object.values(r).every(Number.isFinite));

/**
 * "Fuel pressure against boost" (docs/calculations.md §3.8) in the reader's units: rail, manifold
 * and the pressure across the injector from no boost to full boost, from the sizing's own series
 * (`result.regulator.pressureVsBoost`), for the build sheet and the spec sheet alike.
 * @example fuelPressureChart(result, "imperial").y.unit // "psi"
 */
export function fuelPressureChart(result: FuelSystemResult, units: UnitSystem): BoostChart {
  const P = (kpa: number) => toShown("pressure", kpa, units);
  const pu = unitOf("pressure", units);
  const points = result.regulator.pressureVsBoost ?? [];
  const rows = finiteRows(
    points.map((p) => ({
      x: P(p.boostKpa),
      rail: P(p.railKpa),
      manifold: P(p.boostKpa),
      across: P(p.differentialKpa),
    })),
  );
  const top = points.at(-1);
  const regulator =
    result.regulator.type === "fixed"
      ? "fixed regulator"
      : result.regulator.risingRateRatio === 1
        ? "1:1 boost-referenced regulator"
        : `rising-rate regulator ${formatValue("risingRate", result.regulator.risingRateRatio, units)}`;
  const summary = !top
    ? "No fuel pressure worked out for this build"
    : rows.length < 2
      ? `No boost range: with a ${regulator} the rail holds ${formatValue("pressure", top.railKpa, units)} and the injectors see ${formatValue("pressure", top.differentialKpa, units)} across them`
      : `With a ${regulator}, at ${formatValue("pressure", top.boostKpa, units)} boost the rail holds ${formatValue("pressure", top.railKpa, units)} and the injectors see ${formatValue("pressure", top.differentialKpa, units)} across them`;
  return {
    title: "Fuel pressure against boost",
    summary,
    x: axisTo(
      "boost",
      pu,
      rows.map((r) => r.x),
      false,
    ),
    y: axisTo(
      "fuel pressure",
      pu,
      rows.flatMap((r) => [r.rail, r.across, r.manifold]),
      true,
    ),
    lines: [
      { key: "rail", label: "rail", dashed: false },
      { key: "across", label: "across the injector", dashed: false },
      { key: "manifold", label: "manifold", dashed: true },
    ],
    rows,
    marker: null,
    drawable: rows.length > 1,
  };
}

/**
 * "Pump supply and demand against boost" (docs/calculations.md §4.4) in the reader's units: what
 * the pumps running at each boost supply against the engine's demand there (staged pumps step up
 * at their switch-on boost), from the sizing's own series (`result.pump.supplyVsBoost`), with the
 * boost of the least margin marked; for the build sheet and the spec sheet alike.
 * @example pumpBoostChart(result, "metric").y.unit // "L/h"
 */
export function pumpBoostChart(result: FuelSystemResult, units: UnitSystem): BoostChart {
  const P = (kpa: number) => toShown("pressure", kpa, units);
  const F = (lph: number) => toShown("volumeFlow", lph, units);
  const points = result.pump.supplyVsBoost ?? [];
  const rows = finiteRows(
    points.map((p) => ({ x: P(p.boostKpa), supply: F(p.supplyLPerH), demand: F(p.demandLPerH) })),
  );
  const margin = formatValue("percent", result.pump.marginPct, units, 0);
  const summary =
    rows.length === 0
      ? "No pump supply worked out for this build"
      : rows.length < 2
        ? `No boost range: the pumps supply ${formatValue("volumeFlow", result.pump.supplyLPerH, units)} against a demand of ${formatValue("volumeFlow", result.pump.demandLPerH, units)} (margin ${margin})`
        : `The pump margin is at its lowest, ${margin}, at ${formatValue("pressure", result.pump.worstMarginBoostKpa, units)} boost`;
  return {
    title: "Pump supply and demand against boost",
    summary,
    x: axisTo(
      "boost",
      unitOf("pressure", units),
      rows.map((r) => r.x),
      false,
    ),
    y: axisTo(
      "fuel flow",
      unitOf("volumeFlow", units),
      rows.flatMap((r) => [r.supply, r.demand]),
      true,
    ),
    lines: [
      { key: "supply", label: "supply", dashed: false },
      { key: "demand", label: "demand", dashed: true },
    ],
    rows,
    marker:
      rows.length > 1 && Number.isFinite(result.pump.worstMarginBoostKpa)
        ? { x: P(result.pump.worstMarginBoostKpa), label: "least margin" }
        : null,
    drawable: rows.length > 1,
  };
}
