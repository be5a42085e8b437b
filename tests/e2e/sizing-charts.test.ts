import { fileURLToPath } from "node:url";

import { build } from "esbuild";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import {
  formatValue,
  FuelSystemInputSchema,
  sizeParsedFuelSystem,
  type FuelSystemInput,
  type UnitSystem,
} from "@/lib/calc";

import { boostedSix } from "../calc/fixtures";
import { launchBrowser } from "../helpers/browser";

/**
 * The build sheet's charts (components/builds/sizing-charts.tsx) drawn by Chromium on their own:
 * the component bundled with esbuild into a blank page, no app server. What a reader sees —
 * captions, legends, the marked boosts, ticks in their units, one drawn line per series through
 * every point — and that each chart fills the box its container measured.
 */
const root = fileURLToPath(new URL("../..", import.meta.url)).replace(/\/$/, "");

/** A two-stage system: the second pump switched on at 90 kPa boost (the supply steps there). */
const staged: FuelSystemInput = {
  ...boostedSix,
  pumps: [
    { ...boostedSix.pumps[0]!, label: "lift pump", quantity: 1 },
    { ...boostedSix.pumps[0]!, label: "second stage", quantity: 1, switchOnBoostKpa: 90 },
  ],
};

let browser: Browser;
let script: string;
beforeAll(async () => {
  const entry = `
    import { createRoot } from "react-dom/client";
    import { SizingCharts } from "@/components/builds/sizing-charts";
    import { FuelSystemInputSchema, sizeParsedFuelSystem } from "@/lib/calc";
    const root = createRoot(document.getElementById("root"));
    // Drawn again with other inputs, as the build sheet does while someone types.
    window.__draw = (inputs, units) => {
      const input = FuelSystemInputSchema.parse(inputs);
      root.render(<SizingCharts input={input} result={sizeParsedFuelSystem(input)} units={units} />);
    };
    window.__draw(window.__input, window.__units);`;
  const out = await build({
    stdin: { contents: entry, resolveDir: root, loader: "tsx" },
    bundle: true,
    write: false,
    format: "iife",
    jsx: "automatic",
    alias: { "@": root },
    define: { "process.env.NODE_ENV": '"production"' },
    logLevel: "silent",
  });
  script = out.outputFiles[0]!.text;
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function draw(inputs: FuelSystemInput, units: UnitSystem): Promise<Page> {
  const page = await browser.newPage({ viewport: { width: 640, height: 900 } });
  // The one Tailwind size the charts rely on: the box ResponsiveContainer measures.
  await page.setContent(
    `<!doctype html><html><head><style>.h-56{height:224px}</style></head><body><div id="root" style="width:600px"></div></body></html>`,
  );
  await page.evaluate(([i, u]) => Object.assign(window, { __input: i, __units: u }), [
    inputs,
    units,
  ] as const);
  await page.addScriptTag({ content: script });
  await expect.poll(() => page.locator("figure .recharts-line-curve").count()).toBeGreaterThan(7);
  return page;
}

/** One figure as read: caption, its box's label, the chart's size and its box's, legend, marks, ticks, lines. */
async function figure(page: Page, caption: string) {
  const f = page.locator("figure", { has: page.locator("figcaption", { hasText: caption }) });
  expect(await f.count(), caption).toBe(1);
  return f.evaluate((el) => {
    const box = el.querySelector("[role=img]")!;
    const svg = el.querySelector(".recharts-wrapper > svg.recharts-surface")!;
    const texts = (sel: string) => [...el.querySelectorAll(sel)].map((n) => n.textContent ?? "");
    return {
      summary: box.getAttribute("aria-label"),
      box: [Math.round(box.clientWidth), Math.round(box.clientHeight)],
      svg: [Number(svg.getAttribute("width")), Number(svg.getAttribute("height"))],
      legend: texts(".recharts-legend-item-text"),
      marks: texts("text.recharts-label"),
      xTicks: texts(".recharts-xAxis-tick-labels .recharts-cartesian-axis-tick-value"),
      yTicks: texts(".recharts-yAxis-tick-labels .recharts-cartesian-axis-tick-value"),
      // Points per drawn line: the path's move plus its segments.
      points: [...el.querySelectorAll(".recharts-line-curve")].map(
        (p) => (p.getAttribute("d") ?? "").match(/[ML]/g)?.length ?? 0,
      ),
    };
  });
}

describe("the build sheet's charts", () => {
  for (const units of ["imperial", "metric"] as const) {
    it(`staged pumps in ${units}: both supply-and-demand charts and the fuel pressure chart, as the reader reads them`, async () => {
      const page = await draw(staged, units);
      const input = FuelSystemInputSchema.parse(staged);
      const r = sizeParsedFuelSystem(input);
      const pu = units === "imperial" ? "psi" : "kPa";
      const fu = units === "imperial" ? "gal/h" : "L/h";
      const captions = await page.locator("figcaption").allTextContents();
      expect(captions).toEqual([
        "Duty across engine speed",
        "Duty across ethanol content",
        "Fuel pressure against boost",
        "Pump supply and demand against boost",
        "Pump supply against pressure",
      ]);
      const unitTick = (unit: string) =>
        new RegExp(`^-?[\\d.]+\\u00a0${unit.replace("/", "\\/")}$`);

      const byBoost = await figure(page, "Pump supply and demand against boost");
      // Each chart is as large as the box its container measured (the size reaches the chart).
      expect(byBoost.svg).toEqual(byBoost.box);
      expect(byBoost.box[1]).toBe(224);
      expect(byBoost.legend).toEqual(["demand", "supply"]);
      expect(byBoost.marks).toEqual(["least margin"]);
      // 6 even points (0, 30 … 150 kPa) plus the one just before the stage switches on at 90
      // (docs/calculations.md §4.4).
      expect(byBoost.points).toEqual([7, 7]);
      expect(r.pump.supplyVsBoost).toHaveLength(7);
      expect(byBoost.summary).toBe(
        `The pump margin is at its lowest, ${formatValue("percent", r.pump.marginPct, units, 0)}, at ${formatValue("pressure", r.pump.worstMarginBoostKpa, units)} boost`,
      );
      expect(byBoost.xTicks.length).toBeGreaterThan(1);
      for (const t of byBoost.xTicks) expect(t).toMatch(unitTick(pu));
      for (const t of byBoost.yTicks) expect(t).toMatch(unitTick(fu));

      const byPressure = await figure(page, "Pump supply against pressure");
      expect(byPressure.svg).toEqual(byPressure.box);
      expect(byPressure.legend).toEqual(["demand", "supply"]);
      expect(byPressure.marks).toEqual(["working"]);
      expect(byPressure.points).toEqual([20, 20]);
      expect(byPressure.summary).toMatch(
        new RegExp(`^Supply [\\d.]+ ${fu} against demand [\\d.]+ ${fu} at [\\d.]+ ${pu}$`),
      );
      for (const t of byPressure.xTicks) expect(t).toMatch(unitTick(pu));
      for (const t of byPressure.yTicks) expect(t).toMatch(unitTick(fu));

      const pressure = await figure(page, "Fuel pressure against boost");
      expect(pressure.svg).toEqual(pressure.box);
      expect(pressure.legend).toEqual(["across the injector", "manifold", "rail"]);
      expect(pressure.marks).toEqual([]);
      expect(pressure.points).toEqual([2, 2, 2]);
      const top = r.regulator.pressureVsBoost.at(-1)!;
      expect(pressure.summary).toBe(
        `With a 1:1 boost-referenced regulator, at ${formatValue("pressure", top.boostKpa, units)} boost the rail holds ${formatValue("pressure", top.railKpa, units)} and the injectors see ${formatValue("pressure", top.differentialKpa, units)} across them`,
      );
      for (const t of [...pressure.xTicks, ...pressure.yTicks]) expect(t).toMatch(unitTick(pu));
      await page.close();
    });
  }

  it("a change redraws only the charts whose curves it moves; the same inputs again redraw none", async () => {
    const page = await draw(staged, "metric");
    // Which figures' drawings change from now on (any node, attribute or text inside them).
    const watch = () =>
      page.evaluate(() => {
        const w = window as unknown as { __changed: string[]; __observers?: MutationObserver[] };
        w.__observers?.forEach((o) => o.disconnect());
        w.__changed = [];
        w.__observers = [...document.querySelectorAll("figure")].map((f) => {
          const caption = f.querySelector("figcaption")!.textContent!;
          const o = new MutationObserver(() => {
            if (!w.__changed.includes(caption)) w.__changed.push(caption);
          });
          o.observe(f, { subtree: true, childList: true, attributes: true, characterData: true });
          return o;
        });
      });
    const changed = () =>
      page.evaluate(() => (window as unknown as { __changed: string[] }).__changed.toSorted());
    const redraw = (inputs: FuelSystemInput) =>
      page.evaluate(
        (i) =>
          (window as unknown as { __draw: (i: unknown, u: string) => void }).__draw(i, "metric"),
        inputs,
      );

    // The target power: the duty and the demand move; the fuel pressure against boost does not.
    await watch();
    await redraw({ ...staged, target: { ...staged.target, powerKw: staged.target.powerKw + 40 } });
    const moved = [
      "Duty across engine speed",
      "Duty across ethanol content",
      "Pump supply against pressure",
      "Pump supply and demand against boost",
    ];
    await expect.poll(changed).toEqual(moved);
    await page.waitForTimeout(300);
    expect(await changed()).toEqual(moved);

    // The same inputs as new objects (a keystroke in the title): no chart is drawn again.
    await watch();
    await redraw({ ...staged, target: { ...staged.target, powerKw: staged.target.powerKw + 40 } });
    await page.waitForTimeout(300);
    expect(await changed()).toEqual([]);

    // And back: every chart the first change moved is drawn as it was.
    await watch();
    await redraw(staged);
    await expect.poll(changed).toEqual(moved);
    await page.close();
  });
});
