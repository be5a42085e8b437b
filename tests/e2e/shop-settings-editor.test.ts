import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { sizeParsedFuelSystem, type FuelSystemInput, type FuelSystemResult } from "@/lib/calc";
import { formatDateTime } from "@/lib/format/dates";
import { parsedEffectiveInputs, sizingSettingsOf } from "@/lib/sizing/effective-inputs";

import { boostedSix } from "../calc/fixtures";
import { launchBrowser, newClient } from "../helpers/browser";
import { sql } from "../helpers/db";
import { request } from "../helpers/http";
import { CHANGED_COLUMNS, CHANGED_SETTINGS, makeSettingsShop } from "../helpers/settings-shop";

/**
 * The live editor sizes with the shop's settings, as the save will: every figure beside the
 * form uses the shop's limits, BSFC, drivetrain loss for the chosen drive and fuel properties;
 * a build saved under older settings says so and re-sizes with one click.
 */

let browser: Browser;
let shop: Awaited<ReturnType<typeof makeSettingsShop>>;
let email: string;
let older: string;
let newer: { id: string; result: FuelSystemResult };

const bare = (): FuelSystemInput => {
  const b = structuredClone(boostedSix);
  delete b.target.drivetrainLossPct;
  b.target.driveType = "automatic";
  return b;
};

