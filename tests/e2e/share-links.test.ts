import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, newClient, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";

let browser: Browser;
const BUILD = "10000000-0000-4000-8000-000000000003"; // demo twin-turbo V8 (db/seed.ts)

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

describe("sharing a spec sheet from the build page", () => {
  it("the counter makes a 7-day link that opens without an account, then withdraws it", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "counter");
    await page.goto(`/builds/${BUILD}`);
    const section = page.getByRole("region", { name: "Share the spec sheet" });
    await section.getByLabel("Link works for").selectOption("7");
    await section.getByRole("button", { name: "Make a link" }).click();
    await expect.poll(() => section.getByText(/Link made/).count()).toBe(1);
    const url = await section.getByLabel("Share link").inputValue();
    expect(url).toMatch(/\/share\/[\w-]+\.[\w-]+$/);

    const [row] =
      await sql`select id, expires_at, revoked_at from share_links where build_id = ${BUILD} order by created_at desc limit 1`;
    expect(row!.revoked_at).toBeNull();
    expect(
      Math.abs(new Date(row!.expires_at).getTime() - Date.now() - 7 * 86_400_000),
    ).toBeLessThan(120_000);

    const guest = await newClient(browser);
    const shared = await guest.newPage();
    await shared.goto(new URL(url).pathname);
    expect(await shared.getByText("Twin-turbo V8").count()).toBeGreaterThan(0);

    page.once("dialog", (d) => void d.accept());
    await section.getByRole("button", { name: "Withdraw" }).first().click();
    await expect.poll(() => section.getByText("Link withdrawn").count()).toBe(1);
    const [after] = await sql`select revoked_at from share_links where id = ${row!.id}`;
    expect(after!.revoked_at).not.toBeNull();
    await shared.reload();
    expect(await shared.getByText(/withdrawn by the shop/).count()).toBe(1);
    await guest.close();
    await ctx.close();
  });
});
