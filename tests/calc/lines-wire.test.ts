import fc from "fast-check";
import { describe, expect, it } from "vitest";

import {
  AN_SIZES,
  anTubeOdMm,
  awgDiameterMm,
  CalcInputError,
  colebrookFrictionFactor,
  copperResistanceOhmPerM,
  frictionFactor,
  laminarFrictionFactor,
  linePressureDrop,
  swameeJainFrictionFactor,
  wireVoltageDropV,
} from "@/lib/calc";

describe("line pressure drop (Darcy–Weisbach)", () => {
  it("reproduces the laminar oil-pipe worked example", () => {
    // Çengel & Cimbala, Fluid Mechanics, example 8-2 (from memory): oil ρ 888 kg/m³, μ 0.800 kg/(m·s),
    // D 5 cm, L 40 m, ΔP 745 − 97 = 648 kPa ⇒ 0.00311 m³/s, Re ≈ 88.
    const r = linePressureDrop(
      { insideDiameterMm: 50, lengthM: 40 },
      { flowLPerH: 0.00311 * 3.6e6, densityKgPerL: 0.888, viscosityMPaS: 800 },
    );
    expect(r.regime).toBe("laminar");
    expect(r.reynolds).toBeCloseTo(88, 0);
    expect(Math.abs(r.pressureDropKpa / 648 - 1)).toBeLessThan(0.01);
  });
  it("reproduces the turbulent water-pipe worked example", () => {
    // Çengel & Cimbala, example 8-4 (from memory): water at 15 °C, ρ 999.1, μ 1.138e-3, 5 cm stainless
    // (ε 0.002 mm), 30 m, 9 L/s ⇒ V 4.58 m/s, Re 201 300, f 0.0158, ΔP ≈ 100 kPa.
    const r = linePressureDrop(
      { insideDiameterMm: 50, lengthM: 30, roughnessMm: 0.002 },
      { flowLPerH: 9 * 3600, densityKgPerL: 0.9991, viscosityMPaS: 1.138 },
    );
    expect(r.velocityMPerS).toBeCloseTo(4.58, 2);
    expect(Math.abs(r.reynolds / 201300 - 1)).toBeLessThan(0.002);
    expect(r.frictionFactor).toBeCloseTo(0.0158, 3);
    expect(Math.abs(r.pressureDropKpa / 100 - 1)).toBeLessThan(0.02);
  });
  it("adds fittings as K · ρv²/2", () => {
    const fluid = { flowLPerH: 300, densityKgPerL: 0.745, viscosityMPaS: 0.41 };
    const a = linePressureDrop({ insideDiameterMm: 8.7, lengthM: 3 }, fluid);
    const b = linePressureDrop({ insideDiameterMm: 8.7, lengthM: 3, fittingsK: 2 }, fluid);
    expect(b.pressureDropKpa - a.pressureDropKpa).toBeCloseTo(
      (2 * 745 * a.velocityMPerS ** 2) / 2 / 1000,
      9,
    );
  });
  it("gives no drop at no flow, and refuses a zero bore", () => {
    expect(
      linePressureDrop(
        { insideDiameterMm: 8, lengthM: 3 },
        { flowLPerH: 0, densityKgPerL: 0.745, viscosityMPaS: 0.41 },
      ).pressureDropKpa,
    ).toBe(0);
    expect(() =>
      linePressureDrop(
        { insideDiameterMm: 0, lengthM: 3 },
        { flowLPerH: 10, densityKgPerL: 0.745, viscosityMPaS: 0.41 },
      ),
    ).toThrow(CalcInputError);
  });
});

