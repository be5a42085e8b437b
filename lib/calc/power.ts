// Reference: docs/calculations.md §2.
import { requirePositive, requireRange } from "./_lib/input-error";
import { fuelBlend, type FuelProperties } from "./fuel";

/** g/kWh in one lb/(hp·h): 453.59237 g / 0.74569987 kWh = 608.277 (Heywood ch. 2; NIST SP 811 factors). */
export const G_PER_KWH_PER_LB_PER_HP_H = 453.59237 / 0.74569987158227022;

/**
 * Crank power from a power measured at the wheels, with the drivetrain loss as a percentage of
 * crank power: P_crank = P_wheel / (1 − loss).
 * @example crankPowerFromWheel({ wheelPowerKw: 300, drivetrainLossPct: 15 }) // 352.94…
 */
export function crankPowerFromWheel(q: {
  wheelPowerKw: number;
  drivetrainLossPct: number;
}): number {
  requireRange("wheelPowerKw", q.wheelPowerKw, 0, 1e5, "Wheel power");
  requireRange("drivetrainLossPct", q.drivetrainLossPct, 0, 60, "Drivetrain loss");
  return q.wheelPowerKw / (1 - q.drivetrainLossPct / 100);
}

/**
 * Wheel power from crank power, the inverse of crankPowerFromWheel: P_wheel = P_crank · (1 − loss).
 * @example wheelPowerFromCrank({ crankPowerKw: 400, drivetrainLossPct: 15 }) // 340
 */
export function wheelPowerFromCrank(q: {
  crankPowerKw: number;
  drivetrainLossPct: number;
}): number {
  requireRange("crankPowerKw", q.crankPowerKw, 0, 1e5, "Crank power");
  requireRange("drivetrainLossPct", q.drivetrainLossPct, 0, 60, "Drivetrain loss");
  return q.crankPowerKw * (1 - q.drivetrainLossPct / 100);
}

/**
 * Fuel volume flow in L/h from a mass flow in g/min: Q = ṁ / ρ × 0.06.
 * @example fuelVolumeFlowLPerH({ fuelMassFlowGPerMin: 1825, densityKgPerL: 0.745 }) // 146.98
 */
export function fuelVolumeFlowLPerH(q: {
  fuelMassFlowGPerMin: number;
  densityKgPerL: number;
}): number {
  requireRange("fuelMassFlowGPerMin", q.fuelMassFlowGPerMin, 0, 1e7, "Fuel mass flow");
  requireRange("densityKgPerL", q.densityKgPerL, 0.1, 2, "Fuel density");
  return (q.fuelMassFlowGPerMin / q.densityKgPerL) * 0.06;
}

/**
 * Fuel mass flow at a power: ṁ = P · BSFC.
 * @example fuelMassFlowGPerMin({ powerKw: 300, bsfcGPerKwh: 365 }) // 1825
 */
export function fuelMassFlowGPerMin(q: { powerKw: number; bsfcGPerKwh: number }): number {
  requireRange("powerKw", q.powerKw, 0, 1e5, "Power");
  requirePositive("bsfcGPerKwh", q.bsfcGPerKwh, 2000, "BSFC");
  return (q.powerKw * q.bsfcGPerKwh) / 60;
}

/** Rule-of-thumb BSFC anchors in g/kWh, with the lambda they are stated at. */
export interface BsfcDefaults {
  gasolineNaGPerKwh: number;
  gasolineBoostedGPerKwh: number;
  e85NaGPerKwh: number;
  e85BoostedGPerKwh: number;
  /** Lambda the anchors are stated at, naturally aspirated and boosted. */
  referenceLambdaNa: number;
  referenceLambdaBoosted: number;
}

/**
 * Common-practice rules of thumb, 0.50 / 0.60 / 0.70 / 0.80 lb/(hp·h), stated at λ 0.88 (NA)
 * and λ 0.80 (boosted) — the lambdas are our assumption, shown in every trace.
 */
