import { describe, expect, it } from "vitest";

import { CalcInputError, injectorFlowForFuel, sizeFuelSystem } from "@/lib/calc";

import { boostedSix } from "./fixtures";

describe("injector flow corrected for the rating's test-fluid density (docs/calculations.md §3.10)", () => {
  it("an orifice passes volume in proportion to √(1/ρ): heptane-rated flow is less in E85", () => {
    // Orifice equation Q = C·A·√(2ΔP/ρ) (ISO 5167-1's general relation, same C): 1000 cc/min of
    // n-heptane (0.684 kg/L at 20 °C, CRC Handbook, from memory) is 1000 × √(0.684/0.787)
    // = 932.3 cc/min of E85 (0.787 kg/L, §1) at the same pressure (by hand).
    expect(
      injectorFlowForFuel({
        flowCcPerMin: 1000,
        ratingFluidDensityKgPerL: 0.684,
        fuelDensityKgPerL: 0.787,
      }),
    ).toBeCloseTo(932.3, 1);
    // Mass flow goes with √(ρ_fuel/ρ_test): 932.3 × 0.787 = 1000 × 0.684 × √(0.787/0.684).
    expect(932.26 * 0.787).toBeCloseTo(684 * Math.sqrt(0.787 / 0.684), 0);
    expect(() =>
      injectorFlowForFuel({
        flowCcPerMin: 1000,
        ratingFluidDensityKgPerL: 0,
        fuelDensityKgPerL: 0.75,
      }),
    ).toThrow(CalcInputError);
  });

  it("the sizing corrects duty, ceiling and the rating each end needs", () => {
    const plain = sizeFuelSystem(boostedSix);
    const heptane = sizeFuelSystem({
      ...boostedSix,
      injectors: { ...boostedSix.injectors, ratingFluidDensityKgPerL: 0.684 },
    });
    for (const end of ["lean", "rich"] as const) {
      const p = plain.blend[end];
      const h = heptane.blend[end];
      const k = Math.sqrt(0.684 / h.densityKgPerL);
      expect(p.injectorFlowCcPerMin).toBe(plain.injector.flowAtOperatingCcPerMin);
      expect(h.injectorFlowCcPerMin).toBeCloseTo(plain.injector.flowAtOperatingCcPerMin * k, 9);
      expect(h.dutyPct).toBeCloseTo(p.dutyPct / k, 9);
      expect(h.powerCeilingKw).toBeCloseTo(p.powerCeilingKw * k, 9);
      // The rating needed, in the test fluid: more heptane flow for the same fuel flow.
      expect(h.requiredRatedFlowCcPerMin).toBeCloseTo(p.requiredRatedFlowCcPerMin / k, 9);
    }
    expect(heptane.trace.some((s) => s.id === "injector-flow-fuel-rich")).toBe(true);
    expect(plain.trace.some((s) => s.id === "injector-flow-fuel-rich")).toBe(false);
    // At idle too: a longer opening for the same fuel.
    expect(heptane.injector.pulseWidthIdle.effectiveMs).toBeGreaterThan(
      plain.injector.pulseWidthIdle.effectiveMs,
    );
  });
});
