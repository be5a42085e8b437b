import { describe, expect, it } from "vitest";

import {
  afrFromLambda,
  CalcInputError,
  compositionOf,
  DEFAULT_E85_RANGE,
  E85_STANDARD_RANGES,
  ETHANOL,
  fuelBlend,
  GASOLINE,
  lambdaFromAfr,
  METHANOL,
  stoichAfrFromComposition,
} from "@/lib/calc";

/** Heywood's closed form for CHyOz with air as O2 + 3.773 N2 (Heywood 1988, ch. 3; from memory). */
const heywood = (y: number, z: number) =>
  (34.56 * (4 + y - 2 * z)) / (12.011 + 1.008 * y + 16.0 * z);

describe("stoichAfrFromComposition", () => {
  // Heywood, Internal Combustion Engine Fundamentals, appendix D, table D.4 (from memory).
  it.each([
    ["iso-octane C8H18", compositionOf(8, 18, 0), 15.13],
    ["n-heptane C7H16", compositionOf(7, 16, 0), 15.18],
    ["ethanol C2H5OH", compositionOf(2, 6, 1), 9.0],
    ["methanol CH3OH", compositionOf(1, 4, 1), 6.47],
    ["gasoline CH1.87", compositionOf(1, 1.87, 0), 14.6],
  ])("matches the textbook table for %s", (_name, comp, table) => {
    expect(stoichAfrFromComposition(comp)).toBeCloseTo(table, 1);
  });

  it("agrees with Heywood's closed form for C1HyOz within 0.3 %", () => {
    // Heywood ch. 3 (from memory): the closed form above.
    for (const [y, z] of [
      [2.25, 0],
      [3, 0.5],
      [4, 1],
      [1.87, 0],
    ] as const) {
      const ours = stoichAfrFromComposition(compositionOf(1, y, z));
      expect(Math.abs(ours / heywood(y, z) - 1)).toBeLessThan(0.003);
    }
  });

  it("agrees with the AFDC fuel-properties figures: gasoline ≈ 14.7, ethanol ≈ 9", () => {
    // US DOE AFDC fuel properties comparison: ethanol 9, gasoline 14.7 (calculated).
    expect(ETHANOL.stoichAfr).toBeGreaterThan(8.9);
    expect(ETHANOL.stoichAfr).toBeLessThan(9.1);
    expect(METHANOL.stoichAfr).toBeCloseTo(6.47, 1);
  });

  it("rejects fractions that do not add up to one, or negatives", () => {
    expect(() =>
      stoichAfrFromComposition({
        carbonMassFraction: 0.5,
        hydrogenMassFraction: 0.1,
        oxygenMassFraction: 0.1,
      }),
    ).toThrow(CalcInputError);
    expect(() =>
      stoichAfrFromComposition({
        carbonMassFraction: -0.1,
        hydrogenMassFraction: 0.6,
        oxygenMassFraction: 0.5,
      }),
    ).toThrow(/between 0 and 1/);
    expect(() =>
      stoichAfrFromComposition({
        carbonMassFraction: Number.NaN,
        hydrogenMassFraction: 0.5,
        oxygenMassFraction: 0.5,
      }),
    ).toThrow(/number/);
  });

  it("refuses a composition that needs no air", () => {
    // Pure oxygen "fuel": nothing to burn.
    expect(() =>
      stoichAfrFromComposition({
        carbonMassFraction: 0,
        hydrogenMassFraction: 0,
        oxygenMassFraction: 1,
      }),
    ).toThrow(/not a fuel/);
  });
});

