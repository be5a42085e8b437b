import { describe, expect, it } from "vitest";
import { FuelSystemInputSchema, sizeParsedFuelSystem, toShown } from "@/lib/calc";
import { renderSpecSheet, type SpecSheetData } from "@/lib/pdf/spec-sheet";
import { SAFETY_POINTS } from "@/lib/safety";
import { boostedSix, naFour } from "../calc/fixtures";
import { inspectPdf } from "../helpers/pdf";


const sheet = (inputs: unknown, extra: Partial<SpecSheetData> = {}): SpecSheetData => {
  const input = FuelSystemInputSchema.parse(inputs);
  return {
    shop: { name: "Test Shop", address: "1 Test Road", phone: "555-0000" },
    build: { title: "Sheet test build", vehicle: "Test vehicle", customerName: "Test Customer", version: 3, savedAt: new Date("2026-11-30T10:00:00Z"), tunerName: "Test Tuner" },
    input,
    result: sizeParsedFuelSystem(input),
    parts: [],
    units: "metric",
    ...extra,
  };
};

describe("spec sheet PDF", () => {
  it("a full build: key figures, parts, cautions, at most two pages", async () => {
    const d = sheet(boostedSix, { parts: [{ role: "injector", partId: "p1", sku: "TST-1000", name: "Testbrand 1000 cc/min injector", quantity: 6 }] });
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

  it("a minimal build renders, in the shop's imperial units", async () => {
    const d = sheet(naFour, { units: "imperial" });
    const { text, pages } = inspectPdf(await renderSpecSheet(d));
    expect(pages).toBeLessThanOrEqual(2);
    const flat = text.replace(/\s+/g, " ");
    expect(flat).toContain(`${toShown("power", d.result.powerCeiling.kw, "imperial")} hp`);
    expect(flat).toContain("psi");
    expect(flat).toContain("No parts chosen from the catalog yet.");
  });
});
