import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, newClient, signInAs } from "../helpers/browser";
import { inspectPdf } from "../helpers/pdf";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/**
 * A figure in a unit of one system only: a number, then the unit. "m" and "in" count only after a
 * number, being words too. The same lists as tests/unit/registry.test.ts.
 */
const METRIC_ONLY = /\d\s?(kPa|kW|cc\/min|L\/h|g\/min|g\/kWh|kg\/L|mm|m\/s|m|L|bar|°C|mg)(?![\w/])/;
const IMPERIAL_ONLY =
  /\d\s?(psi|psia|hp|lb\/h|gal\/h|gal|lb\/hp\/h|lb\/gal|cu in|in|ft|ft\/s|°F|gr)(?![\w/])/;
/**
 * An internal field path or code where a label belongs: camelCase names (units such as kPa are not), "›" paths, and a code
 * standing alone in a table cell (the words themselves appear in sentences).
 */
const INTERNAL =
  /\b[a-z]{2,}(?:[A-Z][a-z0-9]*)+\b|›|\b(turbo|supercharged)\b|(^|\t)(na|boost-referenced|fixed|wheel|crank|given|rule-of-thumb|injectors|pump|feed-line|ok|caution|danger|static)(\t|$)/;

/** The unit switch names both systems on purpose; everything else on the page is read. */
const UNIT_SWITCH = /(Metric \(kPa, kW, cc\/min\)|Imperial \(psi, hp, lb\/h\))/g;

async function editorReady(page: Page) {
  await expect
    .poll(() => page.getByLabel("Injectors (count)").inputValue(), { timeout: 15000 })
    .not.toBe("");
}

async function mainText(page: Page) {
  const details = page.locator("details");
  for (let i = 0; i < (await details.count()); i++)
    await details.nth(i).evaluate((d) => ((d as HTMLDetailsElement).open = true));
  return (await page.locator("main").innerText()).replace(UNIT_SWITCH, "");
}

/** The lines of `text` that match `re`, for a readable failure. */
const offending = (text: string, re: RegExp) => text.split("\n").filter((l) => re.test(l));

