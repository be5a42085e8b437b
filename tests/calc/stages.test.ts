import { describe, expect, it } from "vitest";

import {
  CalcInputError,
  dutyBand,
  effectivePulseWidthMs,
  fuelVolumeFlowLPerH,
  idleFuelConsumptionLPerH,
  injectorPowerCeilingKw,
  pulseWidthForFuelMs,
  pumpPowerCeilingKw,
  sizeFuelSystem,
  voltageAfterWiringV,
  wheelPowerFromCrank,
} from "@/lib/calc";

import { boostedSix, naFour } from "./fixtures";

describe("the sizing's stages call small formulas of their own (docs/calculations.md §7)", () => {
  it("wheel power from crank power is the inverse of the drivetrain loss", () => {
    // 400 kW × (1 − 0.15) = 340 kW (calc-spec §2; by hand).
    expect(wheelPowerFromCrank({ crankPowerKw: 400, drivetrainLossPct: 15 })).toBeCloseTo(340, 9);
    expect(() => wheelPowerFromCrank({ crankPowerKw: 400, drivetrainLossPct: 99 })).toThrow(
      CalcInputError,
    );
  });

  it("volume flow from mass flow: g/min ÷ kg/L × 0.06 = L/h", () => {
    // 1825 g/min at 0.745 kg/L = 2449.7 mL/min = 146.98 L/h (by hand).
    expect(fuelVolumeFlowLPerH({ fuelMassFlowGPerMin: 1825, densityKgPerL: 0.745 })).toBeCloseTo(
      146.98,
      2,
    );
  });

  it("the injector ceiling at a duty is the duty formula solved for power", () => {
    // 0.8 × 6 × 1000 cc/min × 0.787 g/cc = 3777.6 g/min; × 60 ÷ 486.6 g/kWh = 465.8 kW (by hand).
    expect(
      injectorPowerCeilingKw({
        dutyPct: 80,
        injectorCount: 6,
        flowAtOperatingCcPerMin: 1000,
        densityKgPerL: 0.787,
        bsfcGPerKwh: 486.6,
      }),
    ).toBeCloseTo(465.79, 1);
  });

  it("duty bands: ok, caution, danger and static (calc-spec §3, common practice bands)", () => {
    const levels = { dutyCautionPct: 80, dutyDangerPct: 90 };
    expect(dutyBand(80, levels)).toBe("ok");
    expect(dutyBand(86, levels)).toBe("caution");
    expect(dutyBand(95, levels)).toBe("danger");
    expect(dutyBand(100, levels)).toBe("static");
  });

  it("pulse widths: duty × cycle, and fuel mass ÷ (density × flow)", () => {
    // 80 % of a 20 ms cycle (6000 rpm, 120 000 ÷ rpm) = 16 ms (calc-spec §3).
    expect(effectivePulseWidthMs({ dutyPct: 80, cycleMs: 20 })).toBe(16);
    // 10 mg ÷ 0.745 mg/mm³ = 13.42 mm³; at 500 cc/min = 8.333 mm³/ms → 1.611 ms (by hand).
    expect(
      pulseWidthForFuelMs({ fuelMg: 10, densityKgPerL: 0.745, flowCcPerMin: 500 }),
    ).toBeCloseTo(1.611, 3);
    expect(() =>
      pulseWidthForFuelMs({ fuelMg: 10, densityKgPerL: 0.745, flowCcPerMin: 0 }),
    ).toThrow(CalcInputError);
  });

  it("idle consumption: fuel per cylinder × cylinders × rpm ÷ 2 per minute", () => {
    // 10 mg × 4 × 425 cycles/min = 17 g/min = 1.369 L/h at 0.745 kg/L (by hand).
    expect(
      idleFuelConsumptionLPerH({
        fuelPerCylinderMg: 10,
        cylinders: 4,
        rpm: 850,
        densityKgPerL: 0.745,
      }),
    ).toBeCloseTo(1.369, 3);
  });

  it("pump ceiling keeps the minimum margin", () => {
    // 500 L/h ÷ 1.25 = 400 L/h × 0.787 kg/L = 314.8 kg/h ÷ 0.4866 kg/kWh = 646.9 kW (by hand).
    expect(
      pumpPowerCeilingKw({
        supplyLPerH: 500,
        minMarginPct: 25,
        densityKgPerL: 0.787,
        bsfcGPerKwh: 486.6,
      }),
    ).toBeCloseTo(646.94, 1);
  });

  it("voltage after the wiring never falls below zero", () => {
    const v = voltageAfterWiringV({
      sourceVoltage: 14,
      gaugeAwg: 12,
      roundTripLengthM: 10,
      currentA: 15,
    });
    expect(v.voltage).toBeCloseTo(14 - v.dropV, 12);
    expect(
      voltageAfterWiringV({ sourceVoltage: 6, gaugeAwg: 30, roundTripLengthM: 50, currentA: 80 })
        .voltage,
    ).toBe(0);
  });

  it("the result's figures are the stages' own: ceiling, duty band and pulses agree with the formulas", () => {
    for (const input of [boostedSix, naFour]) {
      const r = sizeFuelSystem(input);
      expect(r.injector.dutyBand).toBe(
        dutyBand(Math.max(r.blend.lean.dutyPct, r.blend.rich.dutyPct), r.limits),
      );
      expect(r.powerCeiling.kw).toBe(Math.min(r.injector.powerCeilingKw, r.pump.powerCeilingKw));
      expect(r.injector.pulseWidthRedline.effectiveMs).toBe(
        effectivePulseWidthMs({
          dutyPct: r.injector.dutyPct,
          cycleMs: r.injector.pulseWidthRedline.cycleMs,
        }),
      );
    }
  });

  it("does not mutate its input", () => {
    const input = structuredClone(boostedSix);
    sizeFuelSystem(input);
    expect(input).toEqual(boostedSix);
  });
});
