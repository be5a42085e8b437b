import { mkdirSync } from "node:fs";

import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { formatDateTime } from "@/lib/format/dates";

import { BASE_URL, launchBrowser, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";

let browser: Browser;
const shots = "test-results/screenshots";
let ip = Math.floor(Math.random() * 60000);

beforeAll(async () => {
  mkdirSync(shots, { recursive: true });
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

/** A client of its own (sign-in rate limit), at a width and in a time zone. */
function client(width: number, timezoneId = "UTC") {
  ip++;
  return browser.newContext({
    baseURL: BASE_URL,
    viewport: { width, height: 900 },
    timezoneId,
    extraHTTPHeaders: {
      "x-forwarded-for": `172.${32 + (Math.floor(ip / 62500) % 16)}.${Math.floor(ip / 250) % 250}.${(ip % 250) + 1}`,
    },
  });
}

describe("not-found pages in the browser", () => {
  it.each([390, 1280])("a typed-in build id that names nothing, at %i px", async (width) => {
    const ctx = await client(width);
    const page = await ctx.newPage();
    await signInAs(page, "counter");
    const res = await page.goto("/builds/ffffffffffffffffffffffffffffffffffff");
    expect(res?.status()).toBe(404);
    await expect
      .poll(() => page.getByRole("heading", { level: 1, name: "Build not found" }).count())
      .toBe(1);
    // The shop's frame stays: navigation and sign-out are still there.
    expect(await page.getByRole("navigation", { name: "Main" }).count()).toBe(1);
    const noScroll = await page.evaluate(
      () => document.documentElement.scrollWidth <= document.documentElement.clientWidth,
    );
    expect(noScroll).toBe(true);
    await page.screenshot({ path: `${shots}/not-found-build-${width}.png`, fullPage: true });
    await page.getByRole("link", { name: "Back to the builds" }).click();
    await page.waitForURL("**/builds");
    await ctx.close();
  });

  it("the favicon and the manifest are linked and load", async () => {
    const ctx = await client(1280);
    const page = await ctx.newPage();
    const res = await page.goto("/sign-in");
    expect(res?.status()).toBe(200);
    const hrefs = await page.$$eval('link[rel="icon"], link[rel="manifest"]', (ls) =>
      ls.map((l) => (l as HTMLLinkElement).href),
    );
    expect(hrefs.length).toBeGreaterThanOrEqual(3);
    for (const href of hrefs) expect((await page.request.get(href)).status(), href).toBe(200);
    await ctx.close();
  });
});

describe("times in the shop's zone", () => {
  it("a build's revisions show their save time in the shop's zone whatever the browser's, UTC on the wire", async () => {
    const [row] =
      await sql`select b.id, r.created_at, s.time_zone from builds b join build_revisions r on r.build_id = b.id join shop_settings s on s.shop_id = b.shop_id where b.shop_id = 'demo-shop-ridgeback' order by r.created_at limit 1`;
    const ctx = await client(1280, "Asia/Kolkata"); // UTC+5:30 all year, no summer time
    const page = await ctx.newPage();
    await signInAs(page, "counter");
    await page.goto(`/builds/${row!.id}`);
    const first = page.locator("#revs ~ ol time").first();
    const iso = await first.getAttribute("datetime");
    expect(iso).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/);
    expect(new Date(iso!).getTime()).toBe(new Date(row!.created_at).getTime());
    // The shop's zone (a shop setting), not the browser's Kolkata.
    await expect
      .poll(() => first.innerText())
      .toBe(formatDateTime(iso!, { timeZone: row!.time_zone ?? "UTC" }));
    expect(await first.innerText()).not.toMatch(/GMT\+5:30$/);
    await ctx.close();
  });
});
