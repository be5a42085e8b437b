import convert from "convert-units";
import { describe, expect, it } from "vitest";

import { compareKeyFigures, diffInputs, flatten, stableJson } from "@/lib/builds/diff";
import {
  converter,
  convertInputs,
  formatValue,
  fromShown,
  GRAINS_PER_LB,
  KG_PER_LB,
  MG_PER_GRAIN,
  quantityOf,
  toShown,
} from "@/lib/calc";

import { boostedSix } from "../calc/fixtures";

describe("display units", () => {
  it("converts with the exact factors", () => {
    // NIST SP 811 (2008) B.8: 1 psi = 6.894757 kPa; 1 hp (550 ft·lbf/s) = 745.6999 W; 1 in = 25.4 mm; 1 ft = 0.3048 m.
    expect(converter("pressure", "imperial").from(1)).toBeCloseTo(6.894757, 5);
    expect(converter("power", "imperial").from(1)).toBeCloseTo(0.7456999, 6);
    expect(converter("diameter", "imperial").from(1)).toBe(25.4);
    expect(converter("length", "imperial").from(10)).toBeCloseTo(3.048, 10);
    // NIST SP 811 B.9: t/°C = (t/°F − 32)/1.8; water freezes at 32 °F and boils at 212 °F (common practice, no source).
    expect(converter("temperature", "imperial").from(212)).toBeCloseTo(100, 10);
    expect(toShown("temperature", 0, "imperial")).toBe(32);
    // US gallon = 3.785411784 L exactly (NIST SP 811 B.8).
    expect(converter("volumeFlow", "imperial").from(1)).toBeCloseTo(3.785411784, 6);
  });

  it("small masses in grains: 1 gr = 64.79891 mg exactly", () => {
    // 1 grain = 1/7000 lb and 1 lb = 0.45359237 kg, both exact since the international yard and
    // pound agreement of 1959; NIST SP 811 (2008) B.8: grain = 6.479 891 E−05 kg.
    expect(MG_PER_GRAIN * GRAINS_PER_LB).toBeCloseTo(KG_PER_LB * 1_000_000, 6);
    expect(converter("mass", "imperial").from(1)).toBe(64.79891);
    expect(converter("mass", "imperial").to(64.79891)).toBe(1);
    expect(converter("mass", "metric").unit).toBe("mg");
    expect(converter("mass", "imperial").unit).toBe("gr");
    // convert-units has no grain: its pound (453.592 g) times 7000 agrees to five figures.
    expect(converter("mass", "imperial").to(1000)).toBeCloseTo(
      convert(1000).from("mg").to("lb") * 7000,
      3,
    );
    // 42 mg of fuel = 0.648 gr; 184.3 mg of air = 2.844 gr (by hand, ÷ 64.79891).
    expect(formatValue("mass", 42, "imperial")).toBe("0.648 gr");
    expect(formatValue("mass", 184.3, "imperial")).toBe("2.844 gr");
    expect(formatValue("mass", 184.3, "metric")).toBe("184.3 mg");
    // A mass typed in grains is kept to 0.01 mg (one digit more than metric shows) and shows
    // back as typed; a value nobody changed comes back exactly.
    const typed = fromShown("mass", 0.648, "imperial");
    expect(typed).toBe(41.99);
    expect(toShown("mass", typed, "imperial")).toBe(0.648);
    expect(fromShown("mass", toShown("mass", 13.537, "imperial"), "imperial", 13.537)).toBe(13.537);
  });

  it("metric is the canonical form", () => {
    expect(convertInputs(boostedSix, "metric", "toShown")).toEqual(boostedSix);
    expect(converter("pressure", "metric").unit).toBe("kPa");
  });

  it("finds the quantity of array fields", () => {
    expect(quantityOf("pumps.0.curves.1.points.3.flowLPerH")).toBe("volumeFlow");
    expect(quantityOf("injectors.deadTime.pressuresKpa.2")).toBe("pressure");
    expect(quantityOf("injectors.count")).toBe("count");
    expect(quantityOf("pumps.0.label")).toBeUndefined();
  });

  it("a round trip through imperial gives back the exact canonical values when nothing was typed", () => {
    const shown = convertInputs(boostedSix, "imperial", "toShown");
    expect(shown.target.powerKw).not.toBe(boostedSix.target.powerKw);
    expect(convertInputs(shown, "imperial", "toCanonical", boostedSix)).toEqual(boostedSix);
  });

  it("a value typed in imperial converts to canonical", () => {
    const shown = convertInputs(boostedSix, "imperial", "toShown");
    shown.regulator.basePressureKpa = 60; // psi (shown was 58.0)
    const back = convertInputs(shown, "imperial", "toCanonical", boostedSix);
    expect(back.regulator.basePressureKpa).toBeCloseTo(60 * 6.894757, 1); // NIST SP 811 B.8; kept to 0.1 kPa
    expect(back.injectors.count).toBe(boostedSix.injectors.count);
    // AN −8 hose: 11.1 mm typical ID is shown as 0.437 in and comes back as 11.1 mm, not 11.0998.
    const withLine = convertInputs(
      { lines: { feed: { insideDiameterMm: 11.1, lengthM: 5 } } },
      "imperial",
      "toShown",
    );
    expect(withLine.lines.feed.insideDiameterMm).toBe(0.437);
    expect(convertInputs(withLine, "imperial", "toCanonical").lines.feed.insideDiameterMm).toBe(
      11.1,
    );
  });
});

