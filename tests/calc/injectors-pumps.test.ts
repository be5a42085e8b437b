import { describe, expect, it } from "vitest";

import {
  CalcInputError,
  cycleTimeMs,
  deadTimeMs,
  idleFuelPerCylinderMg,
  injectorDifferentialPressureKpa,
  injectorDutyPct,
  injectorFlowAtPressure,
  pumpFlowLPerH,
  pumpMarginPct,
  pumpsSupplyLPerH,
  railPressureKpa,
  requiredInjectorFlowCcPerMin,
} from "@/lib/calc";

describe("injectorFlowAtPressure (orifice law)", () => {
  it("goes with the square root of the pressure across", () => {
    // White, Fluid Mechanics §6.12; Çengel & Cimbala §8-8: Q = Cd·A·√(2ΔP/ρ) ⇒ Q₂/Q₁ = √(ΔP₂/ΔP₁).
    expect(
      injectorFlowAtPressure({
        ratedFlowCcPerMin: 1000,
        ratedPressureKpa: 300,
        differentialPressureKpa: 1200,
      }),
    ).toBeCloseTo(2000, 9);
    expect(
      injectorFlowAtPressure({
        ratedFlowCcPerMin: 1000,
        ratedPressureKpa: 300,
        differentialPressureKpa: 400,
      }),
    ).toBeCloseTo(1000 * Math.sqrt(4 / 3), 9);
    expect(
      injectorFlowAtPressure({
        ratedFlowCcPerMin: 550,
        ratedPressureKpa: 300,
        differentialPressureKpa: 300,
      }),
    ).toBe(550);
  });
  it("refuses a zero or negative rating", () => {
    expect(() =>
      injectorFlowAtPressure({
        ratedFlowCcPerMin: 0,
        ratedPressureKpa: 300,
        differentialPressureKpa: 300,
      }),
    ).toThrow(CalcInputError);
    expect(() =>
      injectorFlowAtPressure({
        ratedFlowCcPerMin: 500,
        ratedPressureKpa: 300,
        differentialPressureKpa: -5,
      }),
    ).toThrow(/Differential/);
  });
});

describe("regulators", () => {
  // calc-spec §3 (common practice): 1:1 referenced keeps ΔP; fixed loses the boost, gains the vacuum.
  it("a boost-referenced regulator holds ΔP at base and raises the rail with boost", () => {
    expect(
      injectorDifferentialPressureKpa({
        type: "boost-referenced",
        basePressureKpa: 300,
        manifoldKpa: 150,
      }),
    ).toBe(300);
    expect(
      railPressureKpa({ type: "boost-referenced", basePressureKpa: 300, manifoldKpa: 150 }),
    ).toBe(450);
  });
  it("a fixed regulator loses the boost from ΔP at full load", () => {
    expect(
      injectorDifferentialPressureKpa({ type: "fixed", basePressureKpa: 400, manifoldKpa: 150 }),
    ).toBe(250);
    expect(railPressureKpa({ type: "fixed", basePressureKpa: 400, manifoldKpa: 150 })).toBe(400);
  });
  it("at idle vacuum a fixed regulator's ΔP rises, a referenced one's does not", () => {
    expect(
      injectorDifferentialPressureKpa({ type: "fixed", basePressureKpa: 300, manifoldKpa: -65 }),
    ).toBe(365);
    expect(
      injectorDifferentialPressureKpa({
        type: "boost-referenced",
        basePressureKpa: 300,
        manifoldKpa: -65,
      }),
    ).toBe(300);
    expect(
      railPressureKpa({ type: "boost-referenced", basePressureKpa: 300, manifoldKpa: -65 }),
    ).toBe(235);
  });
});

describe("duty and requirement", () => {
  it("required flow at the design duty gives exactly the design duty", () => {
    const q = { fuelMassFlowGPerMin: 3000, densityKgPerL: 0.787, injectorCount: 6 };
    const req = requiredInjectorFlowCcPerMin({ ...q, designDutyPct: 80 });
    expect(injectorDutyPct({ ...q, flowAtOperatingCcPerMin: req })).toBeCloseTo(80, 9);
  });
  it("doubling the injector count halves the duty", () => {
    const a = injectorDutyPct({
      fuelMassFlowGPerMin: 3000,
      densityKgPerL: 0.787,
      injectorCount: 4,
      flowAtOperatingCcPerMin: 1000,
    });
    const b = injectorDutyPct({
      fuelMassFlowGPerMin: 3000,
      densityKgPerL: 0.787,
      injectorCount: 8,
      flowAtOperatingCcPerMin: 1000,
    });
    expect(b).toBeCloseTo(a / 2, 12);
  });
});