describe("every figure in the reader's units", () => {
  it("imperial: the build sheet, warnings, working, revision, compare and spec sheet carry no metric unit and no internal path; metric no imperial unit", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "tuner");
    await page.getByRole("link", { name: "New build" }).click();
    await page.getByLabel("Customer").selectOption({ label: "Harriet Quill" });
    const title = `Units everywhere ${Date.now()}`;
    await page.getByLabel("Title").fill(title);
    await page.getByRole("button", { name: "Create build sheet" }).click();
    await page.waitForURL(/\/builds\/[0-9a-f-]{36}$/);
    const url = page.url();
    const id = url.split("/").pop()!;
    await editorReady(page);
    const wasImperial =
      (await page.getByRole("radio", { name: /Imperial/ }).getAttribute("aria-checked")) === "true";
    await page.getByRole("radio", { name: /Imperial/ }).click();
    await expect.poll(() => page.getByLabel("Boost (psi)").count()).toBe(1);

    // Bad input: named by its label, bounds in psi (500 kPa = 72.5 psi, NIST SP 811 B.8), highlighted.
    await page.getByLabel("Boost (psi)").fill("1000000");
    await expect
      .poll(() => page.getByText("Boost must be between 0 and 72.5 psi").count())
      .toBeGreaterThan(0);
    expect(await page.getByLabel("Boost (psi)").getAttribute("aria-invalid")).toBe("true");
    // A number too large to hold in kPa is out of range too, with the same limits.
    await page.getByLabel("Boost (psi)").fill("1e308");
    await expect
      .poll(() => page.getByText("Boost must be between 0 and 72.5 psi").count())
      .toBeGreaterThan(0);
    expect(await page.getByText("Boost must be a number").count()).toBe(0);
    await page.getByLabel("Boost (psi)").fill("20");
    // Thousands separators are read as such: 7,000 rpm is a redline, not 7.
    await page.getByLabel("Redline (rpm)").fill("7,000");
    await page.getByLabel("Boost (psi)").focus();
    await expect
      .poll(() => page.getByLabel("Redline (rpm)").getAttribute("aria-invalid"))
      .not.toBe("true");
    expect(await page.getByText(/Redline must be between/).count()).toBe(0);
    // A blank title, then a 5 000-character one: highlighted, said why, and focused.
    await page.getByLabel("Title").fill("");
    await page.getByRole("button", { name: "Save build" }).click();
    await expect.poll(() => page.getByText("Give the build a title").count()).toBe(1);
    expect(await page.getByLabel("Title").getAttribute("aria-invalid")).toBe("true");
    await expect.poll(() => page.evaluate(() => document.activeElement?.id)).toBe("b-title");
    await page.getByLabel("Title").fill("x".repeat(5000));
    await page.getByLabel("Boost (psi)").focus();
    await page.getByRole("button", { name: "Save build" }).click();
    await expect
      .poll(() => page.getByText("Title is too long (at most 120 characters)").count())
      .toBe(1);
    await expect.poll(() => page.evaluate(() => document.activeElement?.id)).toBe("b-title");
    await page.getByLabel("Title").fill(title);

    // Warnings with figures: duty too high, a fixed regulator under boost, a thin feed line, wiring.
    await page.getByLabel("Injectors (count)").fill("3");
    await page.locator("#b-regulator-type").selectOption("fixed");
    await page.getByLabel("Size the feed line (tank to rail)").check();
    await page.locator("#b-feed-an").selectOption("4");
    await page.getByLabel("Work out the voltage from the wiring").check();
    await expect
      .poll(() => page.getByTestId("warnings").innerText())
      .toMatch(/Fit injectors rated at least [\d.]+ lb\/h at 43\.5 psi/); // 300 kPa = 43.5 psi
    // One figure, one rounding: the warning's rating is the "Smallest rating" beside it.
    const needed = /rated at least ([\d.]+) lb\/h/.exec(
      await page.getByTestId("warnings").innerText(),
    )![1]!;
    expect((await page.getByTestId("smallest-rating").innerText()).replace(/\s+/g, " ")).toContain(
      `${needed} lb/h`,
    );
    await expect.poll(() => page.getByTestId("warnings").innerText()).toMatch(/psi at full boost/);
    await page.getByRole("button", { name: "Save build" }).click();
    await expect.poll(() => page.getByText("Saved as version 2").count()).toBe(1);

    const read = async (system: "imperial" | "metric") => {
      const wrong = system === "imperial" ? METRIC_ONLY : IMPERIAL_ONLY;
      const own = system === "imperial" ? IMPERIAL_ONLY : METRIC_ONLY;
      const pages: [string, string][] = [];
      await page.goto(url);
      await editorReady(page);
      await expect
        .poll(() => page.getByTestId("working").locator("li").count())
        .toBeGreaterThan(10);
      pages.push(["build sheet", await mainText(page)]);
      // Chart ticks: the number, a space, the unit ("55 gal/h", never "55gal/h").
      // The charts load as they scroll near the screen: go to them first.
      await page.evaluate(() => window.scrollTo(0, document.body.scrollHeight));
      const ticks = page.locator(".plot-x-tick, .plot-y-tick");
      await expect.poll(() => ticks.count(), { timeout: 15000 }).toBeGreaterThan(10);
      const tickTexts = await ticks.allTextContents();
      const flow = system === "imperial" ? "gal/h" : "L/h";
      expect(tickTexts.filter((t) => t.endsWith(flow)).length).toBeGreaterThan(1);
      expect(tickTexts.filter((t) => /\d[^\d.\s]/.test(t))).toEqual([]);
      expect(await page.getByTestId("warnings").innerText()).toMatch(own);
      expect(await page.getByTestId("working").innerText()).toMatch(own);
      // The engine's size as the reader's trade says it (cu in; L in metric) …
      const displacement = system === "imperial" ? "Displacement (cu in)" : "Displacement (L)";
      expect(await page.getByLabel(displacement, { exact: true }).count()).toBe(1);
      // … and air per cylinder and fuel per injection in grains (three decimals: 0.2–1.5 gr of
      // fuel to three figures) or mg, in the working steps and the spec sheet alike (where a
      // line may break before the figure).
      const small =
        system === "imperial"
          ? [/fuel per injection\s+\d+\.\d{3} gr/, /air per cylinder\s+\d+\.\d{3} gr/]
          : [/fuel per injection\s+\d+\.\d{2} mg/, /air per cylinder\s+\d+\.\d mg/];
      const working = await page.getByTestId("working").innerText();
      for (const re of small) expect(working).toMatch(re);
      await page.goto(`${url}/revisions/2`);
      pages.push(["revision 2", await mainText(page)]);
      await page.goto(`${url}/compare?from=1&to=2`);
      const figures = await page.getByTestId("figure-changes").innerText();
      expect(figures).toMatch(
        /Injector duty at the highest ethanol\s+[\d.]+ %\s+[\d.]+ %\s+▲\s+worse/,
      );
      pages.push(["compare", await mainText(page)]);
      const pdf = await page.request.get(`/api/v1/builds/${id}/spec-sheet`);
      expect(pdf.status()).toBe(200);
      const sheet = inspectPdf(Buffer.from(await pdf.body())).text;
      expect(sheet).toContain("How these numbers were worked out");
      for (const re of small) expect(sheet).toMatch(re);
      pages.push(["spec sheet", sheet]);
      for (const [name, text] of pages) {
        expect(text, name).toMatch(own);
        expect(offending(text, wrong), `${name} in ${system}`).toEqual([]);
        expect(offending(text, INTERNAL), `${name} in ${system}`).toEqual([]);
      }
    };

    /** Switches the person's units in the editor and waits until a fresh page shows them. */
    const switchTo = async (system: "imperial" | "metric") => {
      await page.goto(url);
      await editorReady(page);
      await page.getByRole("radio", { name: system === "metric" ? /Metric/ : /Imperial/ }).click();
      const boost = system === "metric" ? "Boost (kPa)" : "Boost (psi)";
      await expect
        .poll(async () => {
          await page.goto(url);
          await editorReady(page);
          return page.getByLabel(boost).count();
        })
        .toBe(1);
    };

    await read("imperial");
    await switchTo("metric");
    await read("metric");
    await switchTo(wasImperial ? "imperial" : "metric"); // leave the demo tuner's units as found
    await ctx.close();
    // One walk of eight pages and two spec sheets, in both systems: about two minutes on a
    // loaded test machine (each poll keeps its own 10 s limit).
  }, 240_000);
});
