import { describe, expect, it } from "vitest";
import { z } from "zod";

import { newBuildInputs } from "@/lib/builds/defaults";
import {
  formatLabelled,
  formatResult,
  formatTraceStep,
  formatValue,
  formatWarning,
  FuelSystemInputSchema,
  INPUT_FIELDS,
  inputField,
  issueMessage,
  issueMessages,
  KEY_FIGURES,
  QUANTITIES,
  RESULT_FIELDS,
  resultField,
  sizeFuelSystem,
  type FuelSystemInput,
  type FuelSystemResult,
  type UnitSystem,
} from "@/lib/calc";

import { boostedSix, naFour } from "../calc/fixtures";

/**
 * A figure printed in a unit of one system only: a number, then the unit (the imperial ones are
 * never printed in metric, and back). "m" and "in" count only after a number: they are words too.
 */
const METRIC_ONLY = /\d\s?(kPa|kW|cc\/min|L\/h|g\/min|g\/kWh|kg\/L|mm|m\/s|m|L|bar|°C|mg)(?![\w/])/;
const IMPERIAL_ONLY =
  /\d\s?(psi|psia|hp|lb\/h|gal\/h|gal|lb\/hp\/h|lb\/gal|cu in|in|ft|ft\/s|°F|gr)(?![\w/])/;

/** Leaves of a JSON Schema by dotted path (array items as `*`), with their node. */
function schemaLeaves(
  node: Record<string, unknown>,
  path = "",
  out = new Map<string, Record<string, unknown>>(),
) {
  const props = node.properties as Record<string, Record<string, unknown>> | undefined;
  const items = node.items as Record<string, unknown> | undefined;
  const alts = (node.anyOf ?? node.oneOf) as Record<string, unknown>[] | undefined;
  if (props)
    for (const [k, v] of Object.entries(props)) schemaLeaves(v, path ? `${path}.${k}` : k, out);
  else if (items) schemaLeaves(items, `${path}.*`, out);
  else if (alts) for (const a of alts) schemaLeaves(a, path, out);
  else out.set(path, node);
  return out;
}

/** Every leaf of a value by dotted path, array indices as digits. */
function leaves(value: unknown, path = "", out: [string, unknown][] = []): [string, unknown][] {
  if (Array.isArray(value))
    value.forEach((v, i) => leaves(v, path ? `${path}.${i}` : String(i), out));
  else if (value && typeof value === "object")
    for (const [k, v] of Object.entries(value)) leaves(v, path ? `${path}.${k}` : k, out);
  else out.push([path, value]);
  return out;
}

const variant = (base: FuelSystemInput, patch: (i: FuelSystemInput) => void) => {
  const c = structuredClone(base);
  patch(c);
  return c;
};

/**
 * Builds that between them reach every branch of the result: dead-time table or none, wiring,
 * a fixed regulator under boost, both lines and none, a static injector, a short pump, crank
 * power, a given BSFC, a flex range (inputs made up for the test; no check values).
 */
const FIXTURES: [string, FuelSystemInput][] = [
  ["boosted six", boostedSix],
  ["NA four", naFour],
  ["new build defaults", newBuildInputs()],
  [
    "fixed regulator, wiring, given BSFC",
    variant(boostedSix, (i) => {
      i.regulator = { type: "fixed", basePressureKpa: 450 };
      i.fuel.bsfcGPerKwh = 480;
      i.electrical.wiring = { sourceVoltage: 14, gaugeAwg: 16, roundTripLengthM: 9, currentA: 18 };
      i.lines = { feed: { insideDiameterMm: 5.6, lengthM: 6, fittingsK: 3 } };
    }),
  ],
  [
    "static injectors, short pump",
    variant(naFour, (i) => {
      i.target.powerKw = 600;
      i.injectors.minPulseWidthMs = 3;
    }),
  ],
];
const results: [string, FuelSystemResult][] = FIXTURES.map(([n, i]) => [n, sizeFuelSystem(i)]);