describe("pulse width and dead time", () => {
  it("has one four-stroke cycle every 120 000 / rpm ms", () => {
    // Four-stroke: two revolutions per cycle (common practice, no source).
    expect(cycleTimeMs(6000)).toBe(20);
    expect(() => cycleTimeMs(0)).toThrow(CalcInputError);
  });
  const table = {
    voltages: [12, 14],
    pressuresKpa: [300, 400],
    deadTimeMs: [
      [1.0, 1.2],
      [0.8, 0.9],
    ],
  };
  it("interpolates the dead-time table bilinearly", () => {
    // By hand: at 13 V the rows average to [0.9, 1.05]; at 350 kPa → 0.975.
    expect(deadTimeMs(table, 13, 350).value).toBeCloseTo(0.975, 12);
    expect(deadTimeMs(table, 12, 300)).toEqual({ value: 1.0, outOfRange: false });
  });
  it("holds the edges outside the table and says so", () => {
    expect(deadTimeMs(table, 10, 300)).toEqual({ value: 1.0, outOfRange: true });
    expect(deadTimeMs(table, 14, 600)).toEqual({ value: 0.9, outOfRange: true });
  });
  it("refuses a ragged table", () => {
    expect(() =>
      deadTimeMs({ voltages: [12, 14], pressuresKpa: [300], deadTimeMs: [[1]] }, 13, 300),
    ).toThrow(CalcInputError);
  });
});

describe("idle air and fuel", () => {
  it("follows the ideal-gas law for the charge", () => {
    // Ideal gas, R = 287.05 J/(kg·K): 0.5 L × 0.8 × 35 kPa / (287.05 × 303.15 K) = 0.1609 g.
    const r = idleFuelPerCylinderMg({
      displacementL: 2,
      cylinders: 4,
      volumetricEfficiency: 0.8,
      manifoldKpaAbs: 35,
      intakeTempC: 30,
      stoichAfr: 14.7,
    });
    expect(r.airMg).toBeCloseTo((0.0005 * 0.8 * 35000 * 1e6) / (287.05 * 303.15), 9);
    expect(r.fuelMg).toBeCloseTo(r.airMg / 14.7, 12);
  });
});

describe("pumps", () => {
  const pump = {
    quantity: 1,
    curves: [
      {
        voltage: 12,
        points: [
          { pressureKpa: 300, flowLPerH: 300 },
          { pressureKpa: 600, flowLPerH: 200 },
        ],
      },
      {
        voltage: 14,
        points: [
          { pressureKpa: 600, flowLPerH: 260 },
          { pressureKpa: 300, flowLPerH: 360 },
        ],
      },
    ],
  };
  it("interpolates in pressure and then in voltage", () => {
    // By hand: at 450 kPa, 250 L/h (12 V) and 310 L/h (14 V); at 13 V, 280 L/h.
    expect(pumpFlowLPerH(pump, 450, 12).flowLPerH).toBeCloseTo(250, 9);
    expect(pumpFlowLPerH(pump, 450, 13)).toEqual({
      flowLPerH: 280,
      pressureOutOfRange: false,
      pressureBelowCurve: false,
      voltageOutOfRange: false,
    });
  });
  it("says so outside the data, and never goes below zero", () => {
    const r = pumpFlowLPerH(pump, 2000, 12);
    expect(r.pressureOutOfRange).toBe(true);
    expect(r.flowLPerH).toBe(0);
    expect(pumpFlowLPerH(pump, 450, 10).voltageOutOfRange).toBe(true);
  });
  it("adds the flows of pumps in parallel", () => {
    expect(pumpsSupplyLPerH([{ ...pump, quantity: 2 }], 450, 12).flowLPerH).toBeCloseTo(500, 9);
    expect(pumpsSupplyLPerH([pump, pump], 450, 12).flowLPerH).toBeCloseTo(500, 9);
  });
  it("gives margin as supply ÷ demand − 1", () => {
    expect(pumpMarginPct(300, 240)).toBeCloseTo(25, 12);
  });
});
