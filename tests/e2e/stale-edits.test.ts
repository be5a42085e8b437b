import { mkdirSync } from "node:fs";

import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, newClient, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";
import { request, signIn } from "../helpers/http";

/**
 * Two tabs on the same record: the second save does not silently overwrite the first. It is
 * refused, shows what was saved meanwhile beside what was typed, keeps the typing, and saves
 * over only when asked.
 */
let browser: Browser;
const shots = "test-results/screenshots";
const SHOP = "demo-shop-ridgeback";
const tag = `ST${Date.now().toString(36).toUpperCase()}`;

beforeAll(async () => {
  mkdirSync(shots, { recursive: true });
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

describe("stale edit forms", () => {
  it("customer: the second tab sees the conflict, keeps its typing, and saves over when asked", async () => {
    const [c] =
      await sql`insert into customers (shop_id, name) values (${SHOP}, ${`${tag} Customer`}) returning id`;
    const ctx = await newClient(browser);
    const one = await ctx.newPage();
    await signInAs(one, "counter");
    const two = await ctx.newPage();
    await one.goto(`/customers/${c!.id}`);
    await two.goto(`/customers/${c!.id}`);

    const formOne = one.getByRole("form", { name: "Edit customer" });
    await formOne.getByLabel("Phone").fill("(201) 555-0101");
    await formOne.getByRole("button", { name: "Save changes" }).click();
    await expect.poll(() => formOne.getByText("✓ Saved", { exact: true }).count()).toBe(1);

    const formTwo = two.getByRole("form", { name: "Edit customer" });
    await formTwo.getByLabel("Notes").fill("Typed in the second tab");
    await formTwo.getByRole("button", { name: "Save changes" }).click();
    const conflict = formTwo.getByTestId("conflict");
    await expect.poll(() => conflict.count()).toBe(1);
    expect(await conflict.innerText()).toMatch(/Someone saved this customer meanwhile/);
    expect(await conflict.getByRole("row", { name: /Phone/ }).innerText()).toContain(
      "+12015550101",
    );
    // The one conflict table (components/ui/conflict-table.tsx), as the build sheet's below.
    expect(
      await conflict.getByTestId("conflict-table").getByRole("columnheader").allInnerTexts(),
    ).toEqual(["Field", "Yours", "Theirs (saved)"]);
    expect(await formTwo.getByLabel("Notes").inputValue()).toBe("Typed in the second tab");
    const [kept] = await sql`select phone, notes, version from customers where id = ${c!.id}`;
    expect(kept).toEqual({ phone: "+12015550101", notes: null, version: 2 });
    await two.screenshot({ path: `${shots}/customer-stale-edit.png`, fullPage: true });

    await conflict.getByRole("button", { name: "Save mine over theirs" }).click();
    await expect.poll(() => formTwo.getByTestId("conflict").count()).toBe(0);
    await expect.poll(() => formTwo.getByText("✓ Saved", { exact: true }).count()).toBe(1);
    const [mine] = await sql`select phone, notes, version from customers where id = ${c!.id}`;
    expect(mine).toEqual({ phone: null, notes: "Typed in the second tab", version: 3 });
    await ctx.close();
  });

  it("part: the second tab sees the conflict and keeps its typing", async () => {
    const [p] =
      await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, stock) values (${SHOP}, ${`${tag}-FIT`}, 'fitting', 'Testbrand', 'Two tab fitting', 450, 3) returning id`;
    const ctx = await newClient(browser);
    const one = await ctx.newPage();
    await signInAs(one, "counter");
    const two = await ctx.newPage();
    await one.goto(`/parts/${p!.id}`);
    await two.goto(`/parts/${p!.id}`);

    await one.getByLabel("Name").fill("Renamed in tab one");
    await one.getByRole("button", { name: "Save part" }).click();
    await one.waitForURL("**/parts");

    await two.getByLabel("In stock").fill("9");
    await two.getByRole("button", { name: "Save part" }).click();
    const conflict = two.getByTestId("conflict");
    await expect.poll(() => conflict.count()).toBe(1);
    expect(await conflict.getByRole("row", { name: /^name/ }).innerText()).toContain(
      "Renamed in tab one",
    );
    expect(await two.getByLabel("In stock").inputValue()).toBe("9");
    const [kept] = await sql`select name, stock, version from parts where id = ${p!.id}`;
    expect(kept).toEqual({ name: "Renamed in tab one", stock: 3, version: 2 });

    await conflict.getByRole("button", { name: "Save mine over theirs" }).click();
    await two.waitForURL("**/parts");
    const [mine] = await sql`select name, stock, version from parts where id = ${p!.id}`;
    expect(mine).toEqual({ name: "Two tab fitting", stock: 9, version: 3 });
    await ctx.close();
  });

  it("build sheet: the second tab's conflict is the same table, yours beside theirs as typed", async () => {
    const tuner = await signIn("tuner@demo.fuelwright.test");
    const made = await request(tuner, "POST", "/api/v1/builds", {
      customerId: "00000000-0000-4000-8000-000000000001", // a demo customer (db/seed.ts)
      title: `${tag} two tab build`,
    });
    expect(made.status, JSON.stringify(made.json)).toBe(201);
    const url = `/builds/${made.json.build.id}`;
    const ctx = await newClient(browser);
    const one = await ctx.newPage();
    await signInAs(one, "tuner");
    const two = await ctx.newPage();
    for (const p of [one, two]) {
      await p.goto(url);
      await expect
        .poll(() => p.getByLabel("Injectors (count)").inputValue(), { timeout: 30_000 })
        .not.toBe("");
    }
    await one.getByLabel("Drivetrain loss (%)").fill("12");
    await one.getByRole("button", { name: "Save build" }).click();
    await expect.poll(() => one.getByText("Saved as version 2").count()).toBe(1);

    await two.getByLabel("Injectors (count)").fill("8");
    await two.getByRole("button", { name: "Save build" }).click();
    const table = two.getByTestId("conflict").getByTestId("conflict-table");
    await expect.poll(() => table.count()).toBe(1);
    expect(await table.getByRole("columnheader").allInnerTexts()).toEqual([
      "Field",
      "Yours",
      "Theirs (saved)",
    ]);
    // Left blank in this tab (the shop's), 12 % in theirs; the empty side reads "—".
    expect(await table.getByRole("row", { name: /Drivetrain loss/ }).innerText()).toMatch(
      /Drivetrain loss\s+—\s+12 %/,
    );
    expect(await two.getByLabel("Injectors (count)").inputValue()).toBe("8");
    await two.screenshot({ path: `${shots}/build-stale-edit.png`, fullPage: true });
    await ctx.close();
  }, 300_000);
});
