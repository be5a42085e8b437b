import { describe, expect, it } from "vitest";

import { CalcInputError, regulatorBypassCapacityLPerH, sizeFuelSystem } from "@/lib/calc";

import { boostedSix } from "./fixtures";

describe("regulator bypass capacity against the idle return flow (docs/calculations.md §3.9)", () => {
  it("scales the rated bypass flow by the orifice law", () => {
    // 400 L/h at 300 kPa; at 240 kPa: 400 × √(240/300) = 357.8 L/h (orifice law, §3.1; by hand).
    expect(
      regulatorBypassCapacityLPerH({
        ratedFlowLPerH: 400,
        ratedPressureKpa: 300,
        railPressureKpa: 240,
      }),
    ).toBeCloseTo(357.77, 2);
    expect(() =>
      regulatorBypassCapacityLPerH({
        ratedFlowLPerH: 400,
        ratedPressureKpa: 0,
        railPressureKpa: 1,
      }),
    ).toThrow(CalcInputError);
  });

  it("no rating: no figure and no warning", () => {
    const r = sizeFuelSystem(boostedSix);
    expect(r.regulator.bypassCapacityAtIdleLPerH).toBeNull();
    expect(r.warnings.map((w) => w.code)).not.toContain("regulator-bypass-short");
  });

  it("a bypass smaller than the idle return flow is one caution, with the figures", () => {
    const small = sizeFuelSystem({
      ...boostedSix,
      regulator: { ...boostedSix.regulator, bypass: { flowLPerH: 200, atPressureKpa: 300 } },
    });
    const cap = small.regulator.bypassCapacityAtIdleLPerH!;
    // The fixture's idle rail: 400 + (35 − 101.325) = 333.7 kPa; 200 × √(333.7/300) = 210.9 L/h.
    expect(cap).toBeCloseTo(200 * Math.sqrt(small.pump.idleRailPressureKpa / 300), 9);
    expect(cap).toBeLessThan(small.pump.idleReturnFlowLPerH);
    const w = small.warnings.filter((x) => x.code === "regulator-bypass-short");
    expect(w).toHaveLength(1);
    expect(w[0]!.severity).toBe("caution");
    expect(w[0]!.params.capacity!.value).toBe(cap);
    expect(small.trace.find((s) => s.id === "regulator-bypass")!.value).toBe(cap);

    const big = sizeFuelSystem({
      ...boostedSix,
      regulator: { ...boostedSix.regulator, bypass: { flowLPerH: 1200, atPressureKpa: 300 } },
    });
    expect(big.warnings.map((x) => x.code)).not.toContain("regulator-bypass-short");
  });
});
