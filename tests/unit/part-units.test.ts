import { describe, expect, it } from "vitest";

import { DEMO_PARTS } from "@/db/seed-catalog";
import { partCanonical, partFieldMessage, partHints, partShown } from "@/lib/parts/part-units";
import { checkSpecs, flatOf, FlatPartSchema, type FlatPart } from "@/lib/validations/parts";

/** A demo part as the form loads it: canonical text (the CSV's columns). */
const flat = (p: (typeof DEMO_PARTS)[number]): FlatPart =>
  flatOf({ ...p, leadTimeDays: p.leadTimeDays ?? null, restockOn: null });

/** An injector with a dead-time table, as the edit form would load it (invented figures). */
const INJECTOR: FlatPart = {
  sku: "T-INJ-1",
  category: "injector",
  brand: "Testbrand",
  name: "Test injector",
  price: "99.00",
  stock: "4",
  flow_cc_min: "1000",
  rated_kpa: "300",
  test_fluid_kg_l: "0.684",
  ethanol_ok: "yes",
  dead_time_ms: "12V 300:1.1 500:1.2 | 14V 300:0.85 500:0.95",
};

describe("the part form in the viewer's units", () => {
  it("shows flows, pressures and tables in imperial units", () => {
    const shown = partShown(INJECTOR, "imperial");
    // 1000 cc/min of the 0.72 kg/L test fluid = 95.2 lb/h (registry); 300 kPa = 43.5 psi,
    // 500 kPa = 72.5 psi (1 psi = 6.894757 kPa, NIST SP 811 B.8); 0.684 kg/L = 5.71 lb/gal
    // (1 lb/gal = 0.119826 kg/L, NIST SP 811 B.8).
    expect(shown).toMatchObject({
      flow_cc_min: "95.2",
      rated_kpa: "43.5",
      test_fluid_kg_l: "5.71",
      dead_time_ms: "12V 43.5:1.1 72.5:1.2 | 14V 43.5:0.85 72.5:0.95",
    });
    expect(partShown(INJECTOR, "metric")).toEqual(INJECTOR);
  });

  it("an unchanged form sends exactly what it loaded, for every demo part", () => {
    for (const p of [...DEMO_PARTS.map(flat), INJECTOR])
      expect(partCanonical(partShown(p, "imperial"), p, "imperial"), p.sku).toEqual(p);
  });

  it("a changed field converts back; the cells left as shown keep their exact numbers", () => {
    const shown = partShown(INJECTOR, "imperial");
    const sent = partCanonical(
      {
        ...shown,
        rated_kpa: "58",
        dead_time_ms: "12V 43.5:1.1 72.5:1.25 | 14V 43.5:0.85 72.5:0.95",
      },
      INJECTOR,
      "imperial",
    );
    // 58 psi = 399.896 kPa (NIST SP 811 B.8), kept to one digit more than kPa shows.
    expect(sent.rated_kpa).toBe("399.9");
    expect(sent.flow_cc_min).toBe("1000");
    expect(sent.dead_time_ms).toBe("12V 300:1.1 500:1.25 | 14V 300:0.85 500:0.95");
    // What is sent is a valid part.
    expect(FlatPartSchema.safeParse(sent).success).toBe(true);
  });

  it("a pump curve typed in psi and gal/h is stored in kPa and L/h", () => {
    const pump = flat(DEMO_PARTS.find((p) => p.category === "pump")!);
    const sent = partCanonical({ ...pump, pump_curve: "13.5V 43.5:80 60:70" }, pump, "imperial");
    // 80 gal/h = 302.83 L/h, 70 gal/h = 264.98 L/h (1 gal = 3.785411784 L), 60 psi = 413.69 kPa
    // (NIST SP 811 B.8); 43.5 psi is how the loaded 300 kPa at that place was shown: kept exact.
    const m = /^13\.5V ([\d.]+):([\d.]+) ([\d.]+):([\d.]+)$/.exec(sent.pump_curve!)!;
    expect(pump.pump_curve).toMatch(/^13\.5V 300:/);
    expect(m[1]).toBe("300");
    expect(Number(m[2])).toBeCloseTo(302.83, 1);
    expect(Number(m[3])).toBeCloseTo(413.69, 1);
    expect(Number(m[4])).toBeCloseTo(264.98, 1);
  });

  it("text that is no number is sent as typed for the server to refuse", () => {
    const sent = partCanonical(
      { ...partShown(INJECTOR, "imperial"), flow_cc_min: "lots", dead_time_ms: "fast" },
      INJECTOR,
      "imperial",
    );
    expect(sent).toMatchObject({ flow_cc_min: "lots", dead_time_ms: "fast" });
  });

  it("the server's messages for these fields are said in the viewer's units", () => {
    const bad = checkSpecs("injector", {
      ratedFlowCcPerMin: 5,
      ratedPressureKpa: 300,
      ethanolOk: true,
    });
    expect(bad.ok).toBe(false);
    const issue = !bad.ok ? bad.issues[0]! : null;
    expect(issue!.path).toBe("flow_cc_min");
    // 20–10000 cc/min = 1.9–952.4 lb/h (registry, 0.72 kg/L).
    expect(partFieldMessage(issue!.path, issue!.message, "imperial")).toBe(
      "Rated flow must be a number between 1.9 and 952.4 lb/h",
    );
    expect(
      partFieldMessage("dead_time_ms", "dead_time_ms needs a table like … (kPa:ms)", "imperial"),
    ).toContain("(psi:ms)");
    // A message with nothing to convert stays.
    expect(
      partFieldMessage("max_kpa", "The highest pressure must not be below the lowest", "imperial"),
    ).toBe("The highest pressure must not be below the lowest");
    expect(partHints("imperial").pump_curve).toMatch(/\(psi:gal\/h\)$/);
    expect(partHints("metric").pump_curve).toBe(
      "e.g. 13.5V 300:340 500:290 | 12V 300:300 (kPa:L/h)",
    );
  });
});
