import { mkdirSync } from "node:fs";

import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, newClient } from "../helpers/browser";
import { sql } from "../helpers/db";
import { firstLink, waitForMail } from "../helpers/mail";

let browser: Browser;
const shots = "test-results/screenshots";

beforeAll(async () => {
  mkdirSync(shots, { recursive: true });
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

async function signIn(page: Page, email: string, password = "fuelwright-demo") {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

const navLabels = (page: Page) =>
  page.getByRole("navigation", { name: "Main" }).getByRole("link").allInnerTexts();

describe("demo sign-ins", () => {
  it.each([
    [
      "owner",
      ["Builds", "Customers", "Parts", "Quotes", "Jobs", "Purchasing", "Tools", "Settings"],
      "/builds",
    ],
    [
      "tuner",
      ["Builds", "Customers", "Parts", "Quotes", "Jobs", "Purchasing", "Tools", "Settings"],
      "/builds",
    ],
    [
      "counter",
      ["Builds", "Customers", "Parts", "Quotes", "Jobs", "Purchasing", "Tools", "Settings"],
      "/builds",
    ],
    ["customer", ["My builds"], "/my"],
  ])("%s sees their navigation", async (role, expected, landing) => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signIn(page, `${role}@demo.fuelwright.test`);
    await page.waitForURL(`**${landing}`);
    expect(await navLabels(page)).toEqual(expected);
    await expect
      .poll(() => page.getByTestId("who").innerText())
      .toContain(role === "customer" ? "Customer" : role[0]!.toUpperCase() + role.slice(1));
    await page.screenshot({ path: `${shots}/nav-${role}.png`, fullPage: true });
    await ctx.close();
  });

  it("a wrong password says so and keeps the e-mail typed", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signIn(page, "owner@demo.fuelwright.test", "not-the-password");
    await expect.poll(() => page.getByText("do not match").count()).toBe(1);
    expect(await page.getByLabel("E-mail").inputValue()).toBe("owner@demo.fuelwright.test");
    await ctx.close();
  });
});

describe("customers", () => {
  it("counter creates and edits a customer", async () => {
    const ctx = await newClient(browser, { width: 390, height: 844 });
    const page = await ctx.newPage();
    await signIn(page, "counter@demo.fuelwright.test");
    await page.waitForURL("**/builds");
    await page.goto("/customers");
    const form = page.getByRole("form", { name: "Add customer" });
    await form.getByRole("button", { name: "Add customer" }).click();
    await expect.poll(() => form.getByText("Enter the customer's name").count()).toBe(1);
    const name = `Rosalind Fenwick ${Date.now()}`;
    await form.getByLabel("Name").fill(name);
    await form.getByLabel("E-mail").fill("not-an-email");
    await form.getByRole("button", { name: "Add customer" }).click();
    await expect.poll(() => form.getByText("Enter a valid e-mail address").count()).toBe(1);
    await form.getByLabel("E-mail").fill("rosalind.fenwick@example.test");
    await form.getByRole("button", { name: "Add customer" }).click();
    await page.waitForURL(/\/customers\/[0-9a-f-]{36}$/);
    const edit = page.getByRole("form", { name: "Edit customer" });
    await edit.getByLabel("Phone").fill("201-555-0123");
    await edit.getByRole("button", { name: "Save changes" }).click();
    await expect.poll(() => edit.getByText("Saved").count()).toBe(1);
    const [row] = await sql`select phone, shop_id from customers where name = ${name}`;
    expect(row).toMatchObject({ phone: "+12015550123", shop_id: "demo-shop-ridgeback" });
    await page.screenshot({ path: `${shots}/customer-edit-phone.png`, fullPage: true });
    await page.getByRole("button", { name: "Delete customer" }).click();
    await page.getByRole("dialog").getByRole("button", { name: "Keep" }).click();
    expect(await sql`select 1 from customers where name = ${name}`).toHaveLength(1);
    await page.getByRole("button", { name: "Delete customer" }).click();
    await page.getByRole("dialog").getByRole("button", { name: "Delete" }).click();
    await page.waitForURL(/\/customers$/);
    expect(await sql`select 1 from customers where name = ${name}`).toHaveLength(0);
    await ctx.close();
  });
});

describe("settings", () => {
  it("a tuner sees the shop defaults read-only and no invitation form", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signIn(page, "tuner@demo.fuelwright.test");
    await page.waitForURL("**/builds");
    await page.goto("/settings");
    expect(await page.getByLabel("Shop name").isDisabled()).toBe(true);
    expect(await page.getByRole("form", { name: "Invite member" }).count()).toBe(0);
    await ctx.close();
  });

  it("the owner invites a tuner; the e-mailed link lets them set a password and join", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signIn(page, "owner@demo.fuelwright.test");
    await page.waitForURL("**/builds");
    await page.goto("/settings");
    const email = `ines.halvorsen.${Date.now()}@example.test`;
    const invite = page.getByRole("form", { name: "Invite member" });
    await invite.getByLabel("E-mail").fill(email);
    await invite.getByLabel("Role").selectOption("tuner");
    await invite.getByRole("button", { name: "Send invitation" }).click();
    await expect.poll(() => invite.getByText(`Invitation sent to ${email}`).count()).toBe(1);
    const mail = await waitForMail(email, /invites you/);
    await ctx.close();

    const guest = await newClient(browser);
    const p2 = await guest.newPage();
    await p2.goto(firstLink(mail.text));
    await p2.getByLabel("Your name").fill("Ines Halvorsen");
    await p2.getByLabel("Choose a password").fill("short");
    await p2.getByRole("button", { name: "Join the shop" }).click();
    await expect.poll(() => p2.getByText("Use at least 10 characters").count()).toBe(1);
    await p2.getByLabel("Choose a password").fill("a-long-enough-password");
    await p2.getByRole("button", { name: "Join the shop" }).click();
    await p2.waitForURL("**/builds");
    expect(await navLabels(p2)).toContain("Settings");
    await expect.poll(() => p2.getByTestId("who").innerText()).toContain("Tuner");
    const [m] =
      await sql`select m.role from member m join "user" u on u.id = m.user_id where u.email = ${email}`;
    expect(m!.role).toBe("tuner");
    await p2.screenshot({ path: `${shots}/invited-tuner.png` });
    await guest.close();
  });
});

