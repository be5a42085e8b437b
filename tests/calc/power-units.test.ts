import Qty from "js-quantities";
import { describe, expect, it } from "vitest";

import {
  bsfcFromGPerKwh,
  bsfcToGPerKwh,
  CalcInputError,
  crankPowerFromWheel,
  DEFAULT_BSFC,
  defaultBsfc,
  fuelMassFlowGPerMin,
  G_PER_KWH_PER_LB_PER_HP_H,
  gPerMinToLbPerH,
  injectorCcPerMinToLbPerH,
  injectorLbPerHToCcPerMin,
  KPA_PER_PSI,
  KW_PER_HP,
  lbPerHToGPerMin,
  powerFromKw,
  powerToKw,
  pressureFromKpa,
  pressureToKpa,
  volumeFlowFromLPerH,
  volumeFlowToLPerH,
  volumeFromL,
  volumeToL,
} from "@/lib/calc";

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe("crankPowerFromWheel", () => {
  it("turns about 1190 wheel hp into about 1 MW at the crank with 10–12 % loss", () => {
    // Common practice, no source.
    const wheelKw = powerToKw(1190, "hp");
    for (const loss of [10, 12]) {
      const crank = crankPowerFromWheel({ wheelPowerKw: wheelKw, drivetrainLossPct: loss });
      expect(crank).toBeGreaterThan(970);
      expect(crank).toBeLessThan(1030);
    }
  });
  it("divides by (1 − loss), loss a share of crank power", () => {
    // calc-spec §2, by hand: 300 / 0.85.
    expect(crankPowerFromWheel({ wheelPowerKw: 300, drivetrainLossPct: 15 })).toBeCloseTo(
      300 / 0.85,
      12,
    );
  });
  it("refuses a loss of 60 % or more and negative power", () => {
    expect(() => crankPowerFromWheel({ wheelPowerKw: 300, drivetrainLossPct: 100 })).toThrow(
      CalcInputError,
    );
    expect(() => crankPowerFromWheel({ wheelPowerKw: -1, drivetrainLossPct: 10 })).toThrow(
      /Wheel power/,
    );
  });
});

describe("fuel mass flow and BSFC", () => {
  it("is power × BSFC", () => {
    // By hand: 300 kW × 365 g/kWh ÷ 60.
    expect(fuelMassFlowGPerMin({ powerKw: 300, bsfcGPerKwh: 365 })).toBeCloseTo(1825, 9);
  });
  it("converts 1 lb/(hp·h) to 608.28 g/kWh", () => {
    // Heywood ch. 2 (from memory): 608.277; NIST SP 811 factors.
    expect(G_PER_KWH_PER_LB_PER_HP_H).toBeCloseTo(608.277, 3);
    expect(bsfcFromGPerKwh(bsfcToGPerKwh(0.5, "lb/hp/h"), "lb/hp/h")).toBeCloseTo(0.5, 12);
  });
  it("uses the rules of thumb 0.50 / 0.60 / 0.70 / 0.80 lb/(hp·h)", () => {
    // Common practice, no source (calc-spec §2).
    const lb = (g: number) => bsfcFromGPerKwh(g, "lb/hp/h");
    expect(lb(defaultBsfc({ ethanolVolPct: 0, aspiration: "na" }).bsfcGPerKwh)).toBeCloseTo(
      0.5,
      12,
    );
    expect(lb(defaultBsfc({ ethanolVolPct: 0, aspiration: "turbo" }).bsfcGPerKwh)).toBeCloseTo(
      0.6,
      12,
    );
    expect(lb(defaultBsfc({ ethanolVolPct: 85, aspiration: "na" }).bsfcGPerKwh)).toBeCloseTo(
      0.7,
      12,
    );
    expect(
      lb(defaultBsfc({ ethanolVolPct: 85, aspiration: "supercharged" }).bsfcGPerKwh),
    ).toBeCloseTo(0.8, 12);
    // Halfway in ethanol is halfway in BSFC.
    expect(lb(defaultBsfc({ ethanolVolPct: 42.5, aspiration: "turbo" }).bsfcGPerKwh)).toBeCloseTo(
      0.7,
      12,
    );
  });
  it("scales by λ_ref / λ for a richer target", () => {
    const ref = defaultBsfc({ ethanolVolPct: 0, aspiration: "turbo" });
    const rich = defaultBsfc({ ethanolVolPct: 0, aspiration: "turbo", targetLambda: 0.75 });
    expect(rich.bsfcGPerKwh).toBeCloseTo(
      (ref.bsfcGPerKwh * DEFAULT_BSFC.referenceLambdaBoosted) / 0.75,
      9,
    );
    expect(rich.bsfcGPerKwh).toBeGreaterThan(ref.bsfcGPerKwh);
  });
});

