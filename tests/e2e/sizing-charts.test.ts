import { fileURLToPath } from "node:url";

import { build } from "esbuild";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import {
  formatValue,
  FuelSystemInputSchema,
  pumpBoostChart,
  sizeParsedFuelSystem,
  type FuelSystemInput,
  type UnitSystem,
} from "@/lib/calc";

import { boostedSix } from "../calc/fixtures";
import { launchBrowser } from "../helpers/browser";

/**
 * The build sheet's charts (components/builds/sizing-charts.tsx) drawn by Chromium on their own:
 * the component bundled with esbuild into a blank page, no app server. What a reader sees —
 * captions, summaries, legends, the marked boosts and limits, axis titles and ticks in their
 * units, one drawn line per series through every point, the readout of a point by keyboard and
 * pointer — and that each drawing is as wide as its box (text at its own size, never scaled).
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
  // The Tailwind sizes the charts rely on: the drawing's height and full width.
  await page.setContent(
    `<!doctype html><html><head><style>.h-56{height:224px}.w-full{width:100%}.block{display:block}</style></head><body><div id="root" style="width:600px"></div></body></html>`,
  );
  await page.evaluate(([i, u]) => Object.assign(window, { __input: i, __units: u }), [
    inputs,
    units,
  ] as const);
  await page.addScriptTag({ content: script });
  await expect.poll(() => page.locator("figure path.plot-line").count()).toBeGreaterThan(7);
  return page;
}

/** One figure as read: caption, its summary, the drawing's size and its box's, legend, marks, axis titles, ticks, lines. */
async function figure(page: Page, caption: string) {
  const f = page.locator("figure", { has: page.locator("figcaption", { hasText: caption }) });
  expect(await f.count(), caption).toBe(1);
  return f.evaluate((el) => {
    const svg = el.querySelector(".plot-box > svg")!;
    const described = document.getElementById(el.getAttribute("aria-describedby") ?? "");
    const texts = (sel: string) => [...el.querySelectorAll(sel)].map((n) => n.textContent ?? "");
    const viewBox = (svg.getAttribute("viewBox") ?? "").split(" ").map(Number);
    return {
      summary: described?.textContent ?? null,
      box: [Math.round(svg.clientWidth), Math.round(svg.clientHeight)],
      svg: [viewBox[2], viewBox[3]],
      legend: texts(".plot-legend-text"),
      marks: texts(".plot-mark-label"),
      titles: [...texts(".plot-x-title"), ...texts(".plot-y-title")],
      xTicks: texts(".plot-x-tick"),
      yTicks: texts(".plot-y-tick"),
      // Points per drawn line: the path's move plus its segments.
      points: [...el.querySelectorAll("path.plot-line")].map(
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
      // Each drawing is as large as its box (the viewBox follows the measured width: no scaling).
      expect(byBoost.svg).toEqual(byBoost.box);
      expect(byBoost.box[1]).toBe(224);
      // The legend in the lines' order (lib/calc/charts.ts), as the spec sheet prints it.
      expect(byBoost.legend).toEqual(["supply", "demand"]);
      // Axis titles name the quantity and the reader's unit.
      expect(byBoost.titles).toEqual([`boost (${pu})`, `fuel flow (${fu})`]);
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
      expect(byPressure.legend).toEqual(["supply", "demand"]);
      expect(byPressure.titles).toEqual([`pump outlet pressure (${pu})`, `fuel flow (${fu})`]);
      expect(byPressure.marks).toEqual(["working"]);
      expect(byPressure.points).toEqual([20, 20]);
      expect(byPressure.summary).toMatch(
        new RegExp(`^Supply [\\d.]+ ${fu} against demand [\\d.]+ ${fu} at [\\d.]+ ${pu}$`),
      );
      for (const t of byPressure.xTicks) expect(t).toMatch(unitTick(pu));
      for (const t of byPressure.yTicks) expect(t).toMatch(unitTick(fu));

      const pressure = await figure(page, "Fuel pressure against boost");
      expect(pressure.svg).toEqual(pressure.box);
      expect(pressure.legend).toEqual(["rail", "across the injector", "manifold"]);
      expect(pressure.titles).toEqual([`boost (${pu})`, `fuel pressure (${pu})`]);
      expect(pressure.marks).toEqual([]);
      expect(pressure.points).toEqual([2, 2, 2]);
      const top = r.regulator.pressureVsBoost.at(-1)!;
      expect(pressure.summary).toBe(
        `With a 1:1 boost-referenced regulator, at ${formatValue("pressure", top.boostKpa, units)} boost the rail holds ${formatValue("pressure", top.railKpa, units)} and the injectors see ${formatValue("pressure", top.differentialKpa, units)} across them`,
      );
      for (const t of [...pressure.xTicks, ...pressure.yTicks]) expect(t).toMatch(unitTick(pu));

      // The duty charts: rpm and % on the axes, the danger duty marked as a reference line.
      const danger = `danger ${r.limits.dutyDangerPct}\u00a0%`;
      const rpm = await figure(page, "Duty across engine speed");
      expect(rpm.svg).toEqual(rpm.box);
      expect(rpm.titles).toEqual(["engine speed (rpm)", "injector duty (%)"]);
      expect(rpm.marks).toEqual([danger]);
      expect(rpm.points).toEqual([20, 20]);
      for (const t of rpm.xTicks) expect(t).toMatch(unitTick("rpm"));
      for (const t of rpm.yTicks) expect(t).toMatch(unitTick("%"));
      const ethanol = await figure(page, "Duty across ethanol content");
      expect(ethanol.titles).toEqual(["ethanol content (%)", "injector duty (%)"]);
      expect(ethanol.marks[0]).toBe(danger);
      expect(ethanol.points).toEqual([11]);

      // The readout: the keyboard moves a cursor along the points, the pointer picks the nearest.
      const rows = pumpBoostChart(r, units).rows;
      const plot = page
        .locator("figure", { hasText: "Pump supply and demand against boost" })
        .locator(".plot-box");
      const readout = plot.locator("xpath=..").locator(".plot-readout");
      expect(await readout.getAttribute("aria-live")).toBe("polite");
      const said = (row: (typeof rows)[number]) =>
        `${row.x}\u00a0${pu}: supply ${+row.supply!.toFixed(1)}\u00a0${fu}, demand ${+row.demand!.toFixed(1)}\u00a0${fu}`;
      await plot.focus();
      await page.keyboard.press("End");
      expect(await readout.textContent()).toBe(said(rows.at(-1)!));
      await page.keyboard.press("ArrowLeft");
      expect(await readout.textContent()).toBe(said(rows.at(-2)!));
      await page.keyboard.press("Home");
      expect(await readout.textContent()).toBe(said(rows[0]!));
      await page.keyboard.press("Escape");
      expect(await readout.textContent()).toBe("");
      const area = (await plot.locator("svg").boundingBox())!;
      await page.mouse.move(area.x + area.width - 2, area.y + area.height / 2);
      expect(await readout.textContent()).toBe(said(rows.at(-1)!));
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
