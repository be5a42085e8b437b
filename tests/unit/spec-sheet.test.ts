import { describe, expect, it } from "vitest";

import {
  analyzePull,
  fuelBlend,
  FuelSystemInputSchema,
  sizeParsedFuelSystem,
  toShown,
} from "@/lib/calc";
import { renderSpecSheet, type SpecSheetData } from "@/lib/pdf/spec-sheet";
import { SAFETY_POINTS } from "@/lib/safety";

import { boostedSix, naFour } from "../calc/fixtures";
import { inspectPdf } from "../helpers/pdf";

const sheet = (inputs: unknown, extra: Partial<SpecSheetData> = {}): SpecSheetData => {
  const input = FuelSystemInputSchema.parse(inputs);
  return {
    shop: { name: "Test Shop", address: "1 Test Road", phone: "555-0000" },
    build: {
      title: "Sheet test build",
      vehicle: "Test vehicle",
      customerName: "Test Customer",
      version: 3,
      savedAt: new Date("2026-11-30T10:00:00Z"),
      tunerName: "Test Tuner",
    },
    input,
    result: sizeParsedFuelSystem(input),
    parts: [],
    units: "metric",
    paper: "a4",
    timeZone: "UTC",
    ...extra,
  };
};

describe("spec sheet PDF", () => {
  it("a full build: key figures, parts, cautions, at most two pages", async () => {
    const d = sheet(boostedSix, {
      parts: [
        {
          role: "injector",
          partId: "p1",
          sku: "TST-1000",
          name: "Testbrand 1000 cc/min injector",
          quantity: 6,
        },
      ],
    });
    const pdf = await renderSpecSheet(d);
    expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
    const { text, pages } = inspectPdf(pdf);
    expect(pages).toBeLessThanOrEqual(2);
    const flat = text.replace(/\s+/g, " ");
    expect(flat).toContain("Sheet test build");
    expect(flat).toContain("Revision 3");
    expect(flat).toContain("Test Tuner");
    expect(flat).toContain(`${d.result.blend.rich.dutyPct.toFixed(1)} %`);
    expect(flat).toContain(`${d.result.pump.marginPct.toFixed(0)} %`);
    expect(flat).toContain("6 × Testbrand 1000 cc/min injector (TST-1000)");
    expect(flat).toContain("How these numbers were worked out");
    for (const p of SAFETY_POINTS) expect(flat).toContain(p.slice(0, 40));
    // Signs the latin font lacks are spelled out rather than dropped.
    expect(flat).toContain("lambda");
    expect(flat).not.toMatch(/[λ»]/);
  });

  it("working steps say lambda once: reference lambda 0.80, target lambda 0.80 (both unit systems)", async () => {
    // A rule-of-thumb BSFC (none given), so the sheet shows the BSFC step with both lambdas.
    const input = { ...boostedSix, fuel: { ...boostedSix.fuel, bsfcGPerKwh: undefined } };
    for (const units of ["metric", "imperial"] as const) {
      const d = sheet(input, { units });
      expect(d.result.trace.some((s) => s.id === "bsfc-rich")).toBe(true);
      const flat = inspectPdf(await renderSpecSheet(d)).text.replace(/\s+/g, " ");
      expect(flat, units).toMatch(/reference lambda 0\.\d\d/);
      expect(flat, units).toMatch(/target lambda 0\.\d\d/);
      expect(flat, units).not.toMatch(/lambda lambda/);
    }
  });

  it("a minimal build renders, in the shop's imperial units", async () => {
    const d = sheet(naFour, { units: "imperial" });
    const { text, pages } = inspectPdf(await renderSpecSheet(d));
    expect(pages).toBeLessThanOrEqual(2);
    const flat = text.replace(/\s+/g, " ");
    expect(flat).toContain(`${toShown("power", d.result.powerCeiling.kw, "imperial")} hp`);
    expect(flat).toContain("psi");
    expect(flat).toContain("No parts chosen from the catalog yet.");
  });

  it("a verified build shows the dyno's measured figures beside the predicted ones", async () => {
    const plain = sheet(boostedSix);
    // A pull made in the test: duty rising to 70 % at 7000 rpm, lambda 0.80, power logged (no outside source: the
    // sheet must print what the analysis found).
    const input = plain.input;
    const samples = Array.from({ length: 41 }, (_, i) => ({
      rpm: 3000 + i * 100,
      dutyPct: 30 + i,
      lambda: 0.8,
      boostKpa: 100,
      fuelDiffKpa: 300,
      powerKw: 100 + i * 5,
    }));
    const analysis = analyzePull(samples, {
      injectorCount: input.injectors.count,
      ratedFlowCcPerMin: input.injectors.ratedFlowCcPerMin,
      ratedPressureKpa: input.injectors.ratedPressureKpa,
      densityKgPerL: fuelBlend(80).densityKgPerL,
      targetLambda: 0.8,
      dutyDangerPct: 85,
    });
    const d = sheet(boostedSix, {
      verification: {
        fileName: "pull-7.csv",
        verifiedAt: new Date("2026-12-01T12:00:00Z"),
        analysis: {
          ...analysis,
          ethanolPct: 80,
          targetLambda: 0.8,
          predictedPeakDutyPct: plain.result.blend.rich.dutyPct,
        },
      },
    });
    const { text, pages } = inspectPdf(await renderSpecSheet(d));
    expect(pages).toBeLessThanOrEqual(2);
    const flat = text.replace(/\s+/g, " ");
    expect(flat).toContain("Measured on the dyno");
    expect(flat).toContain("pull-7.csv");
    expect(flat).toContain(`${plain.result.blend.rich.dutyPct.toFixed(1)} % at redline`);
    expect(flat).toContain("70.0 % at 7000 rpm");
    expect(flat).toContain(`${analysis.measuredBsfc!.gPerKwh.toFixed(0)} g/kWh at 300 kW`);
    expect(flat).toContain("E80");
    // An unverified sheet has no such section.
    expect(inspectPdf(await renderSpecSheet(plain)).text).not.toContain("Measured on the dyno");
  });
});