describe("unit conversions against NIST SP 811 and an independent units library (js-quantities)", () => {
  it("pressure: psi and bar", () => {
    // NIST SP 811 B.8: 1 psi = 6.894 757 kPa; 1 bar = 100 kPa exactly.
    expect(rel(pressureToKpa(1, "psi"), 6.894757)).toBeLessThan(1e-6);
    expect(pressureToKpa(3, "bar")).toBeCloseTo(300, 9);
    expect(rel(pressureToKpa(43.5, "psi"), Qty("43.5 psi").to("kPa").scalar)).toBeLessThan(1e-6);
    expect(rel(pressureFromKpa(400, "psi"), Qty("400 kPa").to("psi").scalar)).toBeLessThan(1e-6);
    expect(rel(KPA_PER_PSI, Qty("1 psi").to("kPa").scalar)).toBeLessThan(1e-6);
  });
  it("power: hp and PS", () => {
    // NIST SP 811: 1 hp = 745.699 87 W; 1 PS (metric hp) = 735.498 75 W.
    expect(KW_PER_HP * 1000).toBeCloseTo(745.69987, 4);
    expect(powerToKw(1, "PS") * 1000).toBeCloseTo(735.49875, 5);
    expect(rel(powerToKw(500, "hp"), Qty("500 hp").to("kW").scalar)).toBeLessThan(1e-6);
    expect(powerFromKw(powerToKw(612, "hp"), "hp")).toBeCloseTo(612, 9);
  });
  it("volume and volume flow: US gallons", () => {
    // NIST SP 811: 1 US gal = 3.785 411 784 L exactly.
    expect(rel(volumeToL(1, "gal"), 3.785411784)).toBeLessThan(1e-6);
    expect(rel(volumeFromL(50, "gal"), Qty("50 l").to("gal").scalar)).toBeLessThan(1e-6);
    expect(rel(volumeFlowToLPerH(100, "gal/h"), Qty("100 gal/h").to("l/h").scalar)).toBeLessThan(
      1e-6,
    );
    expect(rel(volumeFlowFromLPerH(255, "l/min"), Qty("255 l/h").to("l/min").scalar)).toBeLessThan(
      1e-6,
    );
  });
  it("mass flow: lb/h to g/min is exact", () => {
    // NIST SP 811: 1 lb = 0.453 592 37 kg exactly.
    expect(lbPerHToGPerMin(60)).toBeCloseTo(453.59237, 9);
    expect(rel(lbPerHToGPerMin(100), Qty("100 lb/h").to("g/min").scalar)).toBeLessThan(1e-9);
    expect(gPerMinToLbPerH(lbPerHToGPerMin(42))).toBeCloseTo(42, 12);
  });
  it("injector flow: about 10.5 cc/min per lb/h at 0.72 kg/L", () => {
    // Common practice, no source: 10.5 cc/min ≈ 1 lb/h for test fluid ≈ 0.72 kg/L.
    expect(injectorLbPerHToCcPerMin(1)).toBeCloseTo(10.5, 1);
    expect(injectorCcPerMinToLbPerH(injectorLbPerHToCcPerMin(80, 0.745), 0.745)).toBeCloseTo(80, 9);
    // A denser fuel: fewer cc for the same mass.
    expect(injectorLbPerHToCcPerMin(80, 0.787)).toBeLessThan(injectorLbPerHToCcPerMin(80, 0.72));
    expect(() => injectorLbPerHToCcPerMin(80, 0)).toThrow(CalcInputError);
  });
});
