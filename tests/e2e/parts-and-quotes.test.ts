import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, newClient, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";
import { request, signIn } from "../helpers/http";
import { waitForMail } from "../helpers/mail";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

describe("parts counter", () => {
  it("a counter user imports a CSV, takes a build's recommended kit, quotes it and e-mails the quote", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "counter");
    await page.goto("/parts");
    await page.getByRole("link", { name: "Import CSV" }).click();
    const tag = `E2E${Date.now().toString(36).toUpperCase()}`;
    const csv = [
      "sku,category,brand,name,price,stock,flow_cc_min,rated_kpa,min_pulse_ms,ethanol_ok",
      `${tag}-1,injector,Testbrand,Bad row,twelve,4,1000,300,1.0,yes`,
    ].join("\n");
    await page
      .getByLabel("Catalog file (CSV)")
      .setInputFiles({ name: "catalog.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
    await expect
      .poll(() => page.getByTestId("import-errors").innerText())
      .toMatch(/2\s+price\s+Price must be an amount/);
    const good =
      csv.replace("twelve", "139.00").replace("Bad row", "Import test injector") +
      `\n${tag}-2,injector,Testbrand,Second import test injector,149.00,8,1100,300,1.0,yes`;
    await page
      .getByLabel("Catalog file (CSV)")
      .setInputFiles({ name: "catalog.csv", mimeType: "text/csv", buffer: Buffer.from(good) });
    await page.getByRole("button", { name: "Import 2 parts" }).click();
    await expect.poll(() => page.getByText("Imported: 2 added, 0 updated").count()).toBe(1);
    await page.goto("/parts");
    await page.getByLabel("Search parts").fill(tag);
    await expect.poll(() => page.locator("tbody tr").count()).toBe(2);

    // The turbo six on E85 from the demo data.
    await page.goto("/builds/10000000-0000-4000-8000-000000000002/kit");
    await expect
      .poll(() => page.getByText("Best fit").count(), { timeout: 15000 })
      .toBeGreaterThan(0);
    await page.screenshot({ path: "test-results/screenshots/kit.png", fullPage: true });
    // The counter's choice goes on the quote; the tuner's sizing stays as it is.
    await page.getByRole("button", { name: "Use these parts for the quote" }).click();
    await expect
      .poll(() => page.getByText(/Parts kept for the quote \(version \d+\)/).count())
      .toBe(1);
    await page.getByRole("button", { name: "Create quote from the chosen parts" }).click();
    await page.waitForURL(/\/quotes\/[0-9a-f-]{36}$/);
    const label = (await page.getByRole("heading", { level: 1 }).innerText()).replace("Quote ", "");
    await expect.poll(() => page.getByTestId("quote-total").innerText()).toMatch(/^\$\d/);
    await page.getByRole("button", { name: "Send to customer" }).click();
    await expect
      .poll(() => page.getByText("Sent to customer@demo.fuelwright.test").count())
      .toBe(1);
    await expect.poll(() => page.getByTestId("quote-status").innerText()).toBe("Sent");
    await expect.poll(() => page.getByTestId("quote-messages").count()).toBe(1);
    await page.screenshot({ path: "test-results/screenshots/quote.png", fullPage: true });
    const mail = await waitForMail("customer@demo.fuelwright.test", new RegExp(label));
    expect(mail.text).toContain("/my/quotes/");
    await ctx.close();
  });

  it("saving a part in the form keeps its dead-time table; a taken SKU is shown on the SKU field", async () => {
    const tag = `E2F${Date.now().toString(36).toUpperCase()}`;
    // Invented figures (inputs, not check values).
    const specs = {
      ratedFlowCcPerMin: 1000,
      ratedPressureKpa: 300,
      impedance: "high",
      ethanolOk: true,
      deadTime: { voltages: [12, 14], pressuresKpa: [300], deadTimeMs: [[1.1], [0.85]] },
    };
    const [part] =
      await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, stock, specs)
        values ('demo-shop-ridgeback', ${`${tag}-1`}, 'injector', 'Testbrand', 'Form test injector', 9900, 5, ${sql.json(specs)})
        returning id`;
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "counter");
    await page.goto(`/parts/${part!.id}`);
    await page.getByLabel("Name", { exact: true }).fill("Form test injector, renamed");
    await page.getByRole("button", { name: "Save part" }).click();
    await page.waitForURL(/\/parts$/);
    const [saved] = await sql`select name, specs from parts where id = ${part!.id}`;
    expect(saved!.name).toBe("Form test injector, renamed");
    expect(saved!.specs).toEqual(specs);

    await page.goto(`/parts/${part!.id}`);
    await page.getByLabel("SKU", { exact: true }).fill("HF-INJ-1000"); // a demo part's SKU (db/seed-catalog.ts)
    await page.getByRole("button", { name: "Save part" }).click();
    await expect
      .poll(() => page.getByText("SKU HF-INJ-1000 is already in the catalog").count())
      .toBeGreaterThan(0);
    await expect
      .poll(() => page.getByLabel("SKU", { exact: true }).getAttribute("aria-invalid"))
      .toBe("true");
    await ctx.close();
  });

  it("the part editor shows and takes flows, pressures and tables in the reader's units; an unchanged save writes nothing", async () => {
    const tag = `E2U${Date.now().toString(36).toUpperCase()}`;
    // Invented figures (inputs, not check values).
    const specs = {
      ratedFlowCcPerMin: 1000,
      ratedPressureKpa: 300,
      ethanolOk: true,
      ratingFluidDensityKgPerL: 0.684,
      deadTime: {
        voltages: [12, 14],
        pressuresKpa: [300, 500],
        deadTimeMs: [
          [1.1, 1.2],
          [0.85, 0.95],
        ],
      },
    };
    const [part] =
      await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, stock, specs)
        values ('demo-shop-ridgeback', ${`${tag}-1`}, 'injector', 'Testbrand', 'Units test injector', 9900, 5, ${sql.json(specs)})
        returning id`;
    // The counter's own units, else the shop's (the demo shop's are imperial: db/seed.ts).
    const [who] = await sql`select coalesce(u.unit_system, s.units) as units
      from "user" u join member m on m.user_id = u.id
      join shop_settings s on s.shop_id = m.organization_id
      where u.email = 'counter@demo.fuelwright.test'`;
    const imp = who!.units === "imperial";
    const rowText = async () =>
      (await sql`select p::text as t from parts p where id = ${part!.id}`)[0]!.t as string;
    const before = await rowText();
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "counter");
    await page.goto(`/parts/${part!.id}`);
    // 1000 cc/min of the 0.72 kg/L rating fluid = 95.2 lb/h (registry); 300 kPa = 43.5 psi,
    // 500 kPa = 72.5 psi (NIST SP 811 B.8); 0.684 kg/L = 5.71 lb/gal.
    const flow = page.getByLabel(`Rated flow (${imp ? "lb/h" : "cc/min"})`);
    await expect.poll(() => flow.inputValue()).toBe(imp ? "95.2" : "1000");
    expect(await page.getByLabel(`Rated at (${imp ? "psi" : "kPa"})`).inputValue()).toBe(
      imp ? "43.5" : "300",
    );
    expect(
      await page.getByLabel(`Rating fluid density (${imp ? "lb/gal" : "kg/L"})`).inputValue(),
    ).toBe(imp ? "5.71" : "0.684");
    expect(await page.getByLabel("Dead time table").inputValue()).toBe(
      imp
        ? "12V 43.5:1.1 72.5:1.2 | 14V 43.5:0.85 72.5:0.95"
        : "12V 300:1.1 500:1.2 | 14V 300:0.85 500:0.95",
    );
    expect(await page.locator("main").innerText()).toContain(imp ? "(psi:ms)" : "(kPa:ms)");
    // Saved as loaded: the row stays byte for byte (no version, no updated_at).
    await page.getByRole("button", { name: "Save part" }).click();
    await page.waitForURL(/\/parts$/);
    expect(await rowText()).toBe(before);

    // Out of bounds: said in the reader's units (20–10000 cc/min = 1.9–952.4 lb/h).
    await page.goto(`/parts/${part!.id}`);
    await expect.poll(() => flow.inputValue()).not.toBe("");
    await flow.fill(imp ? "2000" : "20000");
    await page.getByRole("button", { name: "Save part" }).click();
    await expect
      .poll(() => page.getByText(/Rated flow must be a number between/).count())
      .toBeGreaterThan(0);
    expect(
      await page
        .getByText(/Rated flow must be a number between/)
        .first()
        .innerText(),
    ).toContain(imp ? "between 1.9 and 952.4 lb/h" : "between 20 and 10000 cc/min");
    // Typed in the reader's units, stored canonical: 100 lb/h = 1050.0 cc/min at 0.72 kg/L; the
    // table's pressure cells left as shown keep their exact kPa, the edited dead time changes.
    await flow.fill(imp ? "100" : "1050");
    await page
      .getByLabel("Dead time table")
      .fill(
        imp
          ? "12V 43.5:1.1 72.5:1.25 | 14V 43.5:0.85 72.5:0.95"
          : "12V 300:1.1 500:1.25 | 14V 300:0.85 500:0.95",
      );
    await page.getByRole("button", { name: "Save part" }).click();
    await page.waitForURL(/\/parts$/);
    const [saved] = await sql`select specs from parts where id = ${part!.id}`;
    expect(saved!.specs.ratedFlowCcPerMin).toBeCloseTo(1050, 0);
    expect(saved!.specs.ratedPressureKpa).toBe(300);
    expect(saved!.specs.ratingFluidDensityKgPerL).toBe(0.684);
    expect(saved!.specs.deadTime).toEqual({
      voltages: [12, 14],
      pressuresKpa: [300, 500],
      deadTimeMs: [
        [1.1, 1.25],
        [0.85, 0.95],
      ],
    });
    await ctx.close();
  });

  it("the quote editor saves through its server action and says so when someone else saved first", async () => {
    const api = await signIn("counter@demo.fuelwright.test");
    const created = await request(api, "POST", "/api/v1/quotes", {
      customerId: "00000000-0000-4000-8000-000000000001", // the portal customer (db/seed.ts)
    });
    expect(created.status).toBe(201);
    const q = created.json.quote as { id: string; version: number };
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "counter");
    await page.goto(`/quotes/${q.id}`);
    await page.getByRole("button", { name: "Add labour" }).click();
    await page.getByLabel("Line 1 quantity").fill("2");
    await page.getByRole("button", { name: "Save quote" }).click();
    await expect.poll(() => page.getByText("Quote saved").count()).toBe(1);
    // The page shows the saved quote again: nothing left to save.
    await expect
      .poll(() => page.getByRole("button", { name: "Save quote" }).isDisabled())
      .toBe(true);
    // By hand: 2 h × 120.00 = 240.00; 8.25 % tax (demo shop) = 19.80; 259.80.
    await expect.poll(() => page.getByTestId("quote-total").innerText()).toBe("$259.80");
    const saved = await request(api, "GET", `/api/v1/quotes/${q.id}`);
    expect(saved.json.quote).toMatchObject({ version: q.version + 1, totalMinor: 25980 });

    // Someone else saves meanwhile: this editor's save is refused and nothing is overwritten.
    const other = await request(api, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version + 1,
      notes: "Saved elsewhere",
    });
    expect(other.status).toBe(200);
    await page.getByLabel("Notes for the customer").fill("Saved here");
    await page.getByRole("button", { name: "Save quote" }).click();
    await expect.poll(() => page.getByText(/Someone changed this quote meanwhile/).count()).toBe(1);
    const after = await request(api, "GET", `/api/v1/quotes/${q.id}`);
    expect(after.json.quote).toMatchObject({ version: q.version + 2, notes: "Saved elsewhere" });
    await ctx.close();
  });

  it("a line past the limits marks that line's field with the limit in money, focused; the sum's limit reads as money", async () => {
    const api = await signIn("counter@demo.fuelwright.test");
    const created = await request(api, "POST", "/api/v1/quotes", {
      customerId: "00000000-0000-4000-8000-000000000001", // the portal customer (db/seed.ts)
      lines: [
        { kind: "fee", description: "Dyno session", quantityMilli: 1000, unitPriceMinor: 15000 },
      ],
    });
    expect(created.status).toBe(201);
    const q = created.json.quote as { id: string; version: number };
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "counter");
    await page.goto(`/quotes/${q.id}`);
    const price = page.getByLabel("Line 1 unit price");
    const qty = page.getByLabel("Line 1 quantity");
    const save = page.getByRole("button", { name: "Save quote" });
    // One cent past the most a line's unit price may be; typed again until the page has hydrated
    // (Save is offered once something changed).
    await expect
      .poll(
        async () => {
          await price.fill("1000000.01");
          return save.isEnabled();
        },
        { timeout: 30000 },
      )
      .toBe(true);
    await save.click();
    await expect.poll(() => price.getAttribute("aria-invalid")).toBe("true");
    await expect
      .poll(() => page.evaluate(() => document.activeElement?.getAttribute("aria-label")))
      .toBe("Line 1 unit price");
    const described = await price.getAttribute("aria-describedby");
    expect(await page.locator(`[id="${described}"]`).innerText()).toBe("At most $1,000,000.00");
    await expect
      .poll(() =>
        page
          .getByText("Check the highlighted fields: Line 1 unit price: At most $1,000,000.00")
          .count(),
      )
      .toBe(1);

    await price.fill("1000000.00");
    await expect.poll(() => price.getAttribute("aria-invalid")).toBe("false");
    await qty.fill("100000.001");
    await page.getByRole("button", { name: "Save quote" }).click();
    await expect.poll(() => qty.getAttribute("aria-invalid")).toBe("true");
    const qtyNote = await qty.getAttribute("aria-describedby");
    expect(await page.locator(`[id="${qtyNote}"]`).innerText()).toBe("At most 100,000");
    await expect
      .poll(() => page.evaluate(() => document.activeElement?.getAttribute("aria-label")))
      .toBe("Line 1 quantity");

    // Each within its limit, the line's amount is more than a quote holds.
    await qty.fill("100000");
    await expect
      .poll(() => page.getByTestId("quote-size-error").innerText())
      .toBe("✕ The lines add up to more than $10,737,418.23, the most one quote can hold");
    await page.getByRole("button", { name: "Save quote" }).click();
    await expect
      .poll(() => page.getByText(/^✕ The lines add up to more than \$10,737,418\.23/).count())
      .toBe(2);
    // Nothing was saved; the API says the same limit as money, on lines.
    const api422 = await request(api, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      lines: [
        {
          kind: "fee",
          description: "Dyno session",
          quantityMilli: 100_000_000,
          unitPriceMinor: 100_000_000,
        },
      ],
    });
    expect(api422.status).toBe(422);
    expect(api422.json.error.issues).toEqual([
      {
        path: "lines",
        message: "The lines add up to more than $10,737,418.23, the most one quote can hold",
      },
    ]);
    const after = await request(api, "GET", `/api/v1/quotes/${q.id}`);
    expect(after.json.quote).toMatchObject({ version: q.version });
    await ctx.close();
  });

  it("editing a sent quote says beforehand that it makes the next revision, then opens that draft", async () => {
    const api = await signIn("counter@demo.fuelwright.test");
    const created = await request(api, "POST", "/api/v1/quotes", {
      customerId: "00000000-0000-4000-8000-000000000001", // the portal customer (db/seed.ts)
    });
    const q = created.json.quote as { id: string; version: number; number: number };
    const saved = await request(api, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      lines: [
        {
          kind: "labour",
          description: "Fitting",
          quantityMilli: 1000,
          unitPriceMinor: 12000,
          discountBp: 0,
        },
      ],
    });
    expect(saved.status).toBe(200);
    expect((await request(api, "POST", `/api/v1/quotes/${q.id}/send`)).status).toBe(200);
    const label = `Q-${String(q.number).padStart(4, "0")}`;

    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "counter");
    await page.goto(`/quotes/${q.id}`);
    await expect
      .poll(() => page.getByTestId("revision-notice").innerText())
      .toContain(
        `Editing makes revision 2 (${label}-r2), a draft; the customer sees it after you send it.`,
      );
    await page.getByLabel("Line 1 quantity").fill("2");
    await page.getByRole("button", { name: "Save as revision 2" }).click();
    await page.waitForURL(
      (u) => /\/quotes\/[0-9a-f-]{36}$/.test(u.pathname) && !u.pathname.endsWith(q.id),
    );
    await expect
      .poll(() => page.getByRole("heading", { level: 1 }).innerText())
      .toBe(`Quote ${label}-r2`);
    await expect.poll(() => page.getByTestId("quote-status").innerText()).toBe("Draft");
    // By hand: 2 h × 120.00 = 240.00; 8.25 % tax (demo shop) = 19.80; 259.80.
    await expect.poll(() => page.getByTestId("quote-total").innerText()).toBe("$259.80");
    const [old] = await sql`select status, total_minor from quotes where id = ${q.id}`;
    // By hand: 1 h × 120.00 = 120.00; 8.25 % tax = 9.90; 129.90.
    expect(old).toMatchObject({ status: "superseded", total_minor: 12990 });
    await ctx.close();
  });
});