describe("the registry of fields", () => {
  const json = z.toJSONSchema(FuelSystemInputSchema, { io: "input", unrepresentable: "any" });
  const inputLeaves = schemaLeaves(json as Record<string, unknown>);

  it("finds the schema's inputs (the walk itself works)", () => {
    expect(inputLeaves.size).toBeGreaterThan(40);
    expect(inputLeaves.has("pumps.*.curves.*.points.*.flowLPerH")).toBe(true);
    expect(inputLeaves.has("injectors.deadTime.deadTimeMs.*.*")).toBe(true);
  });

  it("has an entry for every input path of the sizing schema: a label, and a quantity, code labels or text", () => {
    const missing: string[] = [];
    for (const [path, node] of inputLeaves) {
      const f = INPUT_FIELDS[path];
      if (!f?.label) {
        missing.push(`${path}: no entry`);
        continue;
      }
      if (node.type === "number" || node.type === "integer") {
        if (!f.quantity || !QUANTITIES[f.quantity]) missing.push(`${path}: no quantity`);
      } else if (Array.isArray(node.enum)) {
        for (const code of node.enum as string[])
          if (!f.options?.[code]) missing.push(`${path}: no label for "${code}"`);
      } else if (node.type === "string") {
        if (!f.text) missing.push(`${path}: not marked as text`);
      } else missing.push(`${path}: unknown kind ${JSON.stringify(node)}`);
    }
    expect(missing).toEqual([]);
  });

  it("has no leaf entry the schema does not have (groups may name a message's field)", () => {
    const groups = new Set<string>();
    for (const p of inputLeaves.keys()) {
      const parts = p.split(".");
      for (let i = 1; i < parts.length; i++) groups.add(parts.slice(0, i).join("."));
    }
    const stale = Object.keys(INPUT_FIELDS).filter((k) => !inputLeaves.has(k) && !groups.has(k));
    expect(stale).toEqual([]);
  });

  it("has an entry for every figure of a sizing result, for every fixture build", () => {
    const missing = new Set<string>();
    let numbers = 0;
    for (const [name, r] of results) {
      for (const [path, value] of leaves(r)) {
        if (path.startsWith("warnings.") || path.startsWith("trace.")) continue;
        const f = resultField(path);
        if (!f) {
          missing.add(`${path} (${name})`);
          continue;
        }
        if (typeof value === "number") {
          numbers++;
          if (!f.quantity || !QUANTITIES[f.quantity]) missing.add(`${path}: no quantity`);
        } else if (typeof value === "string" && !f.text && !f.options?.[value])
          missing.add(`${path}: no label for "${value}"`);
        else if (typeof value === "boolean" && !f.flag) missing.add(`${path}: not a flag`);
      }
    }
    expect([...missing]).toEqual([]);
    expect(numbers).toBeGreaterThan(5 * 60);
  });

  it("knows the key figures compare shows and which way each is better", () => {
    for (const p of KEY_FIGURES) expect(RESULT_FIELDS[p]?.quantity, p).toBeDefined();
    expect(RESULT_FIELDS["pump.marginPct"]!.better).toBe("higher");
    expect(RESULT_FIELDS["blend.rich.dutyPct"]!.better).toBe("lower");
    expect(RESULT_FIELDS["powerCeiling.kw"]!.better).toBe("higher");
  });

  it("names indexed fields by their position, and codes by their labels", () => {
    expect(inputField("pumps.0.curves.1.points.2.flowLPerH")).toMatchObject({
      label: "Pump 1 curve 2 point 3 flow",
      short: "Point 3 flow",
      quantity: "volumeFlow",
    });
    expect(inputField("injectors.deadTime.deadTimeMs.0.1")?.label).toBe(
      "Dead time at row 1, column 2",
    );
    expect(inputField("engine.aspiration")?.options?.turbo).toBe("Turbocharged");
    expect(inputField("engine.idleManifoldKpaAbs")?.label).toBe("Idle manifold pressure");
  });
});

