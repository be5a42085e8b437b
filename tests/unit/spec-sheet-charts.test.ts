import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";

import { SupplyDemandChart } from "@/components/builds/sizing-charts";
import { FuelSystemInputSchema, sizeParsedFuelSystem, type FuelSystemInput } from "@/lib/calc";
import { renderSpecSheet, type SpecSheetData } from "@/lib/pdf/spec-sheet";

import { boostedSix, naFour } from "../calc/fixtures";
import { inspectPdf } from "../helpers/pdf";

const sheet = (inputs: FuelSystemInput, units: SpecSheetData["units"]): SpecSheetData => {
  const input = FuelSystemInputSchema.parse(inputs);
  return {
    shop: { name: "Chart Shop", address: "2 Chart Lane", phone: "555-0101" },
    build: {
      title: "Chart test build",
      vehicle: null,
      customerName: "Chart Customer",
      version: 2,
      savedAt: new Date("2026-12-01T10:00:00Z"),
      tunerName: null,
    },
    input,
    result: sizeParsedFuelSystem(input),
    parts: [],
    units,
    paper: "letter",
    timeZone: "UTC",
  };
};

const flatText = async (d: SpecSheetData) => {
  const { text, pages } = inspectPdf(await renderSpecSheet(d));
  return { pages, flat: text.replace(/\s+/g, " ") };
};

describe("the spec sheet's charts against boost", () => {
  it("a boosted build: both charts with their axes, ticks and legends in the reader's units", async () => {
    const own = { metric: ["kPa", "L/h"], imperial: ["psi", "gal/h"] } as const;
    for (const units of ["metric", "imperial"] as const) {
      const [pu, fu] = own[units];
      const { flat, pages } = await flatText(sheet(boostedSix, units));
      expect(pages, units).toBeLessThanOrEqual(2);
      expect(flat, units).toContain("Fuel pressure against boost");
      expect(flat, units).toContain("Pump supply and demand against boost");
      expect(flat, units).toContain(`boost (${pu}) across, fuel pressure (${pu}) up.`);
      expect(flat, units).toContain(`boost (${pu}) across, fuel flow (${fu}) up.`);
      // Ticks: a number and the unit, on both axes.
      expect(flat, units).toMatch(new RegExp(`\\b(10|50) ${pu}\\b`));
      expect(flat, units).toMatch(new RegExp(`\\b\\d+ ${fu.replace("/", "\\/")}\\b`));
      // The plain legend: each line's name.
      expect(flat, units).toMatch(/rail across the injector manifold/);
      expect(flat, units).toMatch(/supply demand dotted: least margin/);
      expect(flat, units).toMatch(new RegExp(`lowest, \\d+ %, at [\\d.]+ ${pu} boost\\.`));
      const other = units === "metric" ? /\d (psi|gal\/h)\b/ : /\d (kPa|L\/h)\b/;
      expect(flat, units).not.toMatch(other);
      expect(flat, units).not.toMatch(/NaN|Infinity/);
    }
  });

  it("a naturally aspirated build (no boost range): the titles and one sentence each, no NaN", async () => {
    for (const units of ["metric", "imperial"] as const) {
      const { flat } = await flatText(sheet(naFour, units));
      expect(flat, units).toContain("Fuel pressure against boost");
      expect(flat, units).toContain("Pump supply and demand against boost");
      expect(flat, units).toMatch(/No boost range: with a fixed regulator the rail holds/);
      expect(flat, units).toMatch(/No boost range: the pumps supply [\d.]+ (L\/h|gal\/h)/);
      expect(flat, units).not.toMatch(/NaN|Infinity/);
    }
  });

  it("a stored result without the series (nothing to draw): said so, no NaN", async () => {
    const d = sheet(boostedSix, "imperial");
    d.result = {
      ...d.result,
      pump: { ...d.result.pump, supplyVsBoost: [] },
      regulator: { ...d.result.regulator, pressureVsBoost: [] },
    };
    const { flat } = await flatText(d);
    expect(flat).toContain("No fuel pressure worked out for this build.");
    expect(flat).toContain("No pump supply worked out for this build.");
    expect(flat).not.toMatch(/NaN|Infinity/);
  });
});

describe("the build sheet's supply-and-demand chart", () => {
  it("passes the size it is given on to the chart it draws (as ResponsiveContainer gives it)", () => {
    const html = renderToStaticMarkup(
      createElement(SupplyDemandChart, {
        rows: [
          { x: 0, supply: 200, demand: 100 },
          { x: 10, supply: 180, demand: 150 },
        ],
        xUnit: "psi",
        yUnit: "gal/h",
        marker: { x: 10, label: "least margin" },
        width: 432,
        height: 216,
      }),
    );
    expect(html).toMatch(/class="recharts-wrapper"/);
    expect(html).toMatch(/width:432px;height:216px/);
  });
});