export const DEFAULT_BSFC: BsfcDefaults = {
  gasolineNaGPerKwh: 0.5 * G_PER_KWH_PER_LB_PER_HP_H,
  gasolineBoostedGPerKwh: 0.6 * G_PER_KWH_PER_LB_PER_HP_H,
  e85NaGPerKwh: 0.7 * G_PER_KWH_PER_LB_PER_HP_H,
  e85BoostedGPerKwh: 0.8 * G_PER_KWH_PER_LB_PER_HP_H,
  referenceLambdaNa: 0.88,
  referenceLambdaBoosted: 0.8,
};

export type Aspiration = "na" | "turbo" | "supercharged";

export interface BsfcEstimate {
  bsfcGPerKwh: number;
  referenceLambda: number;
  /** BSFC at the reference lambda, before scaling to the target lambda. */
  atReferenceGPerKwh: number;
}

/**
 * Rule-of-thumb BSFC for a blend: the gasoline and E85 anchors for the aspiration, linear in
 * ethanol volume % (E85 = 85 %; the same line continues to E100), then scaled by λ_ref / λ
 * when a target lambda is given.
 * @example defaultBsfc({ ethanolVolPct: 85, aspiration: "turbo" }).bsfcGPerKwh // 486.6 (0.80 lb/(hp·h))
 */
export function defaultBsfc(q: {
  ethanolVolPct: number;
  aspiration: Aspiration;
  targetLambda?: number;
  defaults?: BsfcDefaults;
}): BsfcEstimate {
  requireRange("ethanolVolPct", q.ethanolVolPct, 0, 100, "Ethanol content");
  const d = q.defaults ?? DEFAULT_BSFC;
  const boosted = q.aspiration !== "na";
  const g = boosted ? d.gasolineBoostedGPerKwh : d.gasolineNaGPerKwh;
  const e = boosted ? d.e85BoostedGPerKwh : d.e85NaGPerKwh;
  const atRef = g + ((e - g) * q.ethanolVolPct) / 85;
  const referenceLambda = boosted ? d.referenceLambdaBoosted : d.referenceLambdaNa;
  const lambda =
    q.targetLambda === undefined
      ? referenceLambda
      : requireRange("targetLambda", q.targetLambda, 0.5, 1.5, "Target lambda");
  return {
    bsfcGPerKwh: (atRef * referenceLambda) / lambda,
    referenceLambda,
    atReferenceGPerKwh: atRef,
  };
}

/**
 * A BSFC given (typed or measured) at one ethanol content, carried to another (calc-spec §2,
 * docs/calculations.md §2.3): scaled by the rule-of-thumb ratio between the two contents, and
 * never so that the fuel *volume* per kWh falls as the ethanol content rises (the ratio is at
 * least the density ratio going richer, at most it going leaner).
 * @example bsfcAtBlend({ bsfcGPerKwh: 365, fromEthanolVolPct: 0, toEthanolVolPct: 85, aspiration: "turbo" }).bsfcGPerKwh // 486.6 (0.60 → 0.80 lb/(hp·h))
 */
export function bsfcAtBlend(q: {
  bsfcGPerKwh: number;
  fromEthanolVolPct: number;
  toEthanolVolPct: number;
  aspiration: Aspiration;
  defaults?: BsfcDefaults;
  properties?: FuelProperties;
}): { bsfcGPerKwh: number; ratio: number } {
  requirePositive("bsfcGPerKwh", q.bsfcGPerKwh, 2000, "BSFC");
  const from = defaultBsfc({
    ethanolVolPct: q.fromEthanolVolPct,
    aspiration: q.aspiration,
    defaults: q.defaults,
  });
  const to = defaultBsfc({
    ethanolVolPct: q.toEthanolVolPct,
    aspiration: q.aspiration,
    defaults: q.defaults,
  });
  const rule = to.atReferenceGPerKwh / from.atReferenceGPerKwh;
  const density =
    fuelBlend(q.toEthanolVolPct, q.properties).densityKgPerL /
    fuelBlend(q.fromEthanolVolPct, q.properties).densityKgPerL;
  const ratio =
    q.toEthanolVolPct > q.fromEthanolVolPct ? Math.max(rule, density) : Math.min(rule, density);
  return { bsfcGPerKwh: q.bsfcGPerKwh * ratio, ratio };
}
