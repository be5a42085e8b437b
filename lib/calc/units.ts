import { requirePositive } from "./_lib/input-error";
import {
  KG_PER_LB,
  KPA_PER_BAR,
  KPA_PER_PSI,
  KW_PER_HP,
  KW_PER_PS,
  L_PER_US_GAL,
} from "./constants";
import { G_PER_KWH_PER_LB_PER_HP_H } from "./power";

/**
 * Unit conversions at the edges, all from the NIST SP 811 exact factors of ./constants (the
 * tests cross-check them with `convert-units`). docs/calculations.md §0.
 */

export type PressureUnit = "kPa" | "psi" | "bar";
export type PowerUnit = "kW" | "hp" | "PS";
export type InjectorFlowUnit = "cc/min" | "lb/h";
export type VolumeFlowUnit = "l/h" | "gal/h" | "l/min" | "gal/min";
export type VolumeUnit = "l" | "gal";
export type BsfcUnit = "g/kWh" | "lb/hp/h";
export type UnitSystem = "metric" | "imperial";

const KPA_PER_UNIT: Record<PressureUnit, number> = { kPa: 1, psi: KPA_PER_PSI, bar: KPA_PER_BAR };
export function pressureToKpa(value: number, unit: PressureUnit): number {
  return unit === "kPa" ? value : value * KPA_PER_UNIT[unit];
}
export function pressureFromKpa(kpa: number, unit: PressureUnit): number {
  return unit === "kPa" ? kpa : kpa / KPA_PER_UNIT[unit];
}

const KW_PER: Record<PowerUnit, number> = { kW: 1, hp: KW_PER_HP, PS: KW_PER_PS };
export const powerToKw = (value: number, unit: PowerUnit): number => value * KW_PER[unit];
export const powerFromKw = (kw: number, unit: PowerUnit): number => kw / KW_PER[unit];

const L_PER_H_PER_UNIT: Record<VolumeFlowUnit, number> = {
  "l/h": 1,
  "gal/h": L_PER_US_GAL,
  "l/min": 60,
  "gal/min": 60 * L_PER_US_GAL,
};
export function volumeFlowToLPerH(value: number, unit: VolumeFlowUnit): number {
  return unit === "l/h" ? value : value * L_PER_H_PER_UNIT[unit];
}
export function volumeFlowFromLPerH(lph: number, unit: VolumeFlowUnit): number {
  return unit === "l/h" ? lph : lph / L_PER_H_PER_UNIT[unit];
}
export function volumeToL(value: number, unit: VolumeUnit): number {
  return unit === "l" ? value : value * L_PER_US_GAL;
}
export function volumeFromL(l: number, unit: VolumeUnit): number {
  return unit === "l" ? l : l / L_PER_US_GAL;
}

/** Mass flow: 1 lb/h = 453.59237 g / 60 min = 7.5598728 g/min (exact). */
export const lbPerHToGPerMin = (lbPerH: number): number => (lbPerH * KG_PER_LB * 1000) / 60;
export const gPerMinToLbPerH = (gPerMin: number): number => (gPerMin * 60) / (KG_PER_LB * 1000);

/**
 * The density the trade uses to quote injector flow in lb/h: about 10.5 cc/min per lb/h, which
 * is a test fluid of ≈ 0.72 kg/L (common practice, no source).
 */
export const INJECTOR_RATING_DENSITY_KG_PER_L = 0.72;

/**
 * lb/h → cc/min at a stated density (kg/L = g/cc).
 * @example injectorLbPerHToCcPerMin(1, 0.72) // 10.4998
 */
export function injectorLbPerHToCcPerMin(
  lbPerH: number,
  densityKgPerL = INJECTOR_RATING_DENSITY_KG_PER_L,
): number {
  requirePositive("densityKgPerL", densityKgPerL, 2, "Density");
  return lbPerHToGPerMin(lbPerH) / densityKgPerL;
}
export function injectorCcPerMinToLbPerH(
  ccPerMin: number,
  densityKgPerL = INJECTOR_RATING_DENSITY_KG_PER_L,
): number {
  requirePositive("densityKgPerL", densityKgPerL, 2, "Density");
  return gPerMinToLbPerH(ccPerMin * densityKgPerL);
}

export const bsfcToGPerKwh = (value: number, unit: BsfcUnit): number =>
  unit === "g/kWh" ? value : value * G_PER_KWH_PER_LB_PER_HP_H;
export const bsfcFromGPerKwh = (gPerKwh: number, unit: BsfcUnit): number =>
  unit === "g/kWh" ? gPerKwh : gPerKwh / G_PER_KWH_PER_LB_PER_HP_H;

/** The display units of each unit system. */
export const UNIT_SYSTEMS: Record<
  UnitSystem,
  {
    pressure: PressureUnit;
    power: PowerUnit;
    injectorFlow: InjectorFlowUnit;
    volumeFlow: VolumeFlowUnit;
    volume: VolumeUnit;
    bsfc: BsfcUnit;
  }
> = {
  metric: {
    pressure: "kPa",
    power: "kW",
    injectorFlow: "cc/min",
    volumeFlow: "l/h",
    volume: "l",
    bsfc: "g/kWh",
  },
  imperial: {
    pressure: "psi",
    power: "hp",
    injectorFlow: "lb/h",
    volumeFlow: "gal/h",
    volume: "gal",
    bsfc: "lb/hp/h",
  },
};
