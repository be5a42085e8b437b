import { describe, expect, it } from "vitest";

import { FuelSystemInputSchema, sizeParsedFuelSystem } from "@/lib/calc";
import { renderQuoteSheet, type QuoteSheetData } from "@/lib/pdf/quote-sheet";
import { renderSpecSheet, type SpecSheetData } from "@/lib/pdf/spec-sheet";
import { presentQuote } from "@/lib/quotes/quote-presentation";

import { boostedSix } from "../calc/fixtures";
import { inspectPdf } from "../helpers/pdf";

/**
 * Every PDF is printed on the shop's paper and fits it. Page sizes from ISO 216 (A4 210 × 297 mm
 * = 595.28 × 841.89 pt) and ANSI/ASME Y14.1 (Letter 8.5 × 11 in = 612 × 792 pt).
 */

const input = FuelSystemInputSchema.parse(boostedSix);
const spec = (paper: SpecSheetData["paper"]): SpecSheetData => ({
  shop: { name: "Paper Shop", address: "1 Paper Road", phone: "555-0000" },
  build: {
    title: "Paper build",
    vehicle: "Paper vehicle",
    customerName: "Paper Customer",
    version: 2,
    savedAt: new Date("2026-07-04T03:30:00Z"),
    tunerName: "Paper Tuner",
  },
  input,
  result: sizeParsedFuelSystem(input),
  parts: [
    { role: "injector", partId: "p1", sku: "P-INJ", name: "Paper injector", quantity: 6 },
    { role: "pump", partId: "p2", sku: "P-PMP", name: "Paper pump", quantity: 2 },
  ],
  units: "imperial",
  paper,
  timeZone: "America/Chicago",
});

const quote = (paper: QuoteSheetData["paper"], lines = 12): QuoteSheetData => ({
  shop: { name: "Paper Shop", address: "1 Paper Road", phone: "555-0000" },
  quote: {
    label: "Q-0100",
    status: "Sent",
    createdAt: new Date("2026-07-04T03:30:00Z"),
    validUntil: "2026-08-03",
    notes: "Fitting on a weekday.",
    currency: "USD",
  },
  customer: { name: "Paper Customer", email: "paper@example.test" },
  buildTitle: "Paper build",
  presented: presentQuote(
    { currency: "USD", taxRateBp: 825 },
    Array.from({ length: lines }, (_, i) => ({
      kind: "part" as const,
      sku: `P-${i + 1}`,
      description: `Paper part ${i + 1}`,
      quantityMilli: 1000,
      unitPriceMinor: 1000,
      discountBp: 0,
    })),
  ),
  deposit: { rate: "30 %", amount: "$38.97", paid: null },
  paper,
  timeZone: "America/Chicago",
});

describe("paper size and time zone of the PDFs", () => {
  it("the spec sheet on Letter: every page 612 × 792 pt, at most two pages, nothing lost", async () => {
    const { pages, pageSizes, text } = inspectPdf(await renderSpecSheet(spec("letter")));
    expect(pages).toBeLessThanOrEqual(2);
    expect(pageSizes).toEqual(Array(pages).fill("612x792"));
    const flat = text.replace(/\s+/g, " ");
    // The last section is there, to its last step.
    expect(flat).toContain("How these numbers were worked out");
    expect(flat).toContain("Return-line pressure drop at idle");
    // 03:30 UTC on 4 July is still 3 July in Chicago (CDT, UTC−5).
    expect(flat).toContain("Revision 2 · 3 Jul 2026");
  }, 30_000);

  it("the spec sheet on A4: 595 × 842 pt", async () => {
    const { pageSizes } = inspectPdf(await renderSpecSheet(spec("a4")));
    expect(new Set(pageSizes)).toEqual(new Set(["595x842"]));
  }, 30_000);

  it("the quote on Letter: one page of 612 × 792 pt with its totals; its dates in the shop's zone", async () => {
    const { pages, pageSizes, text } = inspectPdf(await renderQuoteSheet(quote("letter")));
    expect(pages).toBe(1);
    expect(pageSizes).toEqual(["612x792"]);
    const flat = text.replace(/\s+/g, " ");
    expect(flat).toContain("$129.90");
    expect(flat).toContain("issued 3 Jul 2026");
    // A calendar day is the same day everywhere.
    expect(flat).toContain("Valid until 3 Aug 2026");
    expect(flat).toContain("Installation follows local codes");
  }, 30_000);

  it("a long quote on Letter runs onto more Letter pages with every line", async () => {
    const { pages, pageSizes, text } = inspectPdf(await renderQuoteSheet(quote("letter", 40)));
    expect(pages).toBeGreaterThan(1);
    expect(pageSizes).toEqual(Array(pages).fill("612x792"));
    for (let i = 1; i <= 40; i++) expect(text).toMatch(new RegExp(`Paper part ${i}(?!\\d)`));
    expect(text.replace(/\s+/g, " ")).toContain("Installation follows local codes");
  }, 30_000);
});
