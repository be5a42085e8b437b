import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, newClient } from "../helpers/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** The editor's fields are filled in by the form library once the page has hydrated. */
async function editorReady(page: Page) {
  await expect.poll(() => page.getByLabel("Injectors (count)").inputValue(), { timeout: 15000 }).not.toBe("");
}

async function signInAs(page: Page, who: string) {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(`${who}@demo.fuelwright.test`);
  await page.getByLabel("Password").fill("fuelwright-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL("**/builds");
}

describe("build sheets", () => {
  it("a tuner creates a build, sees the sizing change while typing, saves and finds it after a reload; a stale second editor gets the conflict", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "tuner");
    await page.getByRole("link", { name: "New build" }).click();
    await page.getByLabel("Customer").selectOption({ label: "Harriet Quill" });
    const title = `Power step ${Date.now()}`;
    await page.getByLabel("Title").fill(title);
    await page.getByRole("button", { name: "Create build sheet" }).click();
    await page.waitForURL(/\/builds\/[0-9a-f-]{36}$/);
    const url = page.url();
    await editorReady(page);

    const duty = () => page.getByTestId("duty-rich").innerText();
    const before = parseFloat(await duty());
    await page.getByLabel("Injectors (count)").fill("12");
    await expect.poll(async () => parseFloat(await duty())).toBeCloseTo(before / 2, 0);
    await page.getByLabel("Injectors (count)").fill("0");
    await expect.poll(() => page.getByText("Injector count must be between 1 and 32").count()).toBeGreaterThan(0);
    await page.getByLabel("Injectors (count)").fill("3");
    await expect.poll(() => page.getByTestId("warnings").innerText()).toMatch(/duty|cannot deliver/i);
    await page.screenshot({ path: "test-results/screenshots/build-editor.png", fullPage: true });
    await page.getByRole("button", { name: "Save build" }).click();
    await expect.poll(() => page.getByText("Saved as version 2").count()).toBe(1);

    const other = await newClient(browser);
    const p2 = await other.newPage();
    await signInAs(p2, "owner");
    await p2.goto(url);
    await editorReady(p2);
    await p2.getByLabel("Injectors (count)").fill("8");

    await page.reload();
    await editorReady(page);
    expect(await page.getByLabel("Injectors (count)").inputValue()).toBe("3");
    await page.getByLabel("Drivetrain loss (%)").fill("12");
    await page.getByRole("button", { name: "Save build" }).click();
    await expect.poll(() => page.getByText("Saved as version 3").count()).toBe(1);

    // The owner's page still holds version 2: saving must not overwrite the tuner's work.
    await p2.getByRole("button", { name: "Save build" }).click();
    await expect.poll(() => p2.getByText(/Someone saved this build meanwhile/).count()).toBe(1);
    expect(await p2.getByLabel("Injectors (count)").inputValue()).toBe("8");

    // Restore version 1 (count 6) as a new revision 4.
    await page.goto(`${url}/revisions/1`);
    page.once("dialog", (d) => void d.accept());
    await page.getByRole("button", { name: "Restore as new revision" }).click();
    await page.waitForURL(url);
    await expect.poll(() => page.getByText("Restored from version 1").count()).toBe(1);
    await editorReady(page);
    expect(await page.getByLabel("Injectors (count)").inputValue()).toBe("6");

    // A power step on the same car starts from these inputs as a new build.
    await page.getByRole("button", { name: "Copy as next power step" }).click();
    await page.waitForURL((u) => /\/builds\/[0-9a-f-]{36}$/.test(u.pathname) && !u.href.startsWith(url));
    await editorReady(page);
    expect(await page.getByLabel("Title").inputValue()).toBe(`${title} — next step`);
    expect(await page.getByLabel("Injectors (count)").inputValue()).toBe("6");

    await page.goto("/builds");
    await page.getByLabel("Search builds").fill(title);
    await expect.poll(() => page.getByRole("link", { name: title, exact: true }).count()).toBe(1);
    await ctx.close();
    await other.close();
  });

  it("the blend mixer answers a worked case", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "counter");
    await page.goto("/tools");
    // By hand: 20 L of E10 to E50 with E85: 20·40/35 = 22.9 L.
    await page.getByLabel("Fuel in the tank (L)").fill("20");
    await page.getByLabel("Its ethanol content (%)").fill("10");
    await page.getByLabel("Ethanol content of the fuel added (%)").fill("85");
    await page.getByLabel("Target (%)").fill("50");
    await page.getByLabel("Tank capacity (L)").fill("60");
    await expect.poll(() => page.getByTestId("mix-result").innerText()).toContain("Add 22.9 L");
    await page.getByLabel("Tank capacity (L)").fill("30");
    await expect.poll(() => page.getByTestId("mix-result").innerText()).toMatch(/Drain .* first/);
    await ctx.close();
  });
});
