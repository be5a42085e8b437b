import fc from "fast-check";
import { describe, expect, it } from "vitest";

import {
  bsfcAtBlend,
  G_PER_KWH_PER_LB_PER_HP_H,
  pumpFlowLPerH,
  sizeFuelSystem,
  type FuelSystemInput,
} from "@/lib/calc";

import { boostedSix } from "./fixtures";

const withInput = (patch: (i: FuelSystemInput) => void): FuelSystemInput => {
  const i = structuredClone(boostedSix);
  patch(i);
  return i;
};
const lbHpH = G_PER_KWH_PER_LB_PER_HP_H;

describe("a BSFC belongs to a fuel: the worse end of the blend (docs/calculations.md §2.3, §7)", () => {
  it("E0–E85 with one typed 360 g/kWh: E85 gets the rules of thumb' ratio, and needs more fuel volume", () => {
    const r = sizeFuelSystem(
      withInput((i) => {
        i.fuel = { ethanolMinVolPct: 0, ethanolMaxVolPct: 85, bsfcGPerKwh: 360 };
      }),
    );
    // Boosted rules of thumb 0.60 (E0) and 0.80 (E85) lb/(hp·h): ratio 4/3 (calc-spec §2,
    // common practice, no source).
    expect(r.blend.lean.bsfcGPerKwh).toBe(360);
    expect(r.blend.rich.bsfcGPerKwh).toBeCloseTo(480, 9);
    expect(r.blend.rich.fuelVolumeFlowLPerH).toBeGreaterThan(r.blend.lean.fuelVolumeFlowLPerH);
    // About 1.26× the volume (calc-spec §2: "roughly 1.26× (rules of thumb)"): 4/3 × 0.745/0.787.
    expect(r.blend.rich.fuelVolumeFlowLPerH / r.blend.lean.fuelVolumeFlowLPerH).toBeCloseTo(
      ((4 / 3) * 0.745) / (0.15 * 0.745 + 0.85 * 0.794),
      6,
    );
    expect(r.blend.worstEnd).toBe("rich");
    expect(r.injector.dutyPct).toBe(r.blend.rich.dutyPct);
    expect(r.pump.demandLPerH).toBe(r.blend.rich.fuelVolumeFlowLPerH);
  });

  it("scales a BSFC no lower than the density ratio when the shop's anchors would (docs §2.3)", () => {
    // Anchors that give E85 the same mass BSFC as E0: the volume per kWh must still not fall.
    const flat = {
      gasolineNaGPerKwh: 300,
      gasolineBoostedGPerKwh: 300,
      e85NaGPerKwh: 300,
      e85BoostedGPerKwh: 300,
      referenceLambdaNa: 0.88,
      referenceLambdaBoosted: 0.8,
    };
    const s = bsfcAtBlend({
      bsfcGPerKwh: 300,
      fromEthanolVolPct: 0,
      toEthanolVolPct: 85,
      aspiration: "turbo",
      defaults: flat,
    });
    // Density ratio E85/E0 by volume weighting of 0.794 and 0.745 kg/L (calc-spec §1 defaults).
    expect(s.ratio).toBeCloseTo((0.15 * 0.745 + 0.85 * 0.794) / 0.745, 12);
    // 0.60 → 0.80 lb/(hp·h) boosted rules of thumb (calc-spec §2, common practice, no source).
    expect(
      bsfcAtBlend({
        bsfcGPerKwh: 0.6 * lbHpH,
        fromEthanolVolPct: 0,
        toEthanolVolPct: 85,
        aspiration: "turbo",
      }).bsfcGPerKwh,
    ).toBeCloseTo(0.8 * lbHpH, 9);
  });

  it("property: for any BSFC source, duty and demand at the richer end are never lower; the reported ones are the worse end's", () => {
    const source = fc.oneof(
      fc.constant({}),
      fc.record({ bsfcGPerKwh: fc.double({ min: 150, max: 1200, noNaN: true }) }),
      fc.record({
        bsfcGPerKwh: fc.double({ min: 150, max: 1200, noNaN: true }),
        bsfcEthanolVolPct: fc.double({ min: 0, max: 100, noNaN: true }),
      }),
    );
    fc.assert(
      fc.property(
        source,
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.option(fc.double({ min: 0.6, max: 1.3, noNaN: true }), { nil: undefined }),
        fc.constantFrom("na", "turbo") as fc.Arbitrary<"na" | "turbo">,
        (src, a, b, lambda, aspiration) => {
          const r = sizeFuelSystem(
            withInput((i) => {
              i.engine.aspiration = aspiration;
              if (aspiration === "na") i.engine.maxBoostKpa = 0;
              i.fuel = {
                ethanolMinVolPct: Math.min(a, b),
                ethanolMaxVolPct: Math.max(a, b),
                targetLambda: lambda,
                ...src,
              };
            }),
          );
          const { lean, rich } = r.blend;
          expect(rich.dutyPct).toBeGreaterThanOrEqual(lean.dutyPct * (1 - 1e-12));
          expect(rich.fuelVolumeFlowLPerH).toBeGreaterThanOrEqual(
            lean.fuelVolumeFlowLPerH * (1 - 1e-12),
          );
          // Equal to the larger end's (to rounding: both ends equal when the range is one fuel).
          const same = (x: number, y: number) => expect(Math.abs(x / y - 1)).toBeLessThan(1e-12);
          same(r.injector.dutyPct, Math.max(lean.dutyPct, rich.dutyPct));
          same(r.pump.demandLPerH, Math.max(lean.fuelVolumeFlowLPerH, rich.fuelVolumeFlowLPerH));
        },
      ),
      { numRuns: Number(process.env.FC_RUNS ?? 200) },
    );
  });
});