describe("warnings and working steps carry their figures as data", () => {
  const placeholders = (t: string) => [...t.matchAll(/\{(\w+)\}/g)].map((m) => m[1]!);

  it("every figure of a warning or step has a quantity, and every template place a figure", () => {
    const problems: string[] = [];
    let warnings = 0;
    for (const [name, r] of results) {
      for (const w of r.warnings) {
        warnings++;
        for (const [k, f] of Object.entries(w.params))
          if (!QUANTITIES[f.quantity]) problems.push(`${name} ${w.code}.${k}: ${f.quantity}`);
        for (const p of [...placeholders(w.message), ...placeholders(w.fix ?? "")])
          if (!w.params[p]) problems.push(`${name} ${w.code}: no figure for {${p}}`);
      }
      for (const s of r.trace) {
        if (!QUANTITIES[s.quantity]) problems.push(`${name} ${s.id}: ${s.quantity}`);
        for (const i of s.inputs)
          if (!QUANTITIES[i.quantity]) problems.push(`${name} ${s.id} ${i.label}: ${i.quantity}`);
        for (const p of placeholders(s.label))
          if (!s.params?.[p]) problems.push(`${name} ${s.id}: no figure for {${p}}`);
      }
    }
    expect(problems).toEqual([]);
    expect(warnings).toBeGreaterThan(10);
  });

  const texts = (r: FuelSystemResult, units: UnitSystem) => [
    ...r.warnings.flatMap((w) => {
      const f = formatWarning(w, units);
      return [f.message, f.fix ?? ""];
    }),
    ...r.trace.flatMap((s) => {
      const f = formatTraceStep(s, units);
      return [`${f.label} = ${f.value}`, f.formula, ...f.inputs];
    }),
  ];

  it("read in imperial units they carry no metric unit; in metric no imperial one", () => {
    // Not vacuous: each system's own units are there.
    expect(results.flatMap(([, r]) => texts(r, "imperial")).join(" ")).toMatch(IMPERIAL_ONLY);
    expect(results.flatMap(([, r]) => texts(r, "metric")).join(" ")).toMatch(METRIC_ONLY);
    for (const [name, r] of results) {
      for (const t of texts(r, "imperial")) expect(t, name).not.toMatch(METRIC_ONLY);
      for (const t of texts(r, "metric")) expect(t, name).not.toMatch(IMPERIAL_ONLY);
      for (const t of [...texts(r, "imperial"), ...texts(r, "metric")])
        expect(t).not.toMatch(/[{}]/);
    }
  });

  it("says displacement in cu in and air and fuel per injection in grains to an imperial reader", () => {
    // 5.7 L = 347.8 cu in (1 in³ = 16.387064 cm³ exactly, NIST SP 811 B.8).
    expect(formatValue("displacement", 5.7, "imperial")).toBe("348 cu in");
    expect(formatValue("displacement", 5.7, "metric")).toBe("5.7 L");
    expect(inputField("engine.displacementL")?.quantity).toBe("displacement");
    expect(texts(results[0]![1], "metric").join("\n")).toMatch(/fuel per injection \d+\.\d\d mg/);
    expect(texts(results[0]![1], "metric").join("\n")).toMatch(/air per cylinder \d+\.\d mg/);
    // In grains, three decimals: three significant figures for tens of mg of fuel.
    const imperial = texts(results[0]![1], "imperial").join("\n");
    expect(imperial).toMatch(/fuel per injection 0\.\d{3} gr/);
    expect(imperial).toMatch(/air per cylinder \d+\.\d{3} gr/);
    // … and the working's constant is the grain's: 1 lb/h = 7000 gr per 3 600 000 ms, so one grain
    // takes 514.3 ms (1 lb = 7000 gr, international yard and pound agreement of 1959).
    expect(imperial).toContain("× 514.3 (ms per gr at 1 lb/h)");
    // The registry's figure: 13.54 mg in metric (its own two decimals), 0.209 gr in imperial.
    expect(formatResult("injector.pulseWidthIdle.fuelPerInjectionMg", 13.54, "metric")).toBe(
      "13.54 mg",
    );
    expect(formatResult("injector.pulseWidthIdle.fuelPerInjectionMg", 13.54, "imperial")).toBe(
      "0.209 gr",
    );
  });

  it("prints counts as whole numbers and figures at their precision", () => {
    const r = results[0]![1];
    const step = formatTraceStep(
      r.trace.find((s) => s.id === "duty-rich")!,
      "metric",
    );
    expect(step.inputs).toContain("injectors 6");
    expect(step.label).toBe("Injector duty at E85");
    const dp = formatTraceStep(
      r.trace.find((s) => s.id === "injector-dp")!,
      "imperial",
    );
    // 400 kPa = 58.0 psi (NIST SP 811 B.8: 1 psi = 6.894757 kPa).
    expect(dp.inputs).toContain("base pressure 58.0 psi");
    expect(formatValue("count", 6, "imperial")).toBe("6");
    expect(formatValue("anDash", 8, "metric")).toBe("−8 AN");
  });

  it("never says lambda twice in a working step: the label names it, the figure is bare", () => {
    let lambdas = 0;
    for (const [name, r] of results)
      for (const units of ["metric", "imperial"] as const)
        for (const s of r.trace)
          for (const i of formatTraceStep(s, units).inputs) {
            if (/lambda/i.test(i)) lambdas++;
            expect(i, `${name} ${s.id}`).not.toMatch(/lambda\s*λ/i);
          }
    expect(lambdas).toBeGreaterThan(0); // not vacuous: some step names a lambda
    const bsfc = results
      .flatMap(([, r]) => r.trace)
      .find((s) => s.id === "bsfc-rich" && s.inputs.some((i) => i.label === "reference lambda"));
    expect(bsfc).toBeDefined();
    for (const units of ["metric", "imperial"] as const) {
      const inputs = formatTraceStep(bsfc!, units).inputs;
      // The library's boosted reference lambda, 0.80 (lib/calc/power.ts; common practice, no source).
      expect(
        inputs.some((i) => /^reference lambda 0\.\d\d$/.test(i)),
        inputs.join(" | "),
      ).toBe(true);
      expect(
        inputs.some((i) => /^target lambda 0\.\d\d$/.test(i)),
        inputs.join(" | "),
      ).toBe(true);
    }
    // A label that does not name the quantity keeps its sign; a prefix that is part of the
    // figure (E85) always stays.
    expect(formatLabelled("reference lambda", "lambda", 0.8, "metric")).toBe(
      "reference lambda 0.80",
    );
    expect(formatLabelled("target", "lambda", 0.8, "imperial")).toBe("target λ 0.80");
    expect(formatLabelled("ethanol content", "ethanol", 85, "metric")).toBe("ethanol content E85");
  });

  it("says the imperial formula where the metric one hides a unit constant", () => {
    const r = results[0]![1];
    const mass = r.trace.find((s) => s.id === "fuel-mass-rich")!;
    expect(formatTraceStep(mass, "metric").formula).toBe("crank power × BSFC ÷ 60");
    expect(formatTraceStep(mass, "imperial").formula).toBe("crank power × BSFC");
    // The rating fluid only the imperial formula needs: 0.72 kg/L = 6.01 lb/US gal
    // (0.72 × 3.785411784 / 0.45359237, NIST SP 811 B.8).
    const duty = r.trace.find((s) => s.id === "duty-rich")!;
    expect(formatTraceStep(duty, "imperial").inputs).toContain("rating fluid density 6.01 lb/gal");
    expect(formatTraceStep(duty, "metric").inputs.join()).not.toContain("rating fluid");
  });

  it("reads results saved before the figures were data as they were saved", () => {
    const old = { code: "x", severity: "info" as const, message: "Pump margin is 12 %." };
    expect(formatWarning(old as never, "imperial").message).toBe("Pump margin is 12 %.");
    const oldStep = {
      id: "s",
      label: "Old step",
      formula: "a × b",
      inputs: [{ label: "injectors", value: 6, unit: "" }],
      value: 2.5,
      unit: "kPa",
    };
    expect(formatTraceStep(oldStep as never, "metric")).toMatchObject({
      value: "2.50 kPa",
      inputs: ["injectors 6"],
    });
  });
});

