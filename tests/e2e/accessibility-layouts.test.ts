import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { cspWatch, seriousViolations } from "../helpers/axe";
import { launchBrowser, newClient, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";
import { inspectPdf } from "../helpers/pdf";

/**
 * The accessibility suite on the phone and tablet layouts and on paper: axe on the small
 * screens and the print view, the skip link, one h1, the unit toggle's arrow keys, the live
 * region that says only the changed key figures, the focus on a failed save and the guard on
 * leaving an edited build sheet through the menu.
 */

const PHONE = { width: 390, height: 844 };
const TABLET = { width: 768, height: 1024 };
const BUILD = "/builds/10000000-0000-4000-8000-000000000002";
const CUSTOMER = "/customers/00000000-0000-4000-8000-000000000001";

let browser: Browser;
let quote: string;
beforeAll(async () => {
  browser = await launchBrowser();
  const [q] =
    await sql`select id from quotes where shop_id = 'demo-shop-ridgeback' and status = 'draft' order by number limit 1`;
  quote = `/quotes/${q!.id}`;
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

/** The build sheet's form has taken over the page (its fields hold their values). */
const hydrated = (page: Page) =>
  page.waitForFunction(
    () => (document.querySelector("#b-title") as HTMLInputElement | null)?.value,
  );

const settle = (page: Page) =>
  page.evaluate(
    () => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => r(null)))),
  );

describe("axe on the phone, the tablet and paper", () => {
  it("the staff pages and the portal have no serious or critical findings at 390 and 768 px, nor in print", async () => {
    const ctx = await newClient(browser, PHONE);
    const page = await ctx.newPage();
    const csp = cspWatch(page);
    await signInAs(page, "owner");
    const report: Record<string, string[]> = {};
    for (const path of ["/builds", BUILD, "/parts", "/quotes", quote, CUSTOMER, "/settings"]) {
      await page.setViewportSize(PHONE);
      await page.goto(path);
      await page.waitForLoadState("networkidle");
      report[`${path} @390`] = await seriousViolations(page);
      // The phone's menu open, too.
      if (path === "/builds") {
        await page.getByRole("button", { name: /^Menu/ }).click();
        report[`${path} @390 menu open`] = await seriousViolations(page);
      }
      await page.setViewportSize(TABLET);
      await settle(page);
      report[`${path} @768`] = await seriousViolations(page);
      await page.emulateMedia({ media: "print" });
      report[`${path} print`] = await seriousViolations(page);
      await page.emulateMedia({ media: "screen" });
    }
    const customer = await newClient(browser, PHONE);
    const portal = await customer.newPage();
    await signInAs(portal, "customer");
    await portal.waitForLoadState("networkidle");
    report["/my @390"] = await seriousViolations(portal);
    expect(Object.fromEntries(Object.entries(report).filter(([, v]) => v.length))).toEqual({});
    expect(csp).toEqual([]);
    await customer.close();
    await ctx.close();
  }, 600_000);
});

