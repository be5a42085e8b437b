import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { cspWatch, seriousViolations } from "../helpers/axe";
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

describe("accessibility (axe-core)", () => {
  it("sign-in, builds, build editor, tools, parts, quotes and a quote have no serious or critical violations", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    const csp = cspWatch(page);
    await page.goto("/sign-in");
    const report: Record<string, string[]> = { "/sign-in": await seriousViolations(page) };
    await signInAs(page, "owner");
    const [quote] =
      await sql`select id from quotes where shop_id = 'demo-shop-ridgeback' order by number limit 1`;
    for (const path of [
      "/builds",
      "/builds/10000000-0000-4000-8000-000000000002",
      "/tools",
      "/parts",
      "/quotes",
      `/quotes/${quote!.id}`,
      "/customers",
      "/settings",
      "/builds/10000000-0000-4000-8000-000000000002/dyno",
    ]) {
      await page.goto(path);
      await page.waitForLoadState("networkidle");
      report[path] = await seriousViolations(page);
    }
    await page.screenshot({ path: "test-results/screenshots/a11y-last.png" });
    expect(Object.fromEntries(Object.entries(report).filter(([, v]) => v.length))).toEqual({});
    expect(csp).toEqual([]);
    await ctx.close();
  });

  it("the customer page, the counter's goal form and a build that needs sizing (as the counter) have none either", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    const csp = cspWatch(page);
    await signInAs(page, "counter");
    const report: Record<string, string[]> = {};
    for (const path of [
      "/customers/00000000-0000-4000-8000-000000000001",
      "/builds/new",
      "/builds/10000000-0000-4000-8000-000000000005",
    ]) {
      await page.goto(path);
      await page.waitForLoadState("networkidle");
      report[path] = await seriousViolations(page);
    }
    expect(Object.fromEntries(Object.entries(report).filter(([, v]) => v.length))).toEqual({});
    expect(csp).toEqual([]);
    await ctx.close();
  });

  it("the customer portal has no serious or critical violations", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "customer");
    await page.waitForLoadState("networkidle");
    expect(await seriousViolations(page)).toEqual([]);
    await ctx.close();
  });
});

describe("keyboard only", () => {
  it("signs in and creates a customer without a mouse", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await page.goto("/sign-in");
    // Tab from the top of the page to the e-mail field, then through the form.
    await page.keyboard.press("Tab");
    for (
      let i = 0;
      i < 10 &&
      (await page.evaluate(() => document.activeElement?.getAttribute("type"))) !== "email";
      i++
    )
      await page.keyboard.press("Tab");
    await page.keyboard.type("counter@demo.fuelwright.test");
    await page.keyboard.press("Tab");
    await page.keyboard.type("fuelwright-demo");
    await page.keyboard.press("Enter");
    await page.waitForURL("**/builds");
    await page.goto("/customers");
    const name = `Keyboard Customer ${Date.now().toString(36)}`;
    for (
      let i = 0;
      i < 60 &&
      (await page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.name)) !==
        "name";
      i++
    )
      await page.keyboard.press("Tab");
    expect(
      await page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.name),
    ).toBe("name");
    await page.keyboard.type(name);
    await page.keyboard.press("Enter");
    await expect
      .poll(
        async () =>
          (await sql`select count(*)::int as n from customers where name = ${name}`)[0]!.n,
      )
      .toBe(1);
    // Saving opens the new customer's page; the focus goes to its content, never back to the
    // top of the page, and the next Tab reaches a control that shows where it is.
    await page.waitForURL(/\/customers\/[0-9a-f-]{36}$/);
    await expect.poll(() => page.evaluate(() => document.activeElement?.id ?? "")).toBe("main");
    await page.keyboard.press("Tab");
    const outline = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null;
      if (!el || el === document.body || el.id === "main") return "none-focused";
      const s = getComputedStyle(el);
      return `${s.outlineStyle} ${s.boxShadow}`;
    });
    expect(outline).not.toBe("none-focused");
    expect(outline).not.toBe("none none");
    await ctx.close();
  });
});