describe("validation messages speak the reader's units", () => {
  const issuesOf = (patch: (i: FuelSystemInput) => void) => {
    const r = FuelSystemInputSchema.safeParse(variant(boostedSix, patch));
    expect(r.success).toBe(false);
    return r.error!.issues;
  };

  it("names the field by its label and gives the bounds in the reader's units", () => {
    const issues = issuesOf((i) => (i.engine.maxBoostKpa = 6894753.1));
    // 500 kPa = 72.5 psi (NIST SP 811 B.8: 1 psi = 6.894757 kPa).
    expect(issueMessages(issues, "imperial")["engine.maxBoostKpa"]).toBe(
      "Boost must be between 0 and 72.5 psi",
    );
    expect(issueMessages(issues, "metric")["engine.maxBoostKpa"]).toBe(
      "Boost must be between 0 and 500 kPa",
    );
    const pts = issuesOf((i) => (i.pumps[0]!.curves[0]!.points[1]!.flowLPerH = 5000));
    // 3000 L/h = 792.5 US gal/h (1 US gal = 3.785411784 L, NIST SP 811 B.8).
    expect(issueMessages(pts, "imperial")["pumps.0.curves.0.points.1.flowLPerH"]).toBe(
      "Pump 1 curve 1 point 2 flow must be between 0 and 792.5 gal/h",
    );
    const e = issuesOf((i) => (i.fuel.ethanolMaxVolPct = 120));
    expect(issueMessages(e, "imperial")["fuel.ethanolMaxVolPct"]).toBe(
      "Highest ethanol content must be between E0 and E100",
    );
  });

  it("a message about two fields carries both figures", () => {
    const issues = issuesOf((i) => {
      i.regulator = { type: "fixed", basePressureKpa: 180 };
      i.engine.maxBoostKpa = 150;
    });
    const fixed = issues.find((x) => x.path.join(".") === "regulator.basePressureKpa")!;
    // 50 kPa = 7.3 psi; 150 kPa = 21.8 psi (NIST SP 811 B.8).
    expect(issueMessage(fixed, "imperial")).toBe(
      "With a fixed regulator the base pressure must exceed the boost by at least 7.3 psi (boost is 21.8 psi)",
    );
    expect(issueMessage(fixed, "metric")).toBe(
      "With a fixed regulator the base pressure must exceed the boost by at least 50 kPa (boost is 150 kPa)",
    );
  });

  it("keeps the schema's message where it has no figure to convert", () => {
    const issues = issuesOf((i) => (i.injectors.count = 0));
    expect(issueMessages(issues, "imperial")["injectors.count"]).toBe(
      "Injector count must be between 1 and 32",
    );
  });
});
