import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";

import { LinePlot } from "@/components/charts/line-plot";
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

describe("the build sheet's line plot (plain SVG, components/charts/line-plot.tsx)", () => {
  // Hand-made data (no source needed: the drawing, not a figure, is checked).
  const html = renderToStaticMarkup(
    createElement(LinePlot, {
      title: "Pump supply and demand against boost",
      summary: "The pump margin is at its lowest at 10 psi boost",
      x: { label: "boost", unit: "psi", min: 0, max: 20, ticks: [0, 10, 20], decimals: 0 },
      y: { label: "fuel flow", unit: "gal/h", min: 0, max: 100, ticks: [0, 50, 100], decimals: 0 },
      series: [
        { key: "supply", label: "supply", tone: "copper" },
        { key: "demand", label: "demand", tone: "danger", dashed: true },
      ],
      rows: [
        { x: 0, supply: 80, demand: 40 },
        { x: 10, supply: 70, demand: 55 },
        { x: 20, supply: Number.NaN, demand: 70 },
      ],
      marks: [
        { axis: "x", value: 10, label: "least margin", tone: "ink" },
        { axis: "y", value: 500, label: "off the chart", tone: "danger" },
      ],
    }),
  );
  const points = (key: string) =>
    [
      ...(new RegExp(`data-series="${key}" d="([^"]*)"`).exec(html)?.[1] ?? "").matchAll(
        /[ML]([\d.]+),([\d.]+)/g,
      ),
    ].map((m) => [Number(m[1]), Number(m[2])]);

  it("one path per series through its finite points, more flow drawn higher", () => {
    const supply = points("supply");
    const demand = points("demand");
    expect(supply).toHaveLength(2); // the NaN point is left out, never drawn as NaN
    expect(demand).toHaveLength(3);
    expect(html).not.toMatch(/NaN|Infinity/);
    expect(supply[0]![0]).toBe(demand[0]![0]);
    expect(supply[0]![1]).toBeLessThan(demand[0]![1]!); // 80 above 40 (SVG's y runs down)
    expect(demand[1]![0]! - demand[0]![0]!).toBeCloseTo(demand[2]![0]! - demand[1]![0]!, 1);
  });

  it("ticks with a no-break space before their unit, axis titles, the marks inside the axes, the legend", () => {
    expect(html).toContain(">0\u00a0psi<");
    expect(html).toContain(">100\u00a0gal/h<");
    expect(html).toContain(">boost (psi)<");
    expect(html).toContain(">fuel flow (gal/h)<");
    expect(html).toContain(">least margin<");
    expect(html).not.toContain("off the chart");
    expect([...html.matchAll(/class="plot-legend-text">([^<]*)</g)].map((m) => m[1])).toEqual([
      "supply",
      "demand",
    ]);
    // A figure named by its caption and described by its summary; the plot takes the focus.
    expect(html).toMatch(
      /<figure[^>]*aria-describedby="([^"]+)"[\s\S]*id="\1"[^>]*>The pump margin/,
    );
    expect(html).toMatch(/<figcaption[^>]*>Pump supply and demand against boost</);
    expect(html).toMatch(/tabindex="0" role="group"/);
    expect(html).toMatch(/aria-live="polite"/);
  });
});
