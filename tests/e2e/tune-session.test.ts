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

/**
 * A logger whose column names the guess cannot read (invented): rpm and duty must be chosen. A
 * column named for the run keeps it a logger the shop has not mapped before (mappings are
 * remembered per header set, and other suites use the same test database).
 */
const oddLog = (run: string) =>
  [
    `Tick,Crank Spd,Inj Open,WB1,Mnf P,Run ${run}`,
    "s,1/min,%,λ,psi,",
    ...Array.from({ length: 21 }, (_, i) => {
      const rpm = 3000 + i * 200;
      return `${i},${rpm},${(30 + i * 2).toFixed(1)},0.86,${(i * 0.6).toFixed(1)},1`;
    }),
  ].join("\n");

describe("tune session, as a tuner in each unit system on a phone", () => {
  it("places an unreadable log by its columns, edits a pull, reads the limits' sources, and shows no raw figure", async () => {
    const tuner = await signIn("tuner@demo.fuelwright.test");
    const [demo] =
      await sql`select customer_id, inputs from builds where id = '10000000-0000-4000-8000-000000000002'`;
    const [me] =
      await sql`select id, unit_system from "user" where email = 'tuner@demo.fuelwright.test'`;
    try {
      for (const units of ["metric", "imperial"] as const) {
        await sql`update "user" set unit_system = ${units} where id = ${me!.id}`;
        const made = await request(tuner, "POST", "/api/v1/builds", {
          customerId: demo!.customer_id,
          title: `Tune phone ${units} ${Date.now().toString(36)}`,
          inputs: demo!.inputs,
        });
        expect(made.status).toBe(201);
        const id = made.json.build.id as string;
        const ctx = await newClient(browser, { width: 390, height: 844 });
        const page = await ctx.newPage();
        await signInAs(page, "tuner");
        await page.goto(`/builds/${id}/dyno`);
        const session = page.getByTestId("tune-session");
        await expect
          .poll(() => session.getByText("No pulls yet").count(), { timeout: 30000 })
          .toBe(1);
        const form = session.getByRole("form", { name: "Add a pull" });

        // 1. A log the guess cannot place: the columns are offered, the file stays chosen.
        await form.getByLabel("Pull log (CSV)").setInputFiles({
          name: "odd-logger.csv",
          mimeType: "text/csv",
          buffer: Buffer.from(oddLog(`${units}-${Date.now().toString(36)}`)),
        });
        await form.getByLabel("Ethanol content (%)").fill("85");
        await form.getByLabel("Power measured at").selectOption("crank");
        await form.getByRole("button", { name: "Add pull" }).click();
        const picker = page.getByTestId("column-picker");
        await expect.poll(() => picker.count(), { timeout: 30000 }).toBe(1);
        await expect(
          form.getByText(/No column of this log reads as engine speed/).count(),
        ).resolves.toBe(1);
        // Asked without duty: the picker says so on duty's own field.
        await picker.locator("#pick-rpm").selectOption("Crank Spd");
        await picker.getByRole("button", { name: "Add with these columns" }).click();
        await expect
          .poll(
            () =>
              picker
                .locator("#pick-duty-err")
                .innerText()
                .catch(() => ""),
            { timeout: 30000 },
          )
          .toMatch(/./);
        await picker.locator("#pick-duty").selectOption("Inj Open");
        await picker.locator("#pick-mixture").selectOption("WB1");
        await picker.locator("#pick-boost").selectOption("Mnf P");
        // The units row said psi: the unit is chosen from it.
        await expect(picker.locator("#pick-boost-unit").inputValue()).resolves.toBe("psi");
        await picker.getByRole("button", { name: "Add with these columns" }).click();
        await expect
          .poll(
            () => session.getByText(/odd-logger\.csv added; its columns are remembered/).count(),
            {
              timeout: 30000,
            },
          )
          .toBe(1);
        expect(await picker.count()).toBe(0);

        // 2. Edit the pull: a boost target past the schema's bound is said in the reader's units.
        const pull = page.getByTestId("pull-1");
        await pull.getByRole("button", { name: "Edit pull 1" }).click();
        const edit = pull.getByRole("form", { name: "Edit pull 1" });
        await edit.getByLabel(/Boost target/).fill(units === "metric" ? "900" : "90");
        await edit.getByRole("button", { name: "Save pull" }).click();
        await expect(edit.getByText(/Boost target must be between/).innerText()).resolves.toMatch(
          units === "metric" ? /0 kPa and 500 kPa/ : /0\.0 psi and 72\.5 psi/,
        );
        await edit.getByLabel(/Boost target/).fill(units === "metric" ? "100" : "14.5");
        await edit.getByLabel("Ethanol content (%)").fill("70");
        await edit.getByRole("button", { name: "Save pull" }).click();
        await expect
          .poll(() => session.getByText("Pull 1 saved").count(), { timeout: 30000 })
          .toBe(1);
        await expect
          .poll(() => pull.innerText())
          .toMatch(
            units === "metric"
              ? /E70[\s\S]*boost target 100 kPa/
              : /E70[\s\S]*boost target 14\.5 psi/,
          );

        // 3. The limits say where each comes from; one set for the build becomes its own.
        const limits = page.getByTestId("tune-limits-build");
        await limits.locator("summary").click();
        await expect(limits.getByTestId("limit-source-maxEgtC").innerText()).resolves.toMatch(
          /From: (Fuelwright|shop) default/,
        );
        await limits.getByLabel(/Maximum EGT \(/).fill(units === "metric" ? "900" : "1650");
        await limits.getByRole("button", { name: "Save for this build" }).click();
        await expect
          .poll(() => limits.getByText("Saved for this build").count(), { timeout: 30000 })
          .toBe(1);
        await expect
          .poll(() => limits.getByTestId("limit-source-maxEgtC").innerText())
          .toMatch(/From: this build \((shop|Fuelwright): (950 °C|1742 °F)\)/);
        await expect(limits.getByTestId("limit-source-maxDutyPct").innerText()).resolves.toMatch(
          /From: (Fuelwright|shop) default/,
        );
        // Saved again untouched: nothing to save.
        await limits.getByRole("button", { name: "Save for this build" }).click();
        await expect.poll(() => limits.getByText("Nothing to save").count()).toBe(1);

        // 4. A log without power says so instead of drawing empty axes; a second pull with every
        // channel (placed by the guess) fills the charts.
        await expect(page.getByTestId("tune-chart-power").innerText()).resolves.toMatch(
          /Not logged in the pulls shown: no power or torque column/,
        );
        const full = THREE_PULLS[2];
        await form
          .getByLabel("Pull log (CSV)")
          .setInputFiles({ name: full.name, mimeType: "text/csv", buffer: Buffer.from(full.csv) });
        await form.getByLabel("Ethanol content (%)").fill("85");
        await form.getByLabel("Power measured at").selectOption("wheel");
        await form.getByRole("button", { name: "Add pull" }).click();
        await expect
          .poll(() => session.getByText(`${full.name} added`).count(), { timeout: 30000 })
          .toBe(1);

        // 5. The screen as read: no NaN, no float tails, a unit on every axis and tooltip,
        // nothing wider than the phone.
        const text = await session.innerText();
        expect(text).not.toMatch(/NaN|undefined|Infinity/);
        expect(text).not.toMatch(/\d\.\d{4,}/);
        for (const chart of ["power", "fuel", "pressure"]) {
          const c = page.getByTestId(`tune-chart-${chart}`);
          await c.scrollIntoViewIfNeeded();
          await expect.poll(() => c.locator(".recharts-yAxis").count(), { timeout: 15000 }).toBe(2);
          const ticks = await c.locator(".recharts-cartesian-axis-tick-value").allTextContents();
          expect(ticks.length).toBeGreaterThan(0);
          for (const t of ticks) expect(t, `${chart} tick`).not.toMatch(/\d\.\d{4,}|NaN/);
          const labels = (await c.locator(".recharts-label").allTextContents()).join(" | ");
          expect(labels, chart).toMatch(/engine speed \(rpm\)/);
          expect(labels.match(/\([^)]+\)/g)?.length ?? 0, chart).toBeGreaterThanOrEqual(3);
          const surface = c.locator(".recharts-wrapper").first();
          const box = (await surface.boundingBox())!;
          await surface.hover({ position: { x: box.width * 0.5, y: box.height * 0.4 } });
          await page.mouse.move(box.x + box.width * 0.6, box.y + box.height * 0.4, { steps: 4 });
          const tip = c.locator(".recharts-tooltip-wrapper");
          await expect
            .poll(() => tip.innerText().catch(() => ""), { timeout: 5000 })
            .toMatch(/rpm/);
          const tipText = await tip.innerText();
          expect(tipText, chart).not.toMatch(/\d\.\d{4,}|NaN/);
          const unit =
            chart === "power"
              ? units === "metric"
                ? /kW/
                : /hp/
              : chart === "fuel"
                ? /%|λ/
                : units === "metric"
                  ? /kPa/
                  : /psi/;
          expect(tipText, chart).toMatch(unit);
        }
        expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
          390,
        );
        await page.screenshot({
          path: `test-results/screenshots/tune-session-390-${units}.png`,
          fullPage: true,
        });
        await ctx.close();
      }
    } finally {
      await sql`update "user" set unit_system = ${me!.unit_system ?? null} where id = ${me!.id}`;
    }
  }, 300_000);

  it("the owner sets the shop's default limits on Settings; a build's editor starts from them", async () => {
    const [shop] =
      await sql`select tune_limits from shop_settings where shop_id = 'demo-shop-ridgeback'`;
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    try {
      await signInAs(page, "owner");
      await page.goto("/settings");
      const editor = page.getByTestId("tune-limits-shop");
      await expect.poll(() => editor.count(), { timeout: 30000 }).toBe(1);
      await expect(editor.getByTestId("limit-source-maxDutyPct").innerText()).resolves.toMatch(
        /From: (Fuelwright|shop) default/,
      );
      // Nothing typed: nothing to save, nothing written.
      await editor.getByRole("button", { name: "Save the shop's limits" }).click();
      await expect.poll(() => editor.getByText("Nothing to save").count()).toBe(1);
      await editor.getByLabel(/Maximum injector duty/).fill("120");
      await editor.getByRole("button", { name: "Save the shop's limits" }).click();
      await expect(
        editor.getByText(/Maximum injector duty must be between 50.0 % and 100.0 %/).count(),
      ).resolves.toBe(1);
      await editor.getByLabel(/Maximum injector duty/).fill("86");
      await editor.getByRole("button", { name: "Save the shop's limits" }).click();
      await expect
        .poll(() => editor.getByText("Saved as the shop's default limits").count(), {
          timeout: 30000,
        })
        .toBe(1);
      const [after] =
        await sql`select tune_limits from shop_settings where shop_id = 'demo-shop-ridgeback'`;
      expect(after!.tune_limits.maxDutyPct).toBe(86);
      await expect
        .poll(() => editor.getByTestId("limit-source-maxDutyPct").innerText(), { timeout: 15000 })
        .toBe("From: shop default");
      // A tuner reads them on Settings (on a phone: nothing wider than the screen) but cannot
      // change them.
      const tctx = await newClient(browser, { width: 390, height: 844 });
      const tpage = await tctx.newPage();
      await signInAs(tpage, "tuner");
      await tpage.goto("/settings");
      const ro = tpage.getByTestId("tune-limits-shop");
      await expect.poll(() => ro.count(), { timeout: 30000 }).toBe(1);
      expect(await ro.getByRole("button", { name: "Save the shop's limits" }).count()).toBe(0);
      await expect(ro.getByLabel(/Maximum injector duty/).isDisabled()).resolves.toBe(true);
      await expect(ro.getByTestId("limit-source-maxDutyPct").innerText()).resolves.toBe(
        "From: shop default",
      );
      expect(await tpage.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
        390,
      );
      await tctx.close();
    } finally {
      await sql`update shop_settings set tune_limits = ${shop!.tune_limits === null ? null : sql.json(shop!.tune_limits)} where shop_id = 'demo-shop-ridgeback'`;
      await ctx.close();
    }
  }, 180_000);
});
