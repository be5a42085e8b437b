// Reference: docs/calculations.md §5.
import { requirePositive, requireRange } from "./_lib/input-error";

/** Laminar below this Reynolds number; fully turbulent above the upper one. */
export const RE_LAMINAR = 2300;
export const RE_TURBULENT = 4000;

/** Laminar friction factor f = 64/Re. @example laminarFrictionFactor(1000) // 0.064 */
export const laminarFrictionFactor = (re: number): number =>
  64 / requireRange("reynolds", re, 1e-6, 1e9, "Reynolds number");

const requireRoughness = (rel: number) =>
  requireRange("relativeRoughness", rel, 0, 0.5, "Relative roughness");

/**
 * Swamee–Jain explicit approximation of Colebrook:
 * f = 0.25 / [log10(ε/(3.7D) + 5.74/Re^0.9)]².
 * @example swameeJainFrictionFactor(1e5, 0) // 0.0182
 */
export function swameeJainFrictionFactor(re: number, relativeRoughness: number): number {
  requireRange("reynolds", re, 1, 1e9, "Reynolds number");
  requireRoughness(relativeRoughness);
  const l = Math.log10(relativeRoughness / 3.7 + 5.74 / Math.pow(re, 0.9));
  return 0.25 / (l * l);
}

/**
 * Colebrook solved by fixed-point iteration (for checks; the library uses Swamee–Jain):
 * 1/√f = −2·log10(ε/(3.7D) + 2.51/(Re·√f)).
 */
export function colebrookFrictionFactor(re: number, relativeRoughness: number): number {
  // Colebrook is a turbulent-flow law: below the laminar limit it has no meaning.
  requireRange("reynolds", re, RE_LAMINAR, 1e9, "Reynolds number (turbulent flow)");
  requireRoughness(relativeRoughness);
  let x = 1 / Math.sqrt(swameeJainFrictionFactor(re, relativeRoughness));
  for (let i = 0; i < 50; i++) {
    const next = -2 * Math.log10(relativeRoughness / 3.7 + (2.51 * x) / re);
    if (Math.abs(next - x) < 1e-12) return 1 / (next * next);
    x = next;
  }
  return 1 / (x * x);
}

/**
 * Darcy friction factor for any Reynolds number: laminar 64/Re; Swamee–Jain when turbulent;
 * in the transition band (2300–4000) linear between the two, so the figure never jumps.
 */
export function frictionFactor(re: number, relativeRoughness: number): number {
  requireRange("reynolds", re, 0, 1e9, "Reynolds number");
  requireRoughness(relativeRoughness);
  // No flow (or a vanishing one): no friction to speak of, and 64/Re would overflow.
  if (!(re > 1e-6)) return 0;
  if (re < RE_LAMINAR) return laminarFrictionFactor(re);
  if (re > RE_TURBULENT) return swameeJainFrictionFactor(re, relativeRoughness);
  const t = (re - RE_LAMINAR) / (RE_TURBULENT - RE_LAMINAR);
  return (
    (1 - t) * laminarFrictionFactor(RE_LAMINAR) +
    t * swameeJainFrictionFactor(RE_TURBULENT, relativeRoughness)
  );
}

export interface LineSegment {
  insideDiameterMm: number;
  lengthM: number;
  /** Absolute roughness of the bore; smooth PTFE ≈ 0.0015 mm, rubber hose ≈ 0.01 mm. */
  roughnessMm?: number;
  /** Sum of the fittings' loss coefficients K. */
  fittingsK?: number;
}

export interface LineDrop {
  velocityMPerS: number;
  reynolds: number;
  regime: "laminar" | "transitional" | "turbulent";
  frictionFactor: number;
  pressureDropKpa: number;
}

/** Roughness used when a line gives none (common practice, no source). */
export const DEFAULT_HOSE_ROUGHNESS_MM = 0.01;

/**
 * Pressure drop in a line: Darcy–Weisbach f·(L/D)·ρv²/2 plus fittings ΣK·ρv²/2.
 * @example linePressureDrop({ insideDiameterMm: 8.7, lengthM: 5 }, { flowLPerH: 300, densityKgPerL: 0.745, viscosityMPaS: 0.41 }) // { pressureDropKpa: ≈ 5.6, regime: "turbulent", … }
 */
export function linePressureDrop(
  line: LineSegment,
  fluid: { flowLPerH: number; densityKgPerL: number; viscosityMPaS: number },
): LineDrop {
  const D =
    requirePositive("insideDiameterMm", line.insideDiameterMm, 100, "Inside diameter") / 1000;
  const L = requireRange("lengthM", line.lengthM, 0, 100, "Line length");
  const roughness = requireRange(
    "roughnessMm",
    line.roughnessMm ?? DEFAULT_HOSE_ROUGHNESS_MM,
    0,
    5,
    "Roughness",
  );
  const fittingsK = requireRange("fittingsK", line.fittingsK ?? 0, 0, 1000, "Fittings K");
  const rho = requirePositive("densityKgPerL", fluid.densityKgPerL, 25, "Density") * 1000;
  const mu = requirePositive("viscosityMPaS", fluid.viscosityMPaS, 1e6, "Viscosity") / 1000;
  const q = requireRange("flowLPerH", fluid.flowLPerH, 0, 1e6, "Flow") / 1000 / 3600;
  const area = (Math.PI * D * D) / 4;
  const v = q / area;
  const re = (rho * v * D) / mu;
  const rel = Math.min(0.5, roughness / 1000 / D);
  const f = frictionFactor(re, rel);
  const dynamic = (rho * v * v) / 2;
  const dropPa = (f * (L / D) + fittingsK) * dynamic;
  return {
    velocityMPerS: v,
    reynolds: re,
    regime: re < RE_LAMINAR ? "laminar" : re > RE_TURBULENT ? "turbulent" : "transitional",
    frictionFactor: f,
    pressureDropKpa: dropPa / 1000,
  };
}

/**
 * AN (SAE J514 / AS4395) dash sizes: the dash number is the tube outside diameter in
 * sixteenths of an inch. Hose inside diameters differ by construction; these are typical
 * rubber/PTFE fuel-hose bores (from memory) used only when the catalog gives none.
 */
export const AN_SIZES = [
  { dash: 4, tubeOdMm: (4 / 16) * 25.4, typicalHoseIdMm: 5.6 },
  { dash: 6, tubeOdMm: (6 / 16) * 25.4, typicalHoseIdMm: 8.7 },
  { dash: 8, tubeOdMm: (8 / 16) * 25.4, typicalHoseIdMm: 11.1 },
  { dash: 10, tubeOdMm: (10 / 16) * 25.4, typicalHoseIdMm: 14.2 },
  { dash: 12, tubeOdMm: (12 / 16) * 25.4, typicalHoseIdMm: 17.5 },
] as const;

/** Tube outside diameter of an AN dash size in mm. @example anTubeOdMm(8) // 12.7 */
export function anTubeOdMm(dash: number): number {
  requireRange("dash", dash, 2, 32, "AN dash size");
  return (dash / 16) * 25.4;
}