describe("sign-up", () => {
  it("shows field errors for bad input, then creates a shop with its owner after e-mail confirmation", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await page.goto("/sign-up");
    const form = page.getByRole("form", { name: "Sign up" });
    await form.getByLabel("Your name").fill("Okonkwo Brandt");
    await form.getByLabel("Shop name").fill("Brandt Boost Works");
    await form.getByLabel("E-mail").fill("not-an-address");
    await form.getByLabel("Password").fill("short");
    await form.getByRole("button", { name: "Create shop account" }).click();
    await expect.poll(() => form.getByText("Enter a valid e-mail address").count()).toBe(1);
    expect(await form.getByText("Use at least 10 characters").count()).toBe(1);
    expect(await form.getByLabel("Shop name").inputValue()).toBe("Brandt Boost Works");

    const email = `okonkwo.${Date.now()}@example.test`;
    await form.getByLabel("E-mail").fill(email);
    await form.getByLabel("Password").fill("brandt-boost-2026");
    await form.getByRole("button", { name: "Create shop account" }).click();
    await page.waitForURL("**/check-email**");
    const mail = await waitForMail(email, /Confirm your e-mail/);
    await page.goto(firstLink(mail.text));
    await page.waitForURL("**/builds");
    await expect.poll(() => page.getByTestId("who").innerText()).toContain("Brandt Boost Works");
    const [m] =
      await sql`select m.role, o.name from member m join "user" u on u.id = m.user_id join organization o on o.id = m.organization_id where u.email = ${email}`;
    expect(m).toMatchObject({ role: "owner", name: "Brandt Boost Works" });
    await ctx.close();
  });
  it("signs in only once confirmed; a forgotten password is reset through the e-mailed link", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await page.goto("/sign-up");
    const form = page.getByRole("form", { name: "Sign up" });
    const email = `freya.${Date.now()}@example.test`;
    await form.getByLabel("Your name").fill("Freya Lindqvist");
    await form.getByLabel("Shop name").fill("Lindqvist Fuel Lab");
    await form.getByLabel("E-mail").fill(email);
    await form.getByLabel("Password").fill("lindqvist-lab-2026");
    await form.getByRole("button", { name: "Create shop account" }).click();
    await page.waitForURL("**/check-email**");
    const confirm = await waitForMail(email, /Confirm your e-mail/);

    // Not confirmed yet: the sign-in page says what to do (the auth endpoint's code).
    await page.goto("/sign-in");
    const signInForm = page.getByRole("form", { name: "Sign in" });
    await signInForm.getByRole("button", { name: "Sign in" }).click();
    await expect.poll(() => signInForm.getByText("Enter a valid e-mail address").count()).toBe(1);
    expect(await signInForm.getByText("Enter your password").count()).toBe(1);
    await signIn(page, ` ${email.toUpperCase()} `, "lindqvist-lab-2026");
    await expect.poll(() => page.getByText("Confirm your e-mail first").count()).toBe(1);
    await page.goto(firstLink(confirm.text));
    await page.waitForURL("**/builds");
    await ctx.close();

    const guest = await newClient(browser);
    const p2 = await guest.newPage();
    await p2.goto("/forgot-password");
    await p2.getByLabel("E-mail").fill("not-an-address");
    await p2.getByRole("button", { name: "Send reset link" }).click();
    await expect.poll(() => p2.getByText("Enter a valid e-mail address").count()).toBe(1);
    await p2.getByLabel("E-mail").fill(` ${email.toUpperCase()} `);
    await p2.getByRole("button", { name: "Send reset link" }).click();
    await expect.poll(() => p2.getByText("a reset link is on its way").count()).toBe(1);
    const reset = await waitForMail(email, /Reset your Fuelwright password/);

    await p2.goto(firstLink(reset.text));
    await p2.waitForURL("**/reset-password**");
    await p2.getByLabel("New password").fill("short");
    await p2.getByRole("button", { name: "Set password" }).click();
    await expect.poll(() => p2.getByText("Use at least 10 characters").count()).toBe(1);
    await p2.getByLabel("New password").fill("lindqvist-new-pass-7");
    await p2.getByRole("button", { name: "Set password" }).click();
    await p2.waitForURL("**/sign-in?reset=1");
    await signIn(p2, email, "lindqvist-lab-2026");
    await expect.poll(() => p2.getByText("do not match").count()).toBe(1);
    await signIn(p2, email, "lindqvist-new-pass-7");
    await p2.waitForURL("**/builds");
    await expect.poll(() => p2.getByTestId("who").innerText()).toContain("Lindqvist Fuel Lab");
    await guest.close();
  }, 180_000); // two e-mails and a dozen pages
});