beforeAll(async () => {
  browser = await launchBrowser();
  shop = await makeSettingsShop();
  const [u] = await sql`select email from "user" u join member m on m.user_id = u.id
                        where m.organization_id = ${shop.shopId} and m.role = 'owner'`;
  email = u!.email;
  const a = await request(shop.owner, "POST", "/api/v1/builds", {
    customerId: shop.customerId,
    title: "Editor: sized before",
    inputs: bare(),
  });
  older = a.json.build.id;
  const patched = await request(shop.owner, "PATCH", "/api/v1/shop/settings", CHANGED_SETTINGS);
  expect(patched.status).toBe(200);
  const b = await request(shop.owner, "POST", "/api/v1/builds", {
    customerId: shop.customerId,
    title: "Editor: sized after",
    inputs: bare(),
  });
  newer = { id: b.json.build.id, result: b.json.build.result };
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

async function signIn(page: Page) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("other-shop-pass");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL("**/builds");
}
async function editorReady(page: Page) {
  await expect
    .poll(() => page.getByLabel("Injectors (count)").inputValue(), { timeout: 15000 })
    .not.toBe("");
}
const duty = (page: Page) => page.getByTestId("duty-rich").innerText();

describe("the live editor uses the shop's settings", () => {
  it("shows the saved figures, the shop's limits and loss, and follows the drive type", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signIn(page);
    await page.goto(`/builds/${newer.id}`);
    await editorReady(page);
    // The shop's units (metric): its owner has chosen none of their own.
    expect(await page.getByLabel("Target power (kW)").inputValue()).toBe("450");
    // The live figure is the saved one: the browser sized with the same settings.
    expect(await duty(page)).toContain(newer.result.blend.rich.dutyPct.toFixed(1));
    const note = () => page.getByTestId("sizing-settings").innerText();
    expect(await note()).toContain(
      "Sized for 75 % injector duty (caution above 75 %, danger above 88 %), a pump margin of at least 40 % and line drops of at most 10 kPa",
    );
    expect(await note()).toContain("18 % drivetrain loss (automatic gearbox)");
    // Gasoline 0.74 and ethanol 0.785 kg/L by volume at E85 (calc-spec §1): 0.15·0.74 + 0.85·0.785.
    expect(await note()).toContain(`density ${(0.15 * 0.74 + 0.85 * 0.785).toFixed(3)} kg/L`);
    expect(await page.getByTestId("loss-from-shop").innerText()).toContain("the shop's 18 %");
    await expect.poll(() => page.getByText("unsaved changes").count()).toBe(0);

    // All-wheel drive: the shop's 24 %; duty grows with crank power, ∝ 1 / (1 − loss).
    await page.getByLabel("Drive type").selectOption("awd");
    await expect.poll(() => page.getByTestId("loss-from-shop").innerText()).toContain("24 %");
    await expect.poll(note).toContain("24 % drivetrain loss (all-wheel drive)");
    const awd = bare();
    awd.target.driveType = "awd";
    const expected = sizeParsedFuelSystem(
      parsedEffectiveInputs(sizingSettingsOf(CHANGED_COLUMNS), awd),
    ).blend.rich.dutyPct;
    expect(expected / newer.result.blend.rich.dutyPct).toBeCloseTo((1 - 0.18) / (1 - 0.24), 9);
    await expect.poll(() => duty(page)).toContain(expected.toFixed(1));

    // A loss typed on the build wins over the shop's.
    await page.getByLabel("Drivetrain loss (%)").fill("10");
    await expect.poll(note).toContain("10 % drivetrain loss (all-wheel drive)");
    await expect.poll(() => page.getByTestId("loss-from-shop").count()).toBe(0);
    await page.screenshot({ path: "test-results/screenshots/editor-shop-settings.png" });
    await ctx.close();
  });

  it("every time is read in the shop's zone, whatever the browser's (a Tokyo browser)", async () => {
    const ctx = await newClient(browser, undefined, "Asia/Tokyo");
    const page = await ctx.newPage();
    await signIn(page);
    await page.goto(`/builds/${newer.id}`);
    await editorReady(page);
    const [rev] = await sql`select created_at from build_revisions
                            where build_id = ${newer.id} and version = 1`;
    // The shop's zone is Pacific/Auckland (CHANGED_SETTINGS); Tokyo is GMT+9.
    const shopTime = formatDateTime(rev!.created_at, { timeZone: "Pacific/Auckland" });
    const tokyoTime = formatDateTime(rev!.created_at, { timeZone: "Asia/Tokyo" });
    expect(shopTime).not.toBe(tokyoTime);
    await expect.poll(() => page.locator("main").innerText()).toContain(shopTime);
    const main = await page.locator("main").innerText();
    expect(main).not.toContain(tokyoTime);
    expect(main).not.toMatch(/GMT\+9|\d{2}:\d{2} UTC/);
    await page.goto(`/builds/${newer.id}/revisions/1`);
    await expect.poll(() => page.locator("main").innerText()).toContain(`saved ${shopTime}`);
    await ctx.close();
  });

  it("the parts kit of a build sized under older settings says so", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signIn(page);
    await page.goto(`/builds/${older}/kit`);
    const notice = page.getByTestId("settings-changed");
    await expect.poll(() => notice.count()).toBe(1);
    const text = await notice.innerText();
    expect(text).toContain("sized with the shop's settings of the time");
    expect(text).toMatch(/Design duty: 80 % → 75 %/);
    // A build sized with today's settings has no such note.
    await page.goto(`/builds/${newer.id}/kit`);
    await page.getByRole("heading", { level: 1 }).waitFor();
    expect(await page.getByTestId("settings-changed").count()).toBe(0);
    await ctx.close();
  });

  it("a build sized under older settings says so and re-sizes with today's", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signIn(page);
    await page.goto(`/builds/${older}`);
    await editorReady(page);
    const notice = page.getByTestId("settings-changed");
    await expect.poll(() => notice.count()).toBe(1);
    const text = await notice.innerText();
    expect(text).toMatch(/Design duty: 80 % → 75 %/);
    expect(text).toMatch(/Drivetrain loss: 17 % → 18 %/);
    // The live figures already use today's settings: the same as the build made after.
    expect(await duty(page)).toContain(newer.result.blend.rich.dutyPct.toFixed(1));
    await page.getByRole("button", { name: "Re-size with today's settings" }).click();
    await expect
      .poll(() => page.getByText("Re-sized with today's shop settings as version 2").count())
      .toBe(1);
    await expect.poll(() => notice.count()).toBe(0);
    const [rev] =
      await sql`select result, note from build_revisions where build_id = ${older} and version = 2`;
    expect(rev!.note).toBe("Re-sized with today's shop settings");
    expect(rev!.result.blend.rich.dutyPct).toBeCloseTo(newer.result.blend.rich.dutyPct, 9);
    await page.reload();
    await editorReady(page);
    expect(await notice.count()).toBe(0);
    await ctx.close();
  });
});
