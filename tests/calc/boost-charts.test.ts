import { describe, expect, it } from "vitest";

import {
  fuelPressureChart,
  FuelSystemInputSchema,
  niceTicks,
  pumpBoostChart,
  sizeParsedFuelSystem,
  type FuelSystemInput,
  type FuelSystemResult,
  type Pump,
} from "@/lib/calc";

import { boostedSix, naFour } from "./fixtures";

const size = (raw: FuelSystemInput) => sizeParsedFuelSystem(FuelSystemInputSchema.parse(raw));

/** Made-up pumps (inputs, not check values): a flat curve supplies its flow at any pressure. */
const flat = (flowLPerH: number): Pump["curves"] => [
  {
    voltage: 13,
    points: [
      { pressureKpa: 0, flowLPerH },
      { pressureKpa: 1000, flowLPerH },
    ],
  },
];

/** Every number anywhere in a chart's data (rows, axes, marker). */
const numbers = (x: unknown): number[] =>
  typeof x === "number"
    ? [x]
    : Array.isArray(x)
      ? x.flatMap(numbers)
      : x && typeof x === "object"
        ? Object.values(x).flatMap(numbers)
        : [];

describe("round ticks for the charts' axes", () => {
  it("steps of 1, 2, 2.5 or 5 × 10ⁿ from 0, never NaN", () => {
    // Round-number axis steps (common practice, no source).
    expect(niceTicks(0, 43.5)).toEqual({ ticks: [0, 20, 40], step: 20, decimals: 0 });
    expect(niceTicks(0, 14.5).ticks).toEqual([0, 5, 10]);
    expect(niceTicks(0, 101.5, 5, true).ticks).toEqual([0, 50, 100, 150]);
    expect(niceTicks(0, 9, 5, true)).toEqual({
      ticks: [0, 2.5, 5, 7.5, 10],
      step: 2.5,
      decimals: 1,
    });
    // Nothing to span (all values 0), or no number at all: the ticks of 0…1.
    expect(niceTicks(0, 0).ticks).toEqual([0, 0.25, 0.5, 0.75, 1]);
    expect(niceTicks(Number.NaN, Number.POSITIVE_INFINITY).ticks).toEqual([0, 0.25, 0.5, 0.75, 1]);
  });
});

describe("fuel pressure against boost, as the build sheet and the spec sheet draw it (docs/calculations.md §3.8)", () => {
  // Worked example: a 1:4 rising-rate regulator at 3 bar base and 1 bar boost holds a 7 bar rail,
  // 6 bar across the injector (docs/calculations.md §3.8: regulator ratio arithmetic, common
  // practice, no source). psi by 1 psi = 6.894757 kPa (NIST SP 811, B.8).
  const rr = size({
    ...boostedSix,
    engine: { ...boostedSix.engine, maxBoostKpa: 100 },
    regulator: { type: "boost-referenced", basePressureKpa: 300, risingRateRatio: 4 },
  });

  it("metric: rail 300 → 700 kPa, across the injector 300 → 600 kPa, manifold 0 → 100 kPa", () => {
    const c = fuelPressureChart(rr, "metric");
    expect(c.title).toBe("Fuel pressure against boost");
    expect(c.rows).toEqual([
      { x: 0, rail: 300, manifold: 0, across: 300 },
      { x: 100, rail: 700, manifold: 100, across: 600 },
    ]);
    expect(c.lines.map((l) => l.label)).toEqual(["rail", "across the injector", "manifold"]);
    expect([c.x.unit, c.y.unit]).toEqual(["kPa", "kPa"]);
    expect([c.x.min, c.x.max]).toEqual([0, 100]);
    expect(c.y.ticks.at(-1)).toBeGreaterThanOrEqual(700);
    expect(c.drawable).toBe(true);
    expect(c.summary).toBe(
      "With a rising-rate regulator 1:4.0, at 100 kPa boost the rail holds 700 kPa and the injectors see 600 kPa across them",
    );
  });

  it("imperial: the same lines in psi (43.5 → 101.5, 43.5 → 87.0, 0 → 14.5), ticks in psi", () => {
    const c = fuelPressureChart(rr, "imperial");
    // 300 kPa = 43.5 psi, 700 kPa = 101.5 psi, 600 kPa = 87.0 psi, 100 kPa = 14.5 psi (NIST SP 811).
    expect(c.rows).toEqual([
      { x: 0, rail: 43.5, manifold: 0, across: 43.5 },
      { x: 14.5, rail: 101.5, manifold: 14.5, across: 87 },
    ]);
    expect([c.x.unit, c.y.unit]).toEqual(["psi", "psi"]);
    expect(c.x.ticks).toEqual([0, 5, 10]);
    expect(c.y.ticks).toEqual([0, 50, 100, 150]);
  });

  it("a fixed regulator: the rail stays, the pressure across the injector falls by the boost", () => {
    // 400 kPa fixed at 150 kPa boost: rail 400, across 250 (docs/calculations.md §3.2; by hand).
    const c = fuelPressureChart(
      size({ ...boostedSix, regulator: { type: "fixed", basePressureKpa: 400 } }),
      "metric",
    );
    expect(c.rows.at(-1)).toEqual({ x: 150, rail: 400, manifold: 150, across: 250 });
    expect(c.summary).toMatch(/^With a fixed regulator, at 150 kPa boost/);
  });

  it("no boost range (naturally aspirated): nothing to draw, one sentence, no NaN", () => {
    for (const units of ["metric", "imperial"] as const) {
      const c = fuelPressureChart(size(naFour), units);
      expect(c.drawable).toBe(false);
      expect(c.rows).toHaveLength(1);
      expect(c.summary).toMatch(/^No boost range: with a fixed regulator the rail holds [\d.]+ /);
      expect(numbers(c).every(Number.isFinite)).toBe(true);
      expect(JSON.stringify(c)).not.toMatch(/NaN|Infinity|—/);
    }
  });
});