describe("keyboard and screen readers on the build sheet", () => {
  it("the first Tab is a visible skip link that moves the focus past the menu into the page, whose one h1 names the sheet", async () => {
    const ctx = await newClient(browser, PHONE);
    const page = await ctx.newPage();
    await signInAs(page, "tuner");
    await page.goto(BUILD);
    await page.getByRole("heading", { level: 1 }).waitFor();
    const h1 = await page.getByRole("heading", { level: 1 }).allInnerTexts();
    expect(h1).toHaveLength(1);
    expect(h1[0]).toMatch(/^Build sheet/);
    await page.keyboard.press("Tab");
    const skip = page.getByRole("link", { name: "Skip to content" });
    expect(await skip.evaluate((el) => el === document.activeElement)).toBe(true);
    const box = (await skip.boundingBox())!;
    expect(box.y).toBeGreaterThanOrEqual(0); // shown while it has the focus
    await page.keyboard.press("Enter");
    expect(await page.evaluate(() => document.activeElement?.id)).toBe("main");
    await page.keyboard.press("Tab");
    const inMain = await page.evaluate(
      () =>
        document.activeElement?.closest("main") !== null &&
        !document.activeElement?.closest("header"),
    );
    expect(inMain, "the Tab after the skip link is in the page, not the menu").toBe(true);
    await ctx.close();
  });

  it("the unit toggle is a radio group: one Tab stop, arrow keys choose the other system", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "tuner");
    await page.goto(BUILD);
    await hydrated(page);
    const group = page.getByRole("radiogroup", { name: "Units" });
    await group.waitFor();
    const radios = group.getByRole("radio");
    expect(await radios.count()).toBe(2);
    const checked = () =>
      group.locator('[aria-checked="true"]').evaluate((el) => el.textContent ?? "");
    const start = await checked();
    // Only the chosen one is in the Tab order.
    expect(await radios.evaluateAll((rs) => rs.map((r) => (r as HTMLElement).tabIndex))).toEqual(
      (await radios.evaluateAll((rs) => rs.map((r) => r.getAttribute("aria-checked")))).map((c) =>
        c === "true" ? 0 : -1,
      ),
    );
    await group.locator('[aria-checked="true"]').focus();
    const unitBefore = await page.locator('label[for="b-engine-maxBoostKpa"]').innerText();
    await page.keyboard.press("ArrowRight");
    await expect.poll(checked).not.toBe(start);
    expect(
      await page.evaluate(() => document.activeElement?.getAttribute("aria-checked")),
      "the focus moves with the choice",
    ).toBe("true");
    await expect
      .poll(() => page.locator('label[for="b-engine-maxBoostKpa"]').innerText())
      .not.toBe(unitBefore);
    await page.keyboard.press("ArrowLeft");
    await expect.poll(checked).toBe(start);
    await page.keyboard.press("End");
    await expect.poll(checked).toMatch(/Imperial/);
    await page.keyboard.press("Home");
    await expect.poll(checked).toMatch(/Metric/);
    // Back to where the tuner started (their preference is saved on each switch).
    if (!(await checked()).startsWith(start.slice(0, 6))) await page.keyboard.press("ArrowRight");
    await expect.poll(checked).toBe(start);
    await ctx.close();
  });

  it("a polite live region says only the key figures that changed, once typing pauses", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "tuner");
    await page.goto(BUILD);
    await hydrated(page);
    const live = page.getByTestId("figures-announcer");
    await live.waitFor({ state: "attached" });
    expect(await live.getAttribute("aria-live")).toBe("polite");
    expect(await live.innerText()).toBe(""); // nothing said on arrival
    // The results panel itself is no live region any more: its figures sit in none.
    expect(
      await page.getByTestId("ceiling").evaluate((el) => el.closest("[aria-live]") === null),
    ).toBe(true);
    await page.evaluate(() => {
      const el = document.querySelector('[data-testid="figures-announcer"]')!;
      const w = window as unknown as { said: string[]; at: number[] };
      w.said = [];
      w.at = [];
      new MutationObserver(() => {
        w.said.push(el.textContent ?? "");
        w.at.push(performance.now());
      }).observe(el, { childList: true, characterData: true, subtree: true });
    });
    const power = page.getByLabel(/^Target power/);
    const now = Number((await power.inputValue()).replace(/,/g, ""));
    await power.selectText();
    // Typed as a person types: a keystroke every 60 ms.
    await power.pressSequentially(String(Math.round(now * 1.25)), { delay: 60 });
    await expect
      .poll(() => page.evaluate(() => (window as unknown as { said: string[] }).said.length))
      .toBeGreaterThan(0);
    await page.waitForTimeout(1500);
    const { said, at } = await page.evaluate(() => {
      const w = window as unknown as { said: string[]; at: number[] };
      return { said: w.said, at: w.at };
    });
    const typed = String(Math.round(now * 1.25)).length;
    // Debounced: never one per keystroke (on a slow machine a keystroke may take longer than
    // the pause, so a long edit may be said more than once — never twice within the pause).
    expect(said.length, "fewer announcements than keystrokes").toBeLessThan(typed);
    for (let i = 1; i < at.length; i++) expect(at[i]! - at[i - 1]!).toBeGreaterThan(800);
    const last = said[said.length - 1]!;
    expect(last).toMatch(/Duty at E\d+: [\d.]+ %/);
    expect(last).toMatch(/Pump margin: -?[\d.]+ %/);
    expect(last, "the ceiling did not change, so it is not said").not.toMatch(/Power ceiling/);
    expect(last.length).toBeLessThan(400);
    // The same value typed again changes no figure: nothing more is said.
    await power.fill(String(Math.round(now * 1.25)));
    await page.waitForTimeout(1500);
    expect(await page.evaluate(() => (window as unknown as { said: string[] }).said.length)).toBe(
      said.length,
    );
    await ctx.close();
  });

  it("a failed save puts the focus on the first invalid field", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "tuner");
    await page.goto(BUILD);
    await hydrated(page);
    const cylinders = page.locator("#b-engine-cylinders");
    await cylinders.fill("");
    await page.locator("#b-injectors-count").fill("");
    await page.getByRole("button", { name: "Save build" }).click();
    await expect
      .poll(() => page.evaluate(() => document.activeElement?.id))
      .toBe("b-engine-cylinders");
    expect(await cylinders.getAttribute("aria-invalid")).toBe("true");
    await ctx.close();
  });

  it.each([
    ["a laptop", { width: 1280, height: 900 }],
    ["a phone", PHONE],
  ] as const)(
    "on %s, leaving an edited sheet through the top menu asks first; Cancel keeps the edits",
    async (_name, viewport) => {
      const ctx = await newClient(browser, viewport);
      const page = await ctx.newPage();
      await signInAs(page, "tuner");
      await page.goto(BUILD);
      await hydrated(page);
      const title = page.locator("#b-title");
      const edited = `${await title.inputValue()} (edited)`;
      await title.fill(edited);
      const asked: string[] = [];
      let answer = false;
      page.on("dialog", (d) => {
        asked.push(`${d.type()}: ${d.message()}`);
        void (answer ? d.accept() : d.dismiss());
      });
      const customers = async () => {
        const menu = page.getByRole("button", { name: /^Menu/ });
        // On a phone, open the menu (it stays open after a cancelled click).
        if ((await menu.isVisible()) && (await menu.getAttribute("aria-expanded")) === "false")
          await menu.click();
        await page
          .getByRole("navigation", { name: "Main" })
          .getByRole("link", { name: "Customers" })
          .click();
      };
      await customers();
      await expect.poll(() => asked.length).toBe(1);
      expect(asked[0]).toMatch(/^confirm: .*unsaved changes/);
      await page.waitForTimeout(500);
      expect(new URL(page.url()).pathname).toBe(BUILD);
      expect(await title.inputValue()).toBe(edited);
      answer = true;
      await customers();
      await page.waitForURL("**/customers");
      expect(asked).toHaveLength(2);
      await ctx.close();
    },
  );

  it("an unedited sheet leaves through the menu without a question", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "tuner");
    await page.goto(BUILD);
    await hydrated(page);
    const asked: string[] = [];
    page.on("dialog", (d) => {
      asked.push(d.message());
      void d.dismiss();
    });
    await page
      .getByRole("navigation", { name: "Main" })
      .getByRole("link", { name: "Parts" })
      .click();
    await page.waitForURL("**/parts");
    expect(asked).toEqual([]);
    await ctx.close();
  });
});