describe("friction factor", () => {
  it("is 64/Re when laminar", () => {
    // Çengel & Cimbala ch. 8 (Hagen–Poiseuille).
    expect(laminarFrictionFactor(1000)).toBe(0.064);
    expect(frictionFactor(1500, 0.001)).toBeCloseTo(64 / 1500, 12);
  });
  it("Swamee–Jain stays within 2 % of Colebrook solved iteratively over fuel-hose roughness", () => {
    // Çengel & Cimbala ch. 8 give Swamee–Jain as an explicit Colebrook fit to a few %. Fuel hose
    // bores are ε/D ≤ 1e-3 (0.01 mm in ≥ 8 mm); turbulent Re from 4000 up.
    fc.assert(
      fc.property(
        fc.double({ min: Math.log10(4000), max: 8, noNaN: true }),
        fc.double({ min: -6, max: -3, noNaN: true }),
        (logRe, logE) => {
          const re = 10 ** logRe;
          const e = 10 ** logE;
          expect(
            Math.abs(swameeJainFrictionFactor(re, e) / colebrookFrictionFactor(re, e) - 1),
          ).toBeLessThan(0.02);
        },
      ),
    );
  });
  it("departs by under 3 % even in the rough corner (ε/D 1e-2, Re 5000)", () => {
    // Measured here: the worst case of the published range is 2.8 %.
    expect(
      Math.abs(swameeJainFrictionFactor(5000, 1e-2) / colebrookFrictionFactor(5000, 1e-2) - 1),
    ).toBeLessThan(0.03);
  });
  it("smooth-pipe Colebrook is near Blasius 0.316 Re^-0.25 for 4000 < Re < 1e5", () => {
    // Çengel & Cimbala ch. 8: Blasius for smooth pipes (its own accuracy is a few %).
    for (const re of [5000, 2e4, 1e5])
      expect(Math.abs(colebrookFrictionFactor(re, 0) / (0.316 * re ** -0.25) - 1)).toBeLessThan(
        0.05,
      );
  });
  it("has no jump through the transition band", () => {
    const below = frictionFactor(2299.9, 1e-4);
    const above = frictionFactor(2300.1, 1e-4);
    expect(Math.abs(above - below)).toBeLessThan(1e-3);
    expect(Math.abs(frictionFactor(4000.1, 1e-4) - frictionFactor(3999.9, 1e-4))).toBeLessThan(
      1e-4,
    );
  });
});

describe("AN sizes", () => {
  it("dash number is the tube OD in sixteenths of an inch", () => {
    // SAE J514 / AS4395 (from memory): −6 = 3/8 in, −8 = 1/2 in.
    expect(anTubeOdMm(6)).toBeCloseTo(9.525, 9);
    expect(anTubeOdMm(8)).toBeCloseTo(12.7, 9);
    for (const s of AN_SIZES) expect(s.typicalHoseIdMm).toBeLessThan(s.tubeOdMm + 2);
  });
});

describe("copper wire", () => {
  it("AWG diameters match ASTM B258's table", () => {
    // ASTM B258 table (from memory): 10 AWG 2.588 mm, 12 AWG 2.053 mm, 14 AWG 1.628 mm, 16 AWG 1.291 mm.
    expect(awgDiameterMm(10)).toBeCloseTo(2.588, 3);
    expect(awgDiameterMm(12)).toBeCloseTo(2.053, 3);
    expect(awgDiameterMm(14)).toBeCloseTo(1.628, 3);
    expect(awgDiameterMm(16)).toBeCloseTo(1.291, 3);
  });
  it("resistance per km at 20 °C matches the standard tables", () => {
    // IEC 60028 resistivity with ASTM B258 diameters; tabled values (from memory): 10 AWG 3.277,
    // 12 AWG 5.211, 14 AWG 8.286, 16 AWG 13.17 Ω/km.
    const perKm = (g: number) => copperResistanceOhmPerM(g) * 1000;
    expect(Math.abs(perKm(10) / 3.277 - 1)).toBeLessThan(0.005);
    expect(Math.abs(perKm(12) / 5.211 - 1)).toBeLessThan(0.005);
    expect(Math.abs(perKm(14) / 8.286 - 1)).toBeLessThan(0.005);
    expect(Math.abs(perKm(16) / 13.17 - 1)).toBeLessThan(0.005);
  });
  it("drop is I·R over the round trip", () => {
    expect(wireVoltageDropV({ gaugeAwg: 12, roundTripLengthM: 10, currentA: 15 })).toBeCloseTo(
      15 * copperResistanceOhmPerM(12) * 10,
      12,
    );
    expect(() => wireVoltageDropV({ gaugeAwg: 99, roundTripLengthM: 10, currentA: 15 })).toThrow(
      CalcInputError,
    );
  });
});