describe("build diffs", () => {
  it("flattens paths and compares independent of key order", () => {
    expect(flatten({ a: { b: [1, { c: 2 }] } })).toEqual({ "a.b.0": 1, "a.b.1.c": 2 });
    expect(stableJson({ b: 1, a: { d: 1, c: 2 } })).toBe(stableJson({ a: { c: 2, d: 1 }, b: 1 }));
  });

  it("lists changed inputs with labels and units", () => {
    const after = {
      ...boostedSix,
      target: { ...boostedSix.target, powerKw: 500 },
      injectors: { ...boostedSix.injectors, count: 8 },
    };
    const ch = diffInputs(boostedSix, after, "metric");
    expect(ch.map((c) => c.label)).toEqual(["Target power", "Injector count"]); // in the sheet's order
    expect(ch.find((c) => c.label === "Target power")).toMatchObject({ after: "500 kW" });
    // Counts are whole numbers, without a unit.
    expect(ch.find((c) => c.label === "Injector count")).toMatchObject({ before: "6", after: "8" });
    // 500 kW / 0.7456999 kW/hp = 670.5 hp (NIST SP 811 B.8), to the nearest hp.
    expect(diffInputs(boostedSix, after, "imperial")[0]).toMatchObject({ after: "671 hp" });
    expect(diffInputs(boostedSix, boostedSix, "imperial")).toEqual([]);
  });

  it("marks the key figures that changed", () => {
    const r = {
      blend: { rich: { dutyPct: 80 } },
      injector: { requiredRatedFlowCcPerMin: 900 },
      pump: { demandLPerH: 300, supplyLPerH: 400, marginPct: 33, railPressureKpa: 450 },
      powerCeiling: { kw: 600 },
    };
    const r2 = { ...r, blend: { rich: { dutyPct: 92 } } };
    const figs = compareKeyFigures(r as never, r2 as never, "metric");
    expect(figs.filter((f) => f.changed).map((f) => [f.label, f.verdict])).toEqual([
      ["Injector duty at the highest ethanol", "worse"], // higher duty: less headroom
    ]);
    const r3 = { ...r, pump: { ...r.pump, supplyLPerH: 450, marginPct: 50 } };
    const better = compareKeyFigures(r as never, r3 as never, "imperial").filter((f) => f.changed);
    expect(better.map((f) => [f.label, f.verdict])).toEqual([
      ["Pump supply", "better"],
      ["Pump margin", "better"],
    ]);
    // 400 L/h = 105.7 US gal/h (1 US gal = 3.785411784 L, NIST SP 811 B.8).
    expect(better[0]).toMatchObject({ before: "105.7 gal/h", after: "118.9 gal/h" });
    expect(compareKeyFigures(null, r as never, "metric")[0]).toMatchObject({
      before: "—",
      changed: true,
    });
  });
});