describe("the build sheet's sticky bars and the focus (issue 21)", () => {
  /**
   * Tabs (or Shift+Tabs) through the build sheet's form and returns each focused control that
   * is not fully visible between the pinned key figures and the "Save build" bar.
   */
  const hiddenByBars = async (page: Page, key: "Tab" | "Shift+Tab", most: number) => {
    const hidden: string[] = [];
    for (let i = 0; i < most; i++) {
      await page.keyboard.press(key);
      const where = await page.evaluate(() => {
        const el = document.activeElement as HTMLElement | null;
        const form = document.querySelector('form[aria-label="Build inputs"]');
        if (!el || !form?.contains(el)) return "out";
        const pinned = document.querySelector('[data-testid="pinned-summary"]')!;
        const bar = document.querySelector('[data-sticky-bar="bottom"]')!;
        if (pinned.contains(el) || bar.contains(el)) return null;
        const r = el.getBoundingClientRect();
        const top = Math.max(0, pinned.getBoundingClientRect().bottom);
        const bottom = Math.min(window.innerHeight, bar.getBoundingClientRect().top);
        return r.top >= top - 1 && r.bottom <= bottom + 1
          ? null
          : `${el.id || el.getAttribute("aria-label") || el.tagName} at ${Math.round(r.top)}–${Math.round(r.bottom)}, clear between ${Math.round(top)} and ${Math.round(bottom)}`;
      });
      if (where === "out") break;
      if (where) hidden.push(where);
    }
    return hidden;
  };

  it.each([
    ["390", PHONE],
    ["768", TABLET],
    ["1280", { width: 1280, height: 800 }],
  ] as const)(
    "at %s px every control the Tab and Shift+Tab reach is fully visible between the pinned figures and the save bar",
    async (_name, viewport) => {
      const ctx = await newClient(browser, viewport);
      const page = await ctx.newPage();
      await signInAs(page, "tuner");
      await page.goto(BUILD);
      await hydrated(page);
      await page.locator("#b-title").focus();
      const forward = await hiddenByBars(page, "Tab", 200);
      expect(forward, "hidden under a sticky bar on Tab").toEqual([]);
      // Back up from the save bar to the top.
      await page.getByRole("button", { name: "Save build" }).focus();
      const backward = await hiddenByBars(page, "Shift+Tab", 200);
      expect(backward, "hidden under a sticky bar on Shift+Tab").toEqual([]);
      await ctx.close();
    },
    300_000,
  );

  it("at 1280 px the key figures stay in view at the last section and follow the typing", async () => {
    const ctx = await newClient(browser, { width: 1280, height: 800 });
    const page = await ctx.newPage();
    await signInAs(page, "tuner");
    await page.goto(BUILD);
    await hydrated(page);
    const voltage = page.getByLabel(/^Voltage at the pump/);
    await page.getByRole("group", { name: /Return line/ }).scrollIntoViewIfNeeded();
    await page.evaluate(() => window.scrollTo(0, document.documentElement.scrollHeight));
    const pinned = page.getByTestId("pinned-summary");
    const inView = () =>
      pinned.evaluate((el) => {
        const r = el.getBoundingClientRect();
        return r.top >= 0 && r.bottom <= window.innerHeight && r.height > 0;
      });
    expect(await inView(), "the key figures are on screen at the end of the sheet").toBe(true);
    const margin = () => page.getByTestId("pinned-margin").innerText();
    const before = await margin();
    await voltage.fill("9");
    await expect.poll(margin).not.toBe(before);
    expect(await inView()).toBe(true);
    await ctx.close();
  });

  it("after a save and after a copy by keyboard, the focus stays in the page (not back at the top)", async () => {
    const ctx = await newClient(browser, PHONE);
    const page = await ctx.newPage();
    await signInAs(page, "tuner");
    await page.getByRole("link", { name: "New build" }).click();
    await page.getByLabel("Customer").selectOption({ label: "Harriet Quill" });
    await page.getByLabel("Title").fill(`Focus check ${Date.now()}`);
    await page.getByRole("button", { name: "Create build sheet" }).click();
    await page.waitForURL(/\/builds\/[0-9a-f-]{36}$/);
    const url = page.url();
    await hydrated(page);
    await page.getByLabel("Drivetrain loss (%)").fill("14");
    const save = page.getByRole("button", { name: "Save build" });
    await save.focus();
    await page.keyboard.press("Enter");
    await expect.poll(() => page.getByText("Saved as version 2").count()).toBe(1);
    const focused = () =>
      page.evaluate(() => {
        const el = document.activeElement;
        if (!el || el === document.body) return "body";
        return el.tagName === "BUTTON"
          ? `button ${el.textContent}`
          : el.getAttribute("data-testid") === "form-status"
            ? "status"
            : el.id || el.tagName;
      });
    await expect.poll(focused).toMatch(/^(button Save build|status)$/);
    await page.keyboard.press("Tab");
    expect(await focused(), "the next Tab goes on from the save bar").not.toBe("skip-link");
    expect(await page.evaluate(() => document.activeElement?.textContent?.trim())).not.toBe(
      "Skip to content",
    );

    await page.getByRole("button", { name: "Copy as next power step" }).focus();
    await page.keyboard.press("Enter");
    await page.waitForURL((u) => /\/builds\/[0-9a-f-]{36}$/.test(u.pathname) && u.href !== url);
    await hydrated(page);
    await expect.poll(focused).not.toBe("body");
    await page.keyboard.press("Tab");
    expect(
      await page.evaluate(() => document.activeElement?.textContent?.trim()),
      "the next Tab stays in the page",
    ).not.toBe("Skip to content");
    await ctx.close();
  });
});

