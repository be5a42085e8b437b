import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, newClient, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";
import { BASE_URL, request, signIn } from "../helpers/http";

/** What an outside tester found on the build sheet, checked the way a tuner sees it. */
let browser: Browser;
let buildId: string;
beforeAll(async () => {
  browser = await launchBrowser();
  const tuner = await signIn("tuner@demo.fuelwright.test");
  const [demo] =
    await sql`select customer_id, inputs from builds where id = '10000000-0000-4000-8000-000000000002'`;
  const inputs = demo!.inputs as Record<string, Record<string, unknown>>;
  const made = await request(tuner, "POST", "/api/v1/builds", {
    customerId: demo!.customer_id,
    title: `Findings ${Date.now()}`,
    inputs: {
      ...inputs,
      injectors: {
        ...inputs.injectors,
        deadTime: {
          voltages: [12, 14],
          pressuresKpa: [300, 500],
          deadTimeMs: [
            [1.1, 1.3],
            [0.9, 1.05],
          ],
        },
      },
    },
  });
  expect(made.status).toBe(201);
  buildId = made.json.build.id as string;
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

async function open(page: Page) {
  // The tuner follows the shop's units (imperial in the demo shop), whatever an earlier suite chose.
  await sql`update "user" set unit_system = null where email = 'tuner@demo.fuelwright.test'`;
  await signInAs(page, "tuner");
  await page.goto(`${BASE_URL}/builds/${buildId}`);
  await expect
    .poll(() => page.getByLabel("Injectors (count)").inputValue(), { timeout: 20000 })
    .not.toBe("");
}
const revisions = async () =>
  (await sql`select count(*)::int as n from build_revisions where build_id = ${buildId}`)[0]!
    .n as number;

describe("the build sheet after the tester's findings", () => {
  it("shows the idle and air conditions in the viewer's units, the commanded pulses with their dead time, exact defaults, and saves nothing unchanged", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await open(page);

    // The demo shop works in imperial: the idle conditions are there, in psia and °F
    // (docs/calculations.md §3.7 defaults: 35 kPa abs = 5.1 psia, 30 °C = 86 °F,
    // 101.325 kPa = 14.7 psia; NIST SP 811 B.8 for the factors).
    expect(await page.getByLabel("Idle manifold pressure (psia)").inputValue()).toBe("5.1");
    expect(await page.getByLabel("Idle volumetric efficiency").inputValue()).toBe("0.8");
    expect(await page.getByLabel("Intake air temperature (°F)").inputValue()).toBe("86");
    expect(await page.getByLabel("Ambient (barometric) pressure (psia)").inputValue()).toBe("14.7");

    // The pulses are commanded ones, with the dead time and the voltage it was read at.
    const note = page.getByTestId("pulse-note");
    await expect.poll(() => note.innerText()).toMatch(/dead time at 14(\.0)? V at the injectors/);
    const idlePulse = parseFloat(await page.getByTestId("pulse-idle").innerText());
    expect(idlePulse).toBeGreaterThan(0.9); // opening time + at least the table's smallest dead time

    // Nothing changed: nothing to save, no new version.
    const before = await revisions();
    await page.getByRole("button", { name: "Save build" }).click();
    await expect.poll(() => page.getByText(/Nothing to save/).count()).toBe(1);
    expect(await revisions()).toBe(before);

    // To metric (the tester's path): the idle fields convert, the defaults of the parts switched
    // off come out as their canonical values.
    await page.getByRole("radio", { name: /Metric/ }).click();
    await expect.poll(() => page.getByLabel("Intake air temperature (°C)").inputValue()).toBe("30");
    expect(await page.getByLabel("Idle manifold pressure (kPa abs)").inputValue()).toBe("35");
    await page.getByLabel("Check the regulator's bypass (return) capacity").check();
    expect(await page.getByLabel("Bypass flow (rated) (L/h)").inputValue()).toBe("400");
    expect(await page.getByLabel("Bypass flow rated at (kPa)").inputValue()).toBe("300");
    await page.getByLabel(/Add a second pump/).check();
    const second = page.locator("fieldset", { hasText: "Second pump" }).last();
    const texts = await second
      .locator("input[type=text], input:not([type])")
      .evaluateAll((els) => els.map((e) => (e as HTMLInputElement).value));
    // The only decimal figure is the curve's 13.5 V: no 299.9 kPa or 249.8 L/h.
    expect(texts.filter((t) => /\.\d/.test(t) && t !== "13.5")).toEqual([]);
    expect(texts).toEqual(expect.arrayContaining(["300", "250", "600", "180"]));
    await ctx.close();
  });
});
