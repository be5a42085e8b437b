import { describe, expect, it } from "vitest";

import {
  CalcInputError,
  fuelPressureAgainstBoost,
  FuelSystemInputSchema,
  injectorDifferentialPressureKpa,
  railPressureKpa,
  sizeFuelSystem,
} from "@/lib/calc";

import { boostedSix, naFour } from "./fixtures";

describe("fuel pressure against boost (docs/calculations.md §3.8)", () => {
  it("a 1:1 boost-referenced regulator holds the pressure across the injector at the base pressure", () => {
    // Rail = base + boost, ΔP = base (calc-spec §3; common practice, no source).
    const s = fuelPressureAgainstBoost({
      type: "boost-referenced",
      basePressureKpa: 300,
      maxBoostKpa: 150,
      points: 4,
    });
    expect(s.map((p) => p.boostKpa)).toEqual([0, 50, 100, 150]);
    expect(s.map((p) => p.railKpa)).toEqual([300, 350, 400, 450]);
    expect(s.every((p) => p.differentialKpa === 300)).toBe(true);
  });

  it("a fixed regulator loses the boost from the pressure across the injector", () => {
    // 400 kPa fixed at 150 kPa boost: rail 400, ΔP 250 (calc-spec §3; by hand).
    const s = fuelPressureAgainstBoost({
      type: "fixed",
      basePressureKpa: 400,
      maxBoostKpa: 150,
      points: 2,
    });
    expect(s[1]).toEqual({ boostKpa: 150, railKpa: 400, differentialKpa: 250 });
  });

  it("a rising-rate regulator raises the rail by the ratio times the boost", () => {
    // Regulator ratio arithmetic (common practice, no source): a 1:4 unit at 3 bar base and
    // 1 bar boost gives 3 + 4 × 1 = 7 bar rail, 7 − 1 = 6 bar across the injector.
    const q = {
      type: "boost-referenced" as const,
      basePressureKpa: 300,
      manifoldKpa: 100,
      risingRateRatio: 4,
    };
    expect(railPressureKpa(q)).toBe(700);
    expect(injectorDifferentialPressureKpa(q)).toBe(600);
    // 1:12 at 43.5 psi (300 kPa) base and 5 psi (34.47 kPa) boost: rail 43.5 + 60 = 103.5 psi.
    expect(railPressureKpa({ ...q, manifoldKpa: 34.47, risingRateRatio: 12 })).toBeCloseTo(
      300 + 12 * 34.47,
      9,
    );
    // Under vacuum it follows the manifold 1:1: at −60 kPa the rail is 240, ΔP 300.
    expect(railPressureKpa({ ...q, manifoldKpa: -60 })).toBe(240);
    expect(injectorDifferentialPressureKpa({ ...q, manifoldKpa: -60 })).toBe(300);
  });

  it("gives one point where there is no boost", () => {
    expect(
      fuelPressureAgainstBoost({ type: "fixed", basePressureKpa: 350, maxBoostKpa: 0 }),
    ).toEqual([{ boostKpa: 0, railKpa: 350, differentialKpa: 350 }]);
  });

  it("refuses a ratio below 1:1 and a fixed regulator that the boost overcomes", () => {
    expect(() =>
      railPressureKpa({
        type: "boost-referenced",
        basePressureKpa: 300,
        manifoldKpa: 50,
        risingRateRatio: 0.5,
      }),
    ).toThrow(CalcInputError);
    expect(() =>
      fuelPressureAgainstBoost({ type: "fixed", basePressureKpa: 200, maxBoostKpa: 250 }),
    ).toThrow(CalcInputError);
    const bad = structuredClone(boostedSix);
    bad.regulator.risingRateRatio = 13;
    const parsed = FuelSystemInputSchema.safeParse(bad);
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues[0]!.path.join(".")).toBe("regulator.risingRateRatio");
  });

  it("the sizing carries the series, and the ratio raises the pressure across the injectors", () => {
    const plain = sizeFuelSystem(boostedSix);
    expect(plain.regulator.risingRateRatio).toBe(1);
    const series = plain.regulator.pressureVsBoost;
    // Straight lines in boost: the two ends (§3.8).
    expect(series).toHaveLength(2);
    expect(series[0]).toEqual({ boostKpa: 0, railKpa: 400, differentialKpa: 400 });
    expect(series.at(-1)).toEqual({ boostKpa: 150, railKpa: 550, differentialKpa: 400 });
    expect(plain.pump.railPressureKpa).toBe(550);

    const rr = sizeFuelSystem({
      ...boostedSix,
      regulator: { ...boostedSix.regulator, risingRateRatio: 2 },
    });
    // 400 + 2 × 150 = 700 kPa rail; 700 − 150 = 550 kPa across (by hand).
    expect(rr.pump.railPressureKpa).toBe(700);
    expect(rr.injector.differentialPressureKpa).toBe(550);
    expect(rr.regulator.pressureVsBoost.at(-1)!.railKpa).toBe(700);
    // More pressure across the injector: more flow, lower duty (orifice law, §3.1).
    expect(rr.injector.dutyPct).toBeLessThan(plain.injector.dutyPct);
    const dp = rr.trace.find((s) => s.id === "injector-dp")!;
    expect(dp.formula).toContain("rising-rate ratio");
    expect(rr.trace.find((s) => s.id === "rail-full-boost")!.value).toBe(700);
  });

  it("an NA engine's series is its one point at no boost", () => {
    const r = sizeFuelSystem(naFour);
    expect(r.regulator.pressureVsBoost).toEqual([
      { boostKpa: 0, railKpa: 350, differentialKpa: 350 },
    ]);
  });
});
