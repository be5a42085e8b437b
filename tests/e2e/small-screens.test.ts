import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, newClient, signInAs } from "../helpers/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** The page's width and what sticks out past the screen's right edge (tag, id or class, right). */
const overflow = (page: Page) =>
  page.evaluate(() => {
    const w = document.documentElement.clientWidth;
    const out: string[] = [];
    for (const el of Array.from(document.body.querySelectorAll("*"))) {
      const r = el.getBoundingClientRect();
      if (r.right > w + 0.5 && r.width > 0) {
        // Inside a box that scrolls on its own (the nav) it does not widen the page.
        let p = el.parentElement;
        let clipped = false;
        while (p && p !== document.body) {
          const o = getComputedStyle(p).overflowX;
          if (o === "auto" || o === "scroll" || o === "hidden") clipped = true;
          p = p.parentElement;
        }
        if (!clipped)
          out.push(
            `${el.tagName.toLowerCase()}${el.id ? `#${el.id}` : ""}.${String(el.className).slice(0, 40)} → ${Math.round(r.right)}`,
          );
      }
    }
    return { scrollWidth: document.documentElement.scrollWidth, out: out.slice(0, 8) };
  });

describe("a 390 px wide phone", () => {
  it("the customers, quotes, builds and parts lists fit the screen; the main nav shows it scrolls", async () => {
    const ctx = await newClient(browser, { width: 390, height: 844 });
    const page = await ctx.newPage();
    await signInAs(page, "owner");
    for (const path of ["/customers", "/quotes", "/builds", "/parts"]) {
      await page.goto(path);
      await page.getByRole("heading", { level: 1 }).waitFor();
      const o = await overflow(page);
      expect(o.scrollWidth, `${path}: ${o.out.join("; ")}`).toBeLessThanOrEqual(390);
      await page.screenshot({ path: `test-results/screenshots/390${path.replace("/", "-")}.png` });
    }

    // The customers list still shows each customer's phone, on screen.
    await page.goto("/customers");
    const phone = page.getByTestId("customer-phone").first();
    await phone.waitFor();
    const box = (await phone.boundingBox())!;
    expect(box.x + box.width).toBeLessThanOrEqual(390);
    expect(await phone.innerText()).toMatch(/\d/);

    // More nav items than fit: a visible hint that the nav scrolls, gone once scrolled to the end.
    const nav = page.getByRole("navigation", { name: "Main" });
    const more = page.getByTestId("nav-more");
    expect(
      await nav.evaluate((n) => n.querySelector("ul")!.scrollWidth > n.clientWidth),
      "the owner's nav is wider than the phone",
    ).toBe(true);
    await expect.poll(() => more.isVisible()).toBe(true);
    await more.click(); // scrolls the nav on
    await expect
      .poll(() => nav.evaluate((n) => n.querySelector("ul")!.scrollLeft))
      .toBeGreaterThan(0);
    await nav
      .locator("ul")
      .evaluate((u) => u.scrollTo({ left: u.scrollWidth, behavior: "instant" as ScrollBehavior }));
    await expect.poll(() => more.isVisible()).toBe(false);
    await ctx.close();
  });
});