describe("one figure, one severity (docs/calculations.md §7)", () => {
  it("a duty in the caution band is a caution everywhere: no danger from the ceiling at the design duty", () => {
    const base = sizeFuelSystem(boostedSix);
    // Duty goes with power: scale the target so the worse end sits at 86 % (80–90 % band is
    // caution: calc-spec §3 duty bands, common practice, no source).
    const r = sizeFuelSystem(
      withInput((i) => {
        i.target.powerKw = (450 * 86) / base.injector.dutyPct;
        i.injectors.ratedFlowCcPerMin = 1300;
        i.pumps[0]!.quantity = 4;
      }),
    );
    expect(r.injector.dutyPct).toBeCloseTo(86, 6);
    expect(r.injector.dutyBand).toBe("caution");
    expect(r.powerCeiling.kw).toBeLessThan(r.crankPowerKw);
    expect(r.warnings.filter((w) => w.severity === "danger")).toEqual([]);
    expect(r.warnings.map((w) => w.code)).toContain("injector-duty-caution");
    expect(r.warnings.map((w) => w.code)).not.toContain("ceiling-below-target");
  });

  it("a pump meeting demand with a margin below the minimum gets one caution, not a danger too", () => {
    const big = withInput((i) => (i.injectors.ratedFlowCcPerMin = 4000));
    const base = sizeFuelSystem(big);
    // Supply does not depend on demand (rail + losses at the pump's own flow): scale the
    // target so the margin is 24.6 %, under the 25 % minimum (calc-spec §4, common practice).
    const r = sizeFuelSystem({
      ...big,
      target: { ...big.target, powerKw: (450 * base.pump.marginPct + 45000) / 124.6 },
    });
    expect(r.pump.marginPct).toBeCloseTo(24.6, 6);
    const pumpWarnings = r.warnings.filter((w) =>
      ["pump-short", "pump-margin-low", "ceiling-below-target"].includes(w.code),
    );
    expect(pumpWarnings.map((w) => [w.code, w.severity])).toEqual([["pump-margin-low", "caution"]]);
  });
});

describe("the commanded idle pulse against the minimum pulse (docs/calculations.md §3.6)", () => {
  it("compares effective + dead time, and says which comparison it made", () => {
    // Min 1.2 ms: the opening time at idle (< 1 ms) is below it, the commanded pulse (+ ≈ 0.95
    // ms dead time at 14 V, 400 kPa ΔP, by hand from the fixture's table) is not.
    const r = sizeFuelSystem(withInput((i) => (i.injectors.minPulseWidthMs = 1.2)));
    const idle = r.injector.pulseWidthIdle;
    expect(idle.effectiveMs).toBeLessThan(1.2);
    expect(idle.commandedMs!).toBeGreaterThan(1.2);
    expect(r.warnings.map((w) => w.code)).not.toContain("idle-pulse-short");
    const none = sizeFuelSystem(
      withInput((i) => {
        i.injectors.minPulseWidthMs = 1.2;
        delete i.injectors.deadTime;
      }),
    );
    const w = none.warnings.find((x) => x.code === "idle-pulse-short")!;
    expect(w.message).toContain("opening time");
  });
});

describe("pump curves at their ends (docs/calculations.md §4.2)", () => {
  it("warns, with the figure, when the idle rail lies below the curve's first point", () => {
    const r = sizeFuelSystem(
      withInput((i) => {
        for (const c of i.pumps[0]!.curves) c.points = c.points.slice(1); // first point 500 kPa
      }),
    );
    // Idle rail = 400 + (35 − 101.325) kPa (calc-spec §3, by hand) = 333.675 kPa.
    expect(r.pump.idleRailPressureKpa).toBeCloseTo(333.675, 9);
    const w = r.warnings.find((x) => x.code === "pump-curve-idle-range")!;
    expect(w.params.idleRail!.value).toBeCloseTo(333.675, 9);
    expect(w.params.idleSupply!.value).toBe(r.pump.idleSupplyLPerH);
  });

  it("derates in proportion to the voltage below the lowest tested voltage", () => {
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
      ],
    };
    // Flow ∝ voltage below the tested voltage (common practice, no source): 10/12 × 250.
    const r = pumpFlowLPerH(pump, 450, 10);
    expect(r.flowLPerH).toBeCloseTo((250 * 10) / 12, 9);
    expect(r.voltageOutOfRange).toBe(true);
    // Above the highest tested voltage no gain is credited.
    expect(pumpFlowLPerH(pump, 450, 14).flowLPerH).toBeCloseTo(250, 9);
  });
});
