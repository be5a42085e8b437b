import { describe, expect, it } from "vitest";

import {
  CalcInputError,
  demandAtBoostLPerH,
  FuelSystemInputSchema,
  sizeFuelSystem,
  supplyAgainstBoost,
  type FuelSystemInput,
  type Pump,
} from "@/lib/calc";

import { boostedSix } from "./fixtures";

/** Made-up pumps (inputs, not check values): flat curves make the sums easy to follow. */
const flat = (flowLPerH: number): Pump["curves"] => [
  {
    voltage: 13,
    points: [
      { pressureKpa: 0, flowLPerH },
      { pressureKpa: 1000, flowLPerH },
    ],
  },
];

describe("staged or mixed pumps: supply against demand over the boost range (docs/calculations.md §4.4)", () => {
  it("demand below full boost goes with the manifold's absolute pressure", () => {
    // 300 L/h at 150 kPa boost, 100 kPa ambient; at 50 kPa boost: 300 × 150 ÷ 250 = 180 L/h
    // (air in proportion to manifold density; common practice, no source).
    expect(
      demandAtBoostLPerH({
        demandAtFullBoostLPerH: 300,
        boostKpa: 50,
        maxBoostKpa: 150,
        ambientKpaAbs: 100,
      }),
    ).toBeCloseTo(180, 9);
    expect(() =>
      demandAtBoostLPerH({ demandAtFullBoostLPerH: 300, boostKpa: 200, maxBoostKpa: 150 }),
    ).toThrow(CalcInputError);
  });

  it("a second stage adds its flow from its switch-on boost, with a point either side", () => {
    const s = supplyAgainstBoost({
      pumps: [
        { quantity: 1, curves: flat(200) },
        { quantity: 1, curves: flat(150), switchOnBoostKpa: 60 },
      ],
      voltage: 13,
      regulator: { type: "boost-referenced", basePressureKpa: 300 },
      maxBoostKpa: 100,
      ambientKpaAbs: 100,
      demandAtFullBoostLPerH: 300,
      lossesKpa: 10,
      points: 3,
    });
    expect(s.map((p) => [p.boostKpa, p.pumpsOn, p.supplyLPerH])).toEqual([
      [0, 1, 200],
      [50, 1, 200],
      [60, 1, 200],
      [60, 2, 350],
      [100, 2, 350],
    ]);
    // Just before the stage: demand 300 × 160 ÷ 200 = 240 L/h, margin 200 ÷ 240 − 1 = −16.7 %.
    expect(s[2]!.demandLPerH).toBeCloseTo(240, 9);
    expect(s[2]!.marginPct).toBeCloseTo(-16.67, 2);
    // Outlet = rail (base + boost) + losses: 300 + 60 + 10.
    expect(s[3]!.outletKpa).toBe(370);
  });

  const staged = (switchOnBoostKpa: number | undefined): FuelSystemInput => ({
    ...boostedSix,
    pumps: [
      { label: "lift pump", quantity: 1, curves: flat(260) },
      { label: "second stage", quantity: 1, curves: flat(260), switchOnBoostKpa },
    ],
  });

  it("takes the pump margin where it is worst: just before a late second stage", () => {
    const always = sizeFuelSystem(staged(undefined));
    // Two pumps always on: worst at full boost, as before staging existed.
    expect(always.pump.marginPct).toBe(always.pump.fullLoadMarginPct);
    expect(always.pump.worstMarginBoostKpa).toBe(150);

    const late = sizeFuelSystem(staged(120));
    expect(late.pump.fullLoadMarginPct).toBeCloseTo(always.pump.fullLoadMarginPct, 9);
    expect(late.pump.worstMarginBoostKpa).toBe(120);
    expect(late.pump.marginPct).toBeLessThan(late.pump.fullLoadMarginPct);
    const worst = late.pump.supplyVsBoost.find((p) => p.boostKpa === 120 && p.pumpsOn === 1)!;
    expect(late.pump.marginPct).toBe(worst.marginPct);
    const step = late.trace.find((t) => t.id === "pump-margin-worst")!;
    expect(step.value).toBe(worst.marginPct);
    const w = late.warnings.find((x) => x.code === "pump-short" || x.code === "pump-margin-low")!;
    expect(w.params.boost!.value).toBe(120);
    // One severity for the one figure: no second pump warning.
    expect(
      late.warnings.filter((x) => x.code === "pump-short" || x.code === "pump-margin-low"),
    ).toHaveLength(1);
  });

  it("at idle only the first stage runs, so the return line carries less", () => {
    const always = sizeFuelSystem(staged(undefined));
    const early = sizeFuelSystem(staged(20));
    expect(early.pump.idleSupplyLPerH).toBeCloseTo(always.pump.idleSupplyLPerH / 2, 9);
    expect(early.pump.idleReturnFlowLPerH).toBeLessThan(always.pump.idleReturnFlowLPerH);
  });

  it("mixed models add their flows at one pressure", () => {
    const r = sizeFuelSystem({
      ...boostedSix,
      pumps: [
        { quantity: 1, curves: flat(200) },
        { quantity: 2, curves: flat(90) },
      ],
    });
    expect(r.pump.supplyLPerH).toBeCloseTo(380, 9);
  });

  it("warns of a stage that never switches on, and refuses a system with no pump always on", () => {
    const r = sizeFuelSystem(staged(300));
    expect(r.warnings.map((w) => w.code)).toContain("pump-stage-never-on");
    const bad = {
      ...boostedSix,
      pumps: [{ quantity: 1, curves: flat(300), switchOnBoostKpa: 10 }],
    };
    const parsed = FuelSystemInputSchema.safeParse(bad);
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues[0]!.path.join(".")).toBe("pumps.0.switchOnBoostKpa");
  });
});
