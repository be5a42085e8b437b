import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, newClient, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";
import { request, signIn } from "../helpers/http";
import { THREE_PULLS } from "../helpers/pulls";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

/** kPa as the demo shop's imperial screens take it (psi, NIST SP 811 factor). */
const psi = (kpa: number) => (kpa / 6.894757293168).toFixed(1);

describe("tune session", () => {
  it("a tuner adds three pulls, overlays them, sees a limit crossed with its reason and reads the next step", async () => {
    const tuner = await signIn("tuner@demo.fuelwright.test");
    const [demo] =
      await sql`select customer_id, inputs from builds where id = '10000000-0000-4000-8000-000000000002'`;
    const made = await request(tuner, "POST", "/api/v1/builds", {
      customerId: demo!.customer_id,
      title: `Tune session E2E ${Date.now().toString(36)}`,
      inputs: demo!.inputs,
    });
    expect(made.status).toBe(201);
    const id = made.json.build.id as string;

    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "tuner");
    await page.goto(`/builds/${id}/dyno`);
    const session = page.getByTestId("tune-session");
    await expect.poll(() => session.getByText("No pulls yet").count(), { timeout: 30000 }).toBe(1);
    const form = session.getByRole("form", { name: "Add a pull" });
    // An empty CSV is named as empty, not as "no file chosen".
    await form
      .getByLabel("Pull log (CSV)")
      .setInputFiles({ name: "blank.csv", mimeType: "text/csv", buffer: Buffer.alloc(0) });
    await form.getByRole("button", { name: "Add pull" }).click();
    await expect
      .poll(() => form.getByText('The file "blank.csv" is empty').count(), { timeout: 10000 })
      .toBe(1);
    const empty = await request(
      tuner,
      "POST",
      `/api/v1/builds/${id}/tune/pulls?ethanolPct=85&powerMeasuredAt=wheel`,
      "",
      { "content-type": "text/csv", "x-file-name": "blank.csv" },
    );
    expect(empty.status).toBe(400);
    expect(empty.json.error.message).toBe('The file "blank.csv" is empty');
    // The tuner's own unit system (the shop's imperial unless they chose metric): the boost field says.
    const imperial = /psi/.test(await form.getByText(/^Boost target/).innerText());
    for (const p of THREE_PULLS) {
      await form
        .getByLabel("Pull log (CSV)")
        .setInputFiles({ name: p.name, mimeType: "text/csv", buffer: Buffer.from(p.csv) });
      await form.getByLabel("Ethanol content (%)").fill(String(p.ethanolPct));
      await form
        .getByLabel(/Boost target/)
        .fill(imperial ? psi(p.boostTargetKpa) : String(p.boostTargetKpa));
      await form.getByLabel("Power measured at").selectOption("wheel");
      await form.getByRole("button", { name: "Add pull" }).click();
      await expect
        .poll(() => session.getByText(`${p.name} added`).count(), { timeout: 30000 })
        .toBe(1);
    }
    // Three pulls in order, all drawn: each chart has a pair of curves per pull.
    await expect
      .poll(() => session.getByRole("list", { name: "Pulls in order" }).locator("> li").count())
      .toBe(3);
    await expect
      .poll(() => page.getByTestId("tune-chart-power").locator("path.recharts-curve").count(), {
        timeout: 15000,
      })
      .toBe(6);
    // Pump gasoline at λ 0.86 and 60 kPa is within the lambda table: no "danger" there.
    const first = page.getByTestId("pull-1");
    await first.getByText("Limits and what was done to the log").click();
    const lambda = (await first.getByTestId("limit-lambda").innerText()).replace(/\s+/g, " ");
    expect(lambda).toMatch(/Within Lambda against the boost table: on the table/);
    // Pull 3 crossed the EGT spread, and says where, by how much and why.
    const third = page.getByTestId("pull-3");
    await expect(third.getByTestId("pull-badge").innerText()).resolves.toBe(
      "Over: EGT spread between cylinders",
    );
    await third.getByText("Limits and what was done to the log").click();
    const spread = (await third.getByTestId("limit-egtSpread").innerText()).replace(/\s+/g, " ");
    // 100 °C between cylinders is 180 °F; 80 °C allowed is 144 °F, 20 °C over is 36 °F (× 1.8).
    expect(spread).toMatch(
      imperial
        ? /Over.*Cylinder 3 ran 180 °F hotter than cylinder 1 at 6000 rpm, 36 °F past the 144 °F allowed/
        : /Over.*Cylinder 3 ran 100 °C hotter than cylinder 1 at 6000 rpm, 20 °C past the 80 °C allowed/,
    );
    // Pulls are drawn apart from the limit mark.
    await expect
      .poll(() =>
        page
          .getByTestId("tune-chart-power")
          .getByText(/at 6000 rpm: over EGT spread between cylinders/)
          .count(),
      )
      .toBeGreaterThan(0);
    // The next step, predicted from pull 3.
    const next = page.getByTestId("next-step");
    await expect.poll(() => next.getByText(/From pull 3/).count()).toBe(1);
    await expect(next.getByTestId("runs-out-first").innerText()).resolves.toMatch(
      imperial
        ? /^the (injectors|fuel pump|feed line), at \d+ hp$/
        : /^the (injectors|fuel pump|feed line), at \d+ kW$/,
    );
    await expect(next.getByText("Injector duty").count()).resolves.toBe(1);
    // Blank boost means exactly the build's boost target (the demo build's, from its inputs).
    const target = (demo!.inputs as { engine: { maxBoostKpa: number } }).engine.maxBoostKpa;
    await expect(next.getByTestId("next-step-basis").innerText()).resolves.toMatch(
      /^At the build's boost target, exactly/,
    );
    await expect(next.innerText()).resolves.toContain(
      imperial ? `${psi(target)} psi boost` : `${target} kPa boost`,
    );
    await page.screenshot({ path: "test-results/screenshots/tune-session.png", fullPage: true });
    await ctx.close();
  }, 300_000);
});