describe("fuelBlend", () => {
  it("gives the components themselves at E0 and E100", () => {
    expect(fuelBlend(0).stoichAfr).toBe(GASOLINE.stoichAfr);
    expect(fuelBlend(100).stoichAfr).toBeCloseTo(ETHANOL.stoichAfr, 12);
    expect(fuelBlend(100).densityKgPerL).toBeCloseTo(0.794, 12);
  });

  it("uses densities within the standards: gasoline in EN 228's range, ethanol at AFDC's 0.794", () => {
    // EN 228: 720–775 kg/m³ at 15 °C. 27 CFR §21.161: ethanol SG 0.7938 at 60/60 °F; AFDC 0.794.
    expect(GASOLINE.densityKgPerL).toBeGreaterThanOrEqual(0.72);
    expect(GASOLINE.densityKgPerL).toBeLessThanOrEqual(0.775);
    expect(ETHANOL.densityKgPerL).toBeCloseTo(0.7938, 3);
  });

  it("uses heating values within 2 % of AFDC's (GREET) figures", () => {
    // AFDC: gasoline 18 676 Btu/lb = 43.44 MJ/kg; ethanol 11 585 Btu/lb = 26.95 MJ/kg (1 Btu/lb = 2.326 kJ/kg).
    expect(Math.abs(GASOLINE.lowerHeatingValueMjPerKg / ((18676 * 2.326) / 1000) - 1)).toBeLessThan(
      0.02,
    );
    expect(Math.abs(ETHANOL.lowerHeatingValueMjPerKg / ((11585 * 2.326) / 1000) - 1)).toBeLessThan(
      0.02,
    );
    expect(Math.abs(METHANOL.lowerHeatingValueMjPerKg / ((8637 * 2.326) / 1000) - 1)).toBeLessThan(
      0.02,
    );
  });

  it("gives E10 ≈ 14.1, E30 ≈ 12.9 and E85 ≈ 9.8 stoich", () => {
    // Published blend stoich ratios quoted across the trade: E10 14.1, E30 12.9, E85 9.77 (from memory).
    expect(fuelBlend(10).stoichAfr).toBeCloseTo(14.1, 1);
    expect(fuelBlend(30).stoichAfr).toBeCloseTo(12.9, 1);
    expect(Math.abs(fuelBlend(85).stoichAfr / 9.77 - 1)).toBeLessThan(0.01);
  });

  it("stays within EN 228's 3.7 % (m/m) oxygen for E10", () => {
    // EN 228: E10 ≤ 10.0 % (V/V) ethanol and ≤ 3.7 % (m/m) oxygen. Oxygen in ethanol = 15.999/46.069.
    const oxygen = fuelBlend(10).ethanolMassFraction * compositionOf(2, 6, 1).oxygenMassFraction;
    expect(oxygen).toBeLessThanOrEqual(0.037);
    expect(oxygen).toBeGreaterThan(0.03);
  });

  it("weights density by volume and the mass fraction by each part's mass", () => {
    // w = vρe / (vρe + (1−v)ρg): calc-spec §1. E85 with 0.794 / 0.745 kg/L by hand: 0.6749 / 0.78665.
    const e85 = fuelBlend(85);
    expect(e85.densityKgPerL).toBeCloseTo(0.85 * 0.794 + 0.15 * 0.745, 12);
    expect(e85.ethanolMassFraction).toBeCloseTo(0.6749 / 0.78665, 6);
  });

  it("needs 40–45 % more E85 than gasoline by volume at the same air flow and lambda", () => {
    // Common practice, no source; derived: (AFR_g / AFR_E85) × (ρ_g / ρ_E85).
    const g = fuelBlend(0);
    const e = fuelBlend(85);
    const more = (g.stoichAfr / e.stoichAfr) * (g.densityKgPerL / e.densityKgPerL) - 1;
    expect(more).toBeGreaterThan(0.4);
    expect(more).toBeLessThan(0.45);
  });

  it("takes a shop's own component properties", () => {
    expect(fuelBlend(0, { gasoline: { densityKgPerL: 0.72 } }).densityKgPerL).toBe(0.72);
  });

  it("refuses contents outside 0–100 %", () => {
    expect(() => fuelBlend(-1)).toThrow(/between 0 and 100/);
    expect(() => fuelBlend(101)).toThrow(CalcInputError);
    expect(() => fuelBlend(Number.POSITIVE_INFINITY)).toThrow(CalcInputError);
  });
});

describe("lambda and AFR", () => {
  it("converts a gasoline-scale wideband reading to lambda first", () => {
    // λ × 14.7 is the "gasoline AFR" scale (common practice, no source).
    const lambda = lambdaFromAfr(11.76, 14.7);
    expect(lambda).toBeCloseTo(0.8, 10);
    expect(afrFromLambda(lambda, fuelBlend(85).stoichAfr)).toBeCloseTo(
      0.8 * fuelBlend(85).stoichAfr,
      10,
    );
  });
  it("refuses nonsense lambdas", () => {
    expect(() => afrFromLambda(0, 14.7)).toThrow(CalcInputError);
  });
});

describe("E85 ranges of the standards", () => {
  it("holds ASTM D5798's 51–83 % (and the earlier 68–83 %) as the default range", () => {
    // ASTM D5798, revisions from 2011: 51–83 vol %; earlier 68–83 vol %.
    expect(E85_STANDARD_RANGES.astmD5798).toEqual({ ethanolMinVolPct: 51, ethanolMaxVolPct: 83 });
    expect(E85_STANDARD_RANGES.astmD5798Pre2011).toEqual({
      ethanolMinVolPct: 68,
      ethanolMaxVolPct: 83,
    });
    expect(DEFAULT_E85_RANGE.ethanolMinVolPct).toBeLessThan(DEFAULT_E85_RANGE.ethanolMaxVolPct);
    // EIA AEO 2011: annual-average US E85 was 74 % ethanol — inside the default range.
    expect(74).toBeGreaterThan(DEFAULT_E85_RANGE.ethanolMinVolPct);
  });
});
