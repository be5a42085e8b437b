import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, newClient, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

describe("the counter takes a caller's goal", () => {
  it("adds the caller with a vehicle, starts a draft build the tuner finds in the queue and sizes; a phone number is found however typed", async () => {
    const tag = `Caller ${Date.now().toString(36)}`;
    // A phone-sized screen: the counter works from the front desk's tablet or phone too.
    const ctx = await newClient(browser, { width: 390, height: 844 });
    const page = await ctx.newPage();
    await signInAs(page, "counter");

    // A new customer: name and phone, typed the way the caller says it.
    await page.goto("/customers");
    await page.getByLabel("Name", { exact: true }).fill(tag);
    await page.getByLabel("Phone").fill("201 555 0139");
    await page.getByLabel("City").fill("Alder Falls");
    await page.getByRole("button", { name: "Add customer" }).click();
    await page.waitForURL(/\/customers\/[0-9a-f-]{36}$/);
    const customerUrl = page.url();
    await expect
      .poll(() => page.getByTestId("customer-summary").innerText())
      .toContain("(201) 555-0139");

    // Their vehicle.
    await page.getByRole("button", { name: "Add a vehicle" }).click();
    await page.getByLabel("Year").fill("2004");
    await page.getByLabel("Make").fill("Tamsin");
    await page.getByLabel("Model").fill("Coupe");
    await page.getByLabel("Engine").fill("2.2 turbo four");
    await page.getByLabel("VIN (optional)").fill("1M8GDM9A1KP042788");
    await page.getByRole("button", { name: "Add vehicle" }).click();
    // A VIN with a wrong check digit is named on its field; the rest is kept.
    await expect.poll(() => page.getByText(/check digit/).count()).toBeGreaterThan(0);
    expect(await page.getByLabel("Make").inputValue()).toBe("Tamsin");
    await page.getByLabel("VIN (optional)").fill("");
    await page.getByRole("button", { name: "Add vehicle" }).click();
    await expect
      .poll(() => page.getByRole("list", { name: "Vehicles" }).innerText())
      .toContain("2004 Tamsin Coupe");

    // Found by phone however typed, and by vehicle.
    for (const q of ["5550139", "(555) 0139", "+1 555 0139", "tamsin coupe"]) {
      await page.goto(`/customers?q=${encodeURIComponent(q)}`);
      await expect
        .poll(() => page.getByRole("link", { name: tag }).count(), { message: q })
        .toBe(1);
    }

    // "New build" on the customer page: the goal form, customer and vehicle already chosen.
    await page.goto(customerUrl);
    await page.getByRole("link", { name: "New build" }).click();
    await page.waitForURL(/\/builds\/new\?customer=/);
    await expect
      .poll(() => page.getByLabel("Vehicle", { exact: true }).inputValue())
      .not.toBe("new");
    // The goal in the counter's own units (hp and cu in in the demo shop, kW and L for one who
    // chose metric).
    const powerField = page.getByLabel(/^Power goal \((hp|kW)\)$/);
    const unit = (await page.locator('label[for="f-power"]').innerText()).includes("hp")
      ? "hp"
      : "kW";
    const displacement = page.getByLabel(`Displacement (${unit === "hp" ? "cu in" : "L"})`);
    // An imperial reader typing litres is told the bounds in cubic inches (0.1–20 L =
    // 6.1–1220.5 cu in, 1 in³ = 16.387064 cm³, NIST SP 811 B.8; rounded inwards).
    if (unit === "hp") {
      await displacement.fill("2.2");
      await page.getByRole("button", { name: "Start the build" }).click();
      await expect
        .poll(() => page.getByText("Displacement must be between 7 and 1220 cu in").count())
        .toBeGreaterThan(0);
    }
    // 2.2 L = 134.25 cu in.
    await displacement.fill(unit === "hp" ? "134" : "2.2");
    await page.getByLabel("Cylinders").fill("4");
    await page.getByLabel("Aspiration").selectOption({ label: "Turbocharged" });
    await powerField.fill("");
    await page.getByRole("button", { name: "Start the build" }).click();
    await expect.poll(() => page.getByText("Enter the power goal").count()).toBeGreaterThan(0);
    await powerField.fill(unit === "hp" ? "350" : "261");
    await page.getByLabel("Fuel").selectOption({ label: "E85 (51–83 % ethanol)" });
    await page.getByRole("button", { name: "Start the build" }).click();
    await page.waitForURL(/\/builds\/[0-9a-f-]{36}$/, { timeout: 8000 }).catch(async (e) => {
      await page.screenshot({ path: "test-results/screenshots/draft-fail.png", fullPage: true });
      throw e;
    });
    const buildUrl = page.url();
    const id = buildUrl.split("/").pop()!;

    // The counter's view says plainly whose the sizing fields are.
    await expect.poll(() => page.getByTestId("needs-sizing").count()).toBe(1);
    await expect.poll(() => page.getByTestId("read-only-note").innerText()).toMatch(/tuner's/);
    expect(await page.getByText("Tuner's · read-only").count()).toBeGreaterThan(3);
    expect(await page.getByLabel("Injectors (count)").isDisabled()).toBe(true);
    await page.screenshot({
      path: "test-results/screenshots/counter-draft-build.png",
      fullPage: true,
    });
    const [row] =
      await sql`select status, vehicle_id, tuner_id, inputs from builds where id = ${id}`;
    expect(row).toMatchObject({ status: "needs_sizing", tuner_id: null });
    expect(row!.vehicle_id).toBeTruthy();
    // 350 hp = 261 kW (1 hp = 745.699872 W, NIST SP 811 B.8).
    expect(row!.inputs.target.powerKw).toBeCloseTo(261, 0);
    // 134 cu in = 2.196 L.
    expect(row!.inputs.engine.displacementL).toBeCloseTo(unit === "hp" ? 2.196 : 2.2, 3);

    // The tuner finds it in the queue on their landing page and sizes it.
    const tctx = await newClient(browser);
    const tuner = await tctx.newPage();
    await signInAs(tuner, "tuner");
    const queue = tuner.getByRole("region", { name: /need(s)? sizing/ });
    await expect.poll(() => queue.innerText()).toContain(tag);
    await tuner.getByRole("link", { name: "Needs sizing", exact: false }).first().click();
    await tuner.waitForURL(/status=needs_sizing/);
    await expect.poll(() => tuner.getByRole("table").innerText()).toContain("2004 Tamsin Coupe");
    await tuner.goto(buildUrl);
    await expect
      .poll(() => tuner.getByLabel("Injectors (count)").inputValue(), { timeout: 15000 })
      .toBe("4");
    expect(await tuner.getByTestId("read-only-note").count()).toBe(0);
    await tuner.getByLabel("Status").selectOption({ label: "Sized" });
    await tuner.getByRole("button", { name: "Save build" }).click();
    await expect.poll(() => tuner.getByText("Saved as version 2").count()).toBe(1);
    const [after] = await sql`select status, tuner_id from builds where id = ${id}`;
    expect(after).toMatchObject({ status: "sized", tuner_id: "demo-user-tuner" });
    // Sized, it leaves the queue (it stays in the builds list itself).
    await tuner.goto("/builds");
    await expect
      .poll(() =>
        tuner
          .getByRole("region", { name: /need(s)? sizing/ })
          .getByText(tag)
          .count(),
      )
      .toBe(0);
    await ctx.close();
    await tctx.close();
  });
});
