// Reference: docs/calculations.md §3.8.
import { requireRange } from "./_lib/input-error";
import { injectorDifferentialPressureKpa, railPressureKpa, type RegulatorType } from "./injectors";

/** One point of the fuel pressure against boost (all kPa gauge). */
export interface BoostPressurePoint {
  /** Manifold pressure (gauge): the boost. */
  boostKpa: number;
  /** Rail pressure the regulator holds there. */
  railKpa: number;
  /** Pressure across the injector: rail − manifold. */
  differentialKpa: number;
}

/**
 * Rail pressure and the pressure across the injector over the boost range 0…max boost, for a
 * chart: a boost-referenced regulator (1:1, or rising-rate 1:r) or a fixed one. With no boost,
 * one point at 0.
 * @example fuelPressureAgainstBoost({ type: "boost-referenced", basePressureKpa: 300, risingRateRatio: 4, maxBoostKpa: 100, points: 2 }) // [{ boostKpa: 0, railKpa: 300, differentialKpa: 300 }, { boostKpa: 100, railKpa: 700, differentialKpa: 600 }]
 */
export function fuelPressureAgainstBoost(q: {
  type: RegulatorType;
  basePressureKpa: number;
  risingRateRatio?: number;
  maxBoostKpa: number;
  points?: number;
}): BoostPressurePoint[] {
  const top = requireRange("maxBoostKpa", q.maxBoostKpa, 0, 1e4, "Boost");
  const count =
    top === 0 ? 1 : Math.round(requireRange("points", q.points ?? 11, 2, 200, "Points"));
  const out: BoostPressurePoint[] = [];
  for (let i = 0; i < count; i++) {
    const boostKpa = count === 1 ? 0 : i === count - 1 ? top : (top * i) / (count - 1);
    const r = {
      type: q.type,
      basePressureKpa: q.basePressureKpa,
      manifoldKpa: boostKpa,
      risingRateRatio: q.risingRateRatio,
    };
    out.push({
      boostKpa,
      railKpa: railPressureKpa(r),
      differentialKpa: injectorDifferentialPressureKpa(r),
    });
  }
  return out;
}

/**
 * What a regulator's bypass (return) valve passes at a rail pressure, from its rating (a flow at
 * a pressure), by the orifice law Q = Q_rated · √(p / p_rated) (§3.1 applied to the open valve).
 * docs/calculations.md §3.9.
 * @example regulatorBypassCapacityLPerH({ ratedFlowLPerH: 400, ratedPressureKpa: 300, railPressureKpa: 240 }) // 357.8
 */
export function regulatorBypassCapacityLPerH(q: {
  ratedFlowLPerH: number;
  ratedPressureKpa: number;
  railPressureKpa: number;
}): number {
  requireRange("ratedFlowLPerH", q.ratedFlowLPerH, 0, 1e5, "Bypass flow");
  requireRange("ratedPressureKpa", q.ratedPressureKpa, 1, 1e4, "Pressure of the bypass rating");
  requireRange("railPressureKpa", q.railPressureKpa, 0, 1e4, "Rail pressure");
  return q.ratedFlowLPerH * Math.sqrt(q.railPressureKpa / q.ratedPressureKpa);
}
