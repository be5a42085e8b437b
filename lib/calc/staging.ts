// Reference: docs/calculations.md §4.4.
import { CalcInputError, requireRange } from "./_lib/input-error";
import { ATMOSPHERE_KPA } from "./constants";
import { railPressureKpa, type RegulatorType } from "./injectors";
import { pumpMarginPct, pumpSupplyFunction, type Pump } from "./pumps";

/**
 * Fuel demand at a boost below full boost: demand at full boost scaled by the manifold's
 * absolute pressure, (ambient + boost) ÷ (ambient + full boost) — air, hence fuel, in
 * proportion to manifold density at the same speed and temperature (common practice, no source).
 * @example demandAtBoostLPerH({ demandAtFullBoostLPerH: 300, boostKpa: 50, maxBoostKpa: 150, ambientKpaAbs: 100 }) // 180
 */
export function demandAtBoostLPerH(q: {
  demandAtFullBoostLPerH: number;
  boostKpa: number;
  maxBoostKpa: number;
  ambientKpaAbs?: number;
}): number {
  requireRange("demandAtFullBoostLPerH", q.demandAtFullBoostLPerH, 0, 1e6, "Fuel demand");
  const max = requireRange("maxBoostKpa", q.maxBoostKpa, 0, 1e4, "Boost");
  const b = requireRange("boostKpa", q.boostKpa, 0, max, "Boost");
  const amb = requireRange(
    "ambientKpaAbs",
    q.ambientKpaAbs ?? ATMOSPHERE_KPA,
    10,
    200,
    "Ambient pressure",
  );
  return (q.demandAtFullBoostLPerH * (amb + b)) / (amb + max);
}

/** One point of pump supply against demand over the boost range. */
export interface SupplyPoint {
  boostKpa: number;
  /** Pressure the pumps work against there: rail + the full-load filter and feed-line losses. */
  outletKpa: number;
  supplyLPerH: number;
  demandLPerH: number;
  marginPct: number;
  /** Pumps running (a staged pump counts from its switch-on boost). */
  pumpsOn: number;
}

/**
 * Supply against demand from no boost to full boost, for a chart and for the worst margin:
 * an even grid of points plus, at each stage's switch-on boost, the point just before it
 * switches on and the point after (the supply steps there). The pumps work against the rail at
 * each boost plus `lossesKpa` (the losses at full load, the largest flow: conservative below).
 * @example supplyAgainstBoost({ pumps, voltage: 13, regulator: { type: "boost-referenced", basePressureKpa: 400 }, maxBoostKpa: 150, demandAtFullBoostLPerH: 350, lossesKpa: 20 })[0].boostKpa // 0
 */
export function supplyAgainstBoost(q: {
  pumps: readonly Pump[];
  voltage: number;
  regulator: { type: RegulatorType; basePressureKpa: number; risingRateRatio?: number };
  maxBoostKpa: number;
  ambientKpaAbs?: number;
  demandAtFullBoostLPerH: number;
  lossesKpa: number;
  points?: number;
  /** The pumps already prepared (`pumpSupplyFunction(pumps)`), to save preparing them again. */
  supplyAt?: ReturnType<typeof pumpSupplyFunction>;
}): SupplyPoint[] {
  const max = requireRange("maxBoostKpa", q.maxBoostKpa, 0, 1e4, "Boost");
  requireRange("voltage", q.voltage, 0, 60, "Pump voltage");
  requireRange("lossesKpa", q.lossesKpa, 0, 1e9, "Filter and line losses");
  if (!Array.isArray(q.pumps) || q.pumps.length === 0)
    throw new CalcInputError("pumps", "Add at least one fuel pump");
  const supplyAt = q.supplyAt ?? pumpSupplyFunction(q.pumps);
  const n = max === 0 ? 1 : Math.round(requireRange("points", q.points ?? 11, 2, 200, "Points"));
  // Each boost once, with "just before a stage" as the same boost with that stage still off.
  const at: { boost: number; before: boolean }[] = [];
  for (let i = 0; i < n; i++)
    at.push({ boost: n === 1 ? 0 : i === n - 1 ? max : (max * i) / (n - 1), before: false });
  for (const p of q.pumps) {
    const s = p.switchOnBoostKpa;
    if (s !== undefined && s > 0 && s <= max) {
      at.push({ boost: s, before: true });
      if (!at.some((x) => x.boost === s && !x.before)) at.push({ boost: s, before: false });
    }
  }
  at.sort((a, b) => a.boost - b.boost || (a.before ? -1 : 0) - (b.before ? -1 : 0));
  return at.map(({ boost, before }) => {
    const rail = railPressureKpa({
      type: q.regulator.type,
      basePressureKpa: q.regulator.basePressureKpa,
      manifoldKpa: boost,
      risingRateRatio: q.regulator.risingRateRatio,
    });
    const outletKpa = rail + q.lossesKpa;
    // Just before a switch-on boost the stage is still off: evaluate a hair below it.
    const s = supplyAt(outletKpa, q.voltage, before ? boost - 1e-9 : boost);
    const demandLPerH = demandAtBoostLPerH({
      demandAtFullBoostLPerH: q.demandAtFullBoostLPerH,
      boostKpa: boost,
      maxBoostKpa: max,
      ambientKpaAbs: q.ambientKpaAbs,
    });
    return {
      boostKpa: boost,
      outletKpa,
      supplyLPerH: s.flowLPerH,
      demandLPerH,
      marginPct: pumpMarginPct(s.flowLPerH, demandLPerH),
      pumpsOn: s.pumpsOn ?? 0,
    };
  });
}
