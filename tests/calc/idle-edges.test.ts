import { describe, expect, it } from "vitest";

import {
  FuelSystemInputSchema,
  injectorDifferentialPressureKpa,
  railPressureKpa,
  sizeFuelSystem,
  type FuelSystemInput,
} from "@/lib/calc";

import { boostedSix } from "./fixtures";

const withIdle = (engine: Partial<FuelSystemInput["engine"]>, base = 400): FuelSystemInput =>
  FuelSystemInputSchema.parse({
    ...boostedSix,
    engine: { ...boostedSix.engine, ...engine },
    regulator: { type: "boost-referenced", basePressureKpa: base },
  });

describe("idle pressure across the injector with the rail held at atmosphere (docs/calculations.md §3.2)", () => {
  it("a referenced rail pulled below atmosphere sits at 0 and the whole vacuum is across the injector", () => {
    // By hand (§3.2): base 50 kPa, manifold 15 − 110 = −95 kPa gauge; rail 50 − 95 < 0 → 0;
    // ΔP = rail − manifold = 0 − (−95) = 95 kPa.
    const q = { type: "boost-referenced" as const, basePressureKpa: 50, manifoldKpa: -95 };
    expect(railPressureKpa(q)).toBe(0);
    expect(injectorDifferentialPressureKpa(q)).toBe(95);
  });

  it("a rail above atmosphere keeps the base pressure across the injector", () => {
    // By hand (§3.2): base 300 kPa, manifold −66 kPa gauge: rail 234, ΔP 234 + 66 = 300.
    const q = { type: "boost-referenced" as const, basePressureKpa: 300, manifoldKpa: -66 };
    expect(railPressureKpa(q)).toBe(234);
    expect(injectorDifferentialPressureKpa(q)).toBe(300);
  });

  it("the sizing's idle figures use it (the tester's case: 50 kPa base, 15 kPa abs, 110 kPa ambient)", () => {
    const r = sizeFuelSystem(withIdle({ idleManifoldKpaAbs: 15, ambientKpaAbs: 110 }, 50));
    // By hand as above: rail 0 kPa gauge, ΔP 95 kPa.
    expect(r.pump.idleRailPressureKpa).toBe(0);
    expect(r.injector.pulseWidthIdle.differentialPressureKpa).toBeCloseTo(95, 6);
  });
});

describe("injector static at idle (docs/calculations.md §7.3)", () => {
  it("warns when the idle pulse is as long as the cycle at idle speed", () => {
    // Huge idle airflow for the injectors: 8 cylinders of 8 L on one small injector per cylinder.
    const input = FuelSystemInputSchema.parse({
      ...boostedSix,
      engine: {
        ...boostedSix.engine,
        cylinders: 8,
        displacementL: 8,
        idleRpm: 850,
        idleManifoldKpaAbs: 100,
        idleVolumetricEfficiency: 1.2,
        ambientKpaAbs: 101.325,
      },
      injectors: { count: 1, ratedFlowCcPerMin: 20, ratedPressureKpa: 300 },
    });
    const r = sizeFuelSystem(input);
    // Cycle of a four-stroke at 850 rpm: 120 000 / 850 = 141.18 ms (§3.4; by hand).
    expect(r.injector.pulseWidthIdle.cycleMs).toBeCloseTo(141.18, 2);
    expect(r.injector.pulseWidthIdle.effectiveMs).toBeGreaterThan(141.18);
    const w = r.warnings.find((x) => x.code === "idle-injector-static");
    expect(w?.severity).toBe("danger");
    expect(w?.params?.cycle?.value).toBeCloseTo(141.18, 2);
  });

  it("says nothing of the kind for an ordinary idle", () => {
    const r = sizeFuelSystem(withIdle({}));
    expect(r.injector.pulseWidthIdle.effectiveMs).toBeLessThan(r.injector.pulseWidthIdle.cycleMs);
    expect(r.warnings.map((x) => x.code)).not.toContain("idle-injector-static");
  });
});