/** What shows as a control on paper (the page is emulating print). */
const printedChrome = (page: Page) =>
  page.evaluate(() => {
    const shown = (el: Element) => {
      const r = el.getBoundingClientRect();
      return r.width > 0 && r.height > 0 && getComputedStyle(el).visibility !== "hidden";
    };
    const found: string[] = [];
    for (const b of document.querySelectorAll("button, [role=combobox], [role=search]"))
      if (shown(b)) found.push(`control: ${b.textContent?.trim() || b.getAttribute("aria-label")}`);
    for (const a of document.querySelectorAll("a"))
      if (shown(a) && /PDF|^New (quote|build)/.test(a.textContent?.trim() ?? ""))
        found.push(`link: ${a.textContent?.trim()}`);
    for (const f of document.querySelectorAll<HTMLInputElement | HTMLTextAreaElement>(
      "input:not([type=hidden]), select, textarea",
    )) {
      if (!shown(f)) continue;
      const s = getComputedStyle(f);
      const name = f.id || f.getAttribute("aria-label") || f.tagName;
      if (s.appearance !== "none" || parseFloat(s.borderTopWidth) > 0)
        found.push(`chrome: ${name}`);
      if (f instanceof HTMLTextAreaElement && !f.value.trim()) found.push(`empty box: ${name}`);
      if (f.scrollWidth > f.clientWidth + 1 || f.scrollHeight > f.clientHeight + 1)
        found.push(`cut off: ${name}`);
    }
    return found;
  });