describe("pump supply and demand against boost, as the build sheet and the spec sheet draw it (docs/calculations.md §4.4)", () => {
  // Worked example: a 200 L/h pump always on and a 150 L/h second stage from 60 kPa boost, 150 kPa
  // full boost, 100 kPa ambient. Demand below full boost = demand at full boost × (100 + boost) ÷
  // 250 (docs/calculations.md §4.4: air in proportion to manifold density; common practice, no
  // source); the supply steps from 200 to 350 L/h at 60 kPa.
  const r = size({
    ...boostedSix,
    engine: { ...boostedSix.engine, ambientKpaAbs: 100 },
    pumps: [
      { quantity: 1, curves: flat(200) },
      { quantity: 1, curves: flat(150), switchOnBoostKpa: 60 },
    ],
  });
  const full = r.pump.demandLPerH;

  it("metric: the supply steps at the stage, demand rises with the manifold's absolute pressure", () => {
    const c = pumpBoostChart(r, "metric");
    expect(c.title).toBe("Pump supply and demand against boost");
    expect(c.rows.map((p) => p.x)).toEqual([0, 30, 60, 60, 90, 120, 150]);
    expect(c.rows.map((p) => p.supply)).toEqual([200, 200, 200, 350, 350, 350, 350]);
    for (const p of c.rows) expect(p.demand).toBe(Math.round((full * (100 + p.x)) / 250));
    expect(c.lines.map((l) => l.label)).toEqual(["supply", "demand"]);
    expect([c.x.unit, c.y.unit]).toEqual(["kPa", "L/h"]);
    // The least margin is just before the second stage: 200 L/h against 0.64 × demand at full boost.
    expect(full * 0.64).toBeGreaterThan(200 / 1.25);
    expect(c.marker).toEqual({ x: 60, label: "least margin" });
    expect(c.summary).toMatch(/^The pump margin is at its lowest, -?\d+ %, at 60 kPa boost$/);
  });

  it("imperial: gal/h and psi (200 L/h = 52.8 gal/h, 350 L/h = 92.5 gal/h, 60 kPa = 8.7 psi)", () => {
    // 1 US gal = 3.785411784 L, 1 psi = 6.894757 kPa (NIST SP 811, B.8).
    const c = pumpBoostChart(r, "imperial");
    expect(c.rows.map((p) => p.supply)).toEqual([52.8, 52.8, 52.8, 92.5, 92.5, 92.5, 92.5]);
    expect(c.rows.map((p) => p.x)).toEqual([0, 4.4, 8.7, 8.7, 13.1, 17.4, 21.8]);
    expect(c.marker).toEqual({ x: 8.7, label: "least margin" });
    expect([c.x.unit, c.y.unit]).toEqual(["psi", "gal/h"]);
    expect(c.y.ticks.at(-1)).toBeGreaterThanOrEqual(92.5);
  });

  it("no boost range, or no supply series at all: nothing drawn, a sentence, no NaN", () => {
    const na = size(naFour);
    const noSeries: FuelSystemResult = {
      ...na,
      pump: { ...na.pump, supplyVsBoost: [] },
      regulator: { ...na.regulator, pressureVsBoost: [] },
    };
    for (const units of ["metric", "imperial"] as const) {
      const c = pumpBoostChart(na, units);
      expect(c.drawable).toBe(false);
      expect(c.marker).toBeNull();
      expect(c.summary).toMatch(/^No boost range: the pumps supply [\d.]+ /);
      const none = pumpBoostChart(noSeries, units);
      expect(none.summary).toBe("No pump supply worked out for this build");
      expect(fuelPressureChart(noSeries, units).summary).toBe(
        "No fuel pressure worked out for this build",
      );
      for (const x of [c, none, fuelPressureChart(noSeries, units)]) {
        expect(numbers(x).every(Number.isFinite)).toBe(true);
        expect(JSON.stringify(x)).not.toMatch(/NaN|Infinity|—/);
      }
    }
  });
});
