import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, newClient } from "../helpers/browser";
import { sql } from "../helpers/db";
import { makeSettingsShop } from "../helpers/settings-shop";

/**
 * The settings form as the owner uses it: a time zone that is an abbreviation is refused on the
 * Time zone field (EST would be stored as a zone without summer time), and a caution level above
 * the danger level is marked on the level the person changed — not always on Danger.
 */

let browser: Browser;
let shop: Awaited<ReturnType<typeof makeSettingsShop>>;
let email: string;

beforeAll(async () => {
  browser = await launchBrowser();
  shop = await makeSettingsShop();
  const [u] = await sql`select email from "user" u join member m on m.user_id = u.id
                        where m.organization_id = ${shop.shopId} and m.role = 'owner'`;
  email = u!.email;
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

async function settingsPage(): Promise<Page> {
  const ctx = await newClient(browser);
  const page = await ctx.newPage();
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("other-shop-pass");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL("**/builds");
  await page.goto("/settings");
  return page;
}
const invalid = (page: Page, label: string | RegExp) =>
  page.getByLabel(label, { exact: typeof label === "string" }).getAttribute("aria-invalid");
const save = (page: Page) => page.getByRole("button", { name: "Save settings" }).click();

describe("the settings form's messages", () => {
  it("refuses EST on the Time zone field and takes a zone from the list", async () => {
    const page = await settingsPage();
    const zone = page.getByLabel("Time zone", { exact: true });
    await zone.fill("EST");
    await save(page);
    await expect.poll(() => invalid(page, "Time zone")).toBe("true");
    expect(await page.getByText(/EST is an abbreviation/).count()).toBe(1);
    const [before] = await sql`select time_zone from shop_settings where shop_id = ${shop.shopId}`;
    expect(before!.time_zone).not.toBe("America/Panama");
    await page.getByLabel("Time zone", { exact: true }).fill("America/New_York");
    await save(page);
    await expect.poll(() => page.getByText("Shop settings saved").count()).toBe(1);
    const [after] = await sql`select time_zone from shop_settings where shop_id = ${shop.shopId}`;
    expect(after!.time_zone).toBe("America/New_York");
  });

  // The new shop's levels: caution above 80 %, danger above 90 % (db/queries/shops.ts).
  it("caution raised above danger: Caution is marked and named, Danger is not", async () => {
    const page = await settingsPage();
    await page.getByLabel("Caution above (%)").fill("95");
    await save(page);
    await expect.poll(() => invalid(page, "Caution above (%)")).toBe("true");
    expect(await invalid(page, "Danger above (%)")).toBe("false");
    expect(
      await page
        .getByText("Caution above (95 %) must not be higher than Danger above (90 %)")
        .count(),
    ).toBe(1);
  });

  it("danger lowered below caution: Danger is marked and named", async () => {
    const page = await settingsPage();
    await page.getByLabel("Danger above (%)").fill("70");
    await save(page);
    await expect.poll(() => invalid(page, "Danger above (%)")).toBe("true");
    expect(await invalid(page, "Caution above (%)")).toBe("false");
    expect(
      await page
        .getByText("Danger above (70 %) must not be lower than Caution above (80 %)")
        .count(),
    ).toBe(1);
  });
});