describe("print", () => {
  it("the build sheet, the customer page and a quote print without the menu or sticky bars, the sheet on at most 3 pages", async () => {
    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    await signInAs(page, "owner");
    await page.goto(BUILD);
    await page.getByTestId("ceiling").waitFor();
    await page.waitForLoadState("networkidle");
    await hydrated(page); // the inputs' values are set by the form once it runs
    await page.emulateMedia({ media: "print" });
    expect(await page.getByRole("navigation", { name: "Main" }).isVisible()).toBe(false);
    expect(await page.getByTestId("pinned-summary").isVisible()).toBe(false);
    expect(
      await page
        .locator("button", { hasText: "Save build" })
        .evaluate((b) => getComputedStyle(b.parentElement!).position),
    ).toBe("static");
    expect(await page.getByRole("heading", { level: 1 }).count()).toBe(1);
    const pages: Record<string, number> = {};
    for (const [name, path, most] of [
      ["build sheet", BUILD, 3],
      ["customer", CUSTOMER, 3],
      ["quote", quote, 3],
    ] as const) {
      if (path !== BUILD) {
        await page.goto(path);
        await page.getByRole("heading", { level: 1 }).waitFor();
        await page.waitForLoadState("networkidle");
      }
      for (const format of ["Letter", "A4"] as const) {
        const pdf = inspectPdf(await page.pdf({ format, printBackground: true }));
        pages[`${name} ${format}`] = pdf.pages;
        expect(pdf.pages, `${name} on ${format}`).toBeLessThanOrEqual(most);
        expect(pdf.text).not.toMatch(/Sign out|Skip to content|Save build|Menu/);
        if (name === "build sheet") {
          expect(pdf.text).toMatch(/Build sheet/);
          expect(pdf.text).toMatch(/Power ceiling/);
          expect(pdf.text).toMatch(/Warnings/);
          expect(pdf.text).toMatch(/Duty at E/);
          // The results come first, then the inputs (issue 21).
          expect(pdf.text.indexOf("Power ceiling")).toBeLessThan(pdf.text.indexOf("Idle and air"));
          expect(pdf.text.indexOf("Warnings")).toBeLessThan(pdf.text.indexOf("Idle and air"));
          expect(pdf.pages, `${name} on ${format}`).toBeLessThanOrEqual(2);
        }
      }
      // On paper: no buttons, no PDF or "New …" links, no searches, no empty boxes, and every
      // field shows its value as text (no border, arrow or picker) in full.
      expect(await printedChrome(page), `${name} in print`).toEqual([]);
    }
    // A draft invoice too.
    const [inv] =
      await sql`select id from invoices where shop_id = 'demo-shop-ridgeback' and number is null limit 1`;
    if (inv) {
      await page.goto(`/invoices/${inv.id}`);
      await page.getByRole("heading", { level: 1 }).waitFor();
      await page.waitForLoadState("networkidle");
      expect(await printedChrome(page), "invoice in print").toEqual([]);
    }
    console.log("printed pages:", JSON.stringify(pages));
    await ctx.close();
  }, 300_000);
});
