import { randomUUID } from "node:crypto";
import { mkdirSync } from "node:fs";

import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { navFor } from "@/components/shell/nav-items";

import { BASE_URL, launchBrowser, newClient, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";
import { appPages, renderedLinks, urlsFor, type AppPage } from "../helpers/pages";

/**
 * A phone (390 × 844) and a tablet (768 × 1024): every page of the app — found on disk
 * (tests/helpers/pages.ts), so new pages are walked too — opened as each role. No page is wider
 * than the screen, nothing sits in a box that scrolls sideways (a table's columns cut off), the
 * page has exactly one h1 and the first Tab reaches the skip link.
 */

const PHONE = { width: 390, height: 844 };
const TABLET = { width: 768, height: 1024 };
const shots = "test-results/screenshots/small-screens";
const DEMO_BUILD = "10000000-0000-4000-8000-000000000002";

let browser: Browser;
const pages = appPages();
/** A URL for every staff page, found by the owner following links (plus the few fixtures). */
let shopUrls: Map<string, string>;
let missingShop: string[];
/** Pages no link of a signed-in staff member leads to, made for the walk. */
const fixtures: Record<string, string> = {
  "/accept-invitation/[id]": `/accept-invitation/${randomUUID()}`, // an invitation that is gone
  // Linked from a build's revisions once it has two; the demo builds start with one.
  "/builds/[id]/compare": `/builds/${DEMO_BUILD}/compare?from=1&to=1`,
  // The demo shop has no job, invoice or purchase order yet: a gone one shows the not-found
  // page, which must fit as well (the pages with records are walked by after-deposit's tests).
  "/jobs/[id]": `/jobs/${randomUUID()}`,
  "/invoices/[id]": `/invoices/${randomUUID()}`,
  "/purchasing/orders/[id]": `/purchasing/orders/${randomUUID()}`,
};
/** The same for the customer's portal. */
const portalFixtures: Record<string, string> = {
  "/my/jobs/[id]": `/my/jobs/${randomUUID()}`,
  "/my/invoices/[id]": `/my/invoices/${randomUUID()}`,
};

/**
 * The longest unbroken text the schemas take, in the demo shop's lists (a customer and their
 * vehicle, a build, a part, a supplier): a person's long word must wrap, not widen the page.
 * Copies of demo rows with those fields replaced; removed again after the walk (with the portal
 * customer's quote added below).
 */
const LONG = "W".repeat(200);
const longIds = {
  customer: randomUUID(),
  vehicle: randomUUID(),
  build: randomUUID(),
  part: randomUUID(),
  supplier: randomUUID(),
  quote: randomUUID(),
};
/** The demo customer who signs in to the portal (db/seed.ts). */
const PORTAL_CUSTOMER = "00000000-0000-4000-8000-000000000001";
async function addLongestText() {
  const shop = "demo-shop-ridgeback";
  const copy = (table: string, where: string, over: Record<string, unknown>) =>
    sql.unsafe(
      `insert into ${table} select (jsonb_populate_record(t, $1::text::jsonb)).* from ${table} t
       where t.shop_id = '${shop}' ${where} limit 1`,
      [JSON.stringify(over)],
    );
  const tag = longIds.customer.slice(0, 8);
  // Lengths: lib/validations (customer name 120, vehicle model 80, build title 120, part name
  // 200 and SKU 60, supplier name 120).
  await copy("customers", "", {
    id: longIds.customer,
    name: LONG.slice(0, 120),
    email: `long-${tag}@example.test`,
    phone: null,
  });
  await copy("vehicles", "", {
    id: longIds.vehicle,
    customer_id: longIds.customer,
    model: LONG.slice(0, 80),
    vin: null,
  });
  await copy("builds", `and t.id = '${DEMO_BUILD}'`, {
    id: longIds.build,
    customer_id: longIds.customer,
    title: LONG.slice(0, 120),
  });
  await copy("parts", "", { id: longIds.part, sku: `L${tag}${LONG}`.slice(0, 60), name: LONG });
  // The portal customer's own sent quote (a copy of the demo shop's sent one, lines and all),
  // so the portal walk finds a quote page whatever other test files have or have not sent.
  const [src] = await sql<{ id: string }[]>`
    select id from quotes where shop_id = ${shop} and status = 'sent' order by created_at limit 1`;
  await sql.unsafe(
    `insert into quotes select (jsonb_populate_record(q, $1::text::jsonb)).* from quotes q where q.id = $2`,
    [
      JSON.stringify({
        id: longIds.quote,
        customer_id: PORTAL_CUSTOMER,
        build_id: null,
        number: 900_000 + Math.floor(Math.random() * 99_999),
      }),
      src!.id,
    ],
  );
  await sql.unsafe(
    `insert into quote_lines select (jsonb_populate_record(l, jsonb_build_object('id', gen_random_uuid(), 'quote_id', $1::uuid))).* from quote_lines l where l.quote_id = $2`,
    [longIds.quote, src!.id],
  );
  // The demo shop starts with no supplier: this one is also the walk's supplier page.
  await sql`insert into suppliers (id, shop_id, name) values (${longIds.supplier}, ${shop}, ${LONG.slice(0, 120)})`;
}

beforeAll(async () => {
  mkdirSync(shots, { recursive: true });
  await addLongestText();
  browser = await launchBrowser();
  const ctx = await newClient(browser);
  const page = await ctx.newPage();
  await signInAs(page, "owner");
  // The public share page: a link made the way the build page makes one.
  const share = await ctx.request.post(`/api/v1/builds/${DEMO_BUILD}/share-links`, {
    data: { days: 7 },
    headers: { origin: BASE_URL },
  });
  expect(share.status()).toBe(201);
  fixtures["/share/[token]"] = new URL(((await share.json()) as { url: string }).url).pathname;
  const found = await urlsFor(
    ctx.request,
    pages.filter((p) => p.audience === "shop"),
    { fixtures, rendered: (url) => renderedLinks(page, url) },
  );
  shopUrls = found.urls;
  missingShop = found.missing;
  await ctx.close();
}, 600_000);
afterAll(async () => {
  await browser?.close();
  await sql`delete from builds where id = ${longIds.build}`;
  await sql`delete from vehicles where id = ${longIds.vehicle}`;
  await sql`delete from customers where id = ${longIds.customer}`;
  await sql`delete from parts where id = ${longIds.part}`;
  await sql`delete from suppliers where id = ${longIds.supplier}`;
  await sql`delete from quote_lines where quote_id = ${longIds.quote}`;
  await sql`delete from quotes where id = ${longIds.quote}`;
  await sql.end();
});

/** What does not fit: the page's width, elements past the right edge, sideways scrollers, h1s. */
const measure = (page: Page) =>
  page.evaluate(() => {
    const w = document.documentElement.clientWidth;
    const name = (el: Element) =>
      `${el.tagName.toLowerCase()}${el.id ? `#${el.id}` : ""}${el.getAttribute("data-testid") ? `[${el.getAttribute("data-testid")}]` : ""}.${String(el.getAttribute("class") ?? "").slice(0, 40)}`;
    const past: string[] = [];
    const scrollers: string[] = [];
    for (const el of Array.from(document.body.querySelectorAll("*"))) {
      const s = getComputedStyle(el);
      if (
        (s.overflowX === "auto" || s.overflowX === "scroll") &&
        el.scrollWidth > el.clientWidth + 1 &&
        !el.closest("[data-scroll-x]")
      )
        scrollers.push(`${name(el)} ${el.clientWidth}/${el.scrollWidth}`);
      const r = el.getBoundingClientRect();
      if (r.right > w + 0.5 && r.width > 0 && s.position !== "fixed") past.push(name(el));
    }
    const visibleH1 = Array.from(document.querySelectorAll("h1")).length;
    return {
      scrollWidth: document.documentElement.scrollWidth,
      past: past.slice(-3),
      scrollers: scrollers.slice(0, 3),
      h1: visibleH1,
    };
  });

const frames = (page: Page) =>
  page.evaluate(
    () => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => r(null)))),
  );

/** Opens each URL on a phone, then the same page on a tablet; returns what failed, by URL. */
async function walk(ctx: BrowserContext, urls: string[], tag: string) {
  const page = await ctx.newPage();
  const problems: string[] = [];
  for (const url of urls) {
    await page.setViewportSize(PHONE);
    const res = await page.goto(url);
    await page.waitForLoadState("networkidle");
    if (!res || res.status() >= 500) problems.push(`${url}: status ${res?.status()}`);
    for (const size of [PHONE, TABLET]) {
      if (size !== PHONE) {
        await page.setViewportSize(size);
        await frames(page);
      }
      const m = await measure(page);
      const at = `${url} @${size.width}`;
      if (m.scrollWidth > size.width)
        problems.push(`${at}: ${m.scrollWidth} px wide (${m.past.join(", ")})`);
      if (m.scrollers.length) problems.push(`${at}: scrolls sideways: ${m.scrollers.join(", ")}`);
      if (m.h1 !== 1) problems.push(`${at}: ${m.h1} h1 elements`);
    }
    // The first Tab of the page lands on the skip link.
    await page.setViewportSize(PHONE);
    await page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    await page.keyboard.press("Tab");
    const first = await page.evaluate(() => document.activeElement?.textContent?.trim());
    if (first !== "Skip to content") problems.push(`${url}: the first Tab reaches “${first}”`);
    await page.screenshot({
      path: `${shots}/${tag}${url.split("?")[0]!.replace(/\//g, "_")}.jpeg`,
      type: "jpeg",
      quality: 40,
    });
  }
  await page.close();
  return problems;
}

const routesOf = (audiences: AppPage["audience"][]) =>
  pages.filter((p) => audiences.includes(p.audience)).map((p) => p.route);

describe("phone (390 px) and tablet (768 px): every page as every role", () => {
  it("finds a URL for every staff page (a link to it, or a fixture above)", () => {
    expect(routesOf(["shop"]).length).toBeGreaterThan(15);
    expect(missingShop).toEqual([]);
  });

  it.each(["owner", "tuner", "counter"] as const)(
    "%s: every staff page fits, scrolls nothing sideways, has one h1 and a skip link",
    async (role) => {
      const ctx = await newClient(browser, PHONE);
      const page = await ctx.newPage();
      await signInAs(page, role);
      await page.close();
      const urls = routesOf(["shop"]).map((r) => shopUrls.get(r)!);
      expect(await walk(ctx, urls, role)).toEqual([]);
      await ctx.close();
    },
    900_000,
  );

  it("the longest words the forms take wrap in the lists and on their own pages, at both widths", async () => {
    const ctx = await newClient(browser, PHONE);
    const page = await ctx.newPage();
    await signInAs(page, "owner");
    const word = "W".repeat(40);
    const problems: string[] = [];
    for (const url of [
      "/builds",
      `/builds/${longIds.build}`,
      "/parts",
      `/parts/${longIds.part}`,
      "/customers",
      `/customers/${longIds.customer}`,
      "/purchasing",
      `/purchasing/suppliers/${longIds.supplier}`,
    ]) {
      for (const size of [PHONE, TABLET]) {
        await page.setViewportSize(size);
        await page.goto(url);
        await page.waitForLoadState("networkidle");
        // The long text is on the page (else this proves nothing) and the page is no wider
        // than the screen, nothing scrolling sideways (as the walk; what sticks out is said
        // only as a clue: a table's visually hidden header row may).
        const shown = (await page.locator("main").innerText()).includes(word);
        const m = await measure(page);
        if (!shown) problems.push(`${url} @${size.width}: the long text is not shown`);
        if (m.scrollWidth > size.width || m.scrollers.length)
          problems.push(
            `${url} @${size.width}: ${m.scrollWidth} px wide (${m.past.join(", ")}) ${m.scrollers.join(", ")}`,
          );
      }
    }
    expect(problems).toEqual([]);
    await ctx.close();
  }, 300_000);

  it("the customer: every portal page fits (the quote page found from their list)", async () => {
    const ctx = await newClient(browser, PHONE);
    const page = await ctx.newPage();
    await signInAs(page, "customer");
    const portal = pages.filter((p) => p.audience === "portal");
    const { urls, missing } = await urlsFor(ctx.request, portal, {
      fixtures: portalFixtures,
      rendered: (url) => renderedLinks(page, url),
    });
    expect(missing).toEqual([]);
    expect(
      await walk(
        ctx,
        portal.map((p) => urls.get(p.route)!),
        "customer",
      ),
    ).toEqual([]);
    await ctx.close();
  }, 600_000);

  it("signed out: the sign-in pages and the public share page fit", async () => {
    const ctx = await newClient(browser, PHONE);
    const open = pages.filter((p) => p.audience === "auth" || p.audience === "public");
    const urls = open.map((p) => (p.dynamic ? fixtures[p.route] : p.route));
    expect(
      open.filter((_, i) => !urls[i]).map((p) => p.route),
      "a page with no fixture",
    ).toEqual([]);
    expect(await walk(ctx, urls as string[], "signed-out")).toEqual([]);
    await ctx.close();
  }, 600_000);
});

describe("the main nav on a phone and a tablet", () => {
  it.each([
    ["owner", "/builds"],
    ["counter", "/builds"],
    ["customer", "/my"],
  ] as const)("%s reaches every section (staff: Settings too)", async (role, landing) => {
    const ctx = await newClient(browser, PHONE);
    const page = await ctx.newPage();
    await signInAs(page, role);
    await page.goto(landing);
    const nav = page.getByRole("navigation", { name: "Main" });
    const links = nav.getByRole("link");
    const menu = page.getByRole("button", { name: /^Menu/ });
    const items = navFor(role);
    // A nav of one or two links shows them; a longer one hides them behind "Menu".
    const folded = items.length > 2;
    if (folded) {
      // Staff: a Menu button that names where you are and opens every link.
      await expect.poll(() => menu.innerText()).toMatch(/Menu[\s\S]*Builds/);
      expect(await menu.getAttribute("aria-expanded")).toBe("false");
      expect(await links.count()).toBe(0); // closed: no link shown
      await menu.click();
      expect(await menu.getAttribute("aria-expanded")).toBe("true");
    } else expect(await menu.count()).toBe(0);
    const count = await links.count();
    expect(await links.allInnerTexts()).toEqual(items.map((i) => i.label));
    const inside = async (w: number) => {
      for (let i = 0; i < count; i++) {
        const box = await links.nth(i).boundingBox();
        expect(box, `link ${i} visible`).not.toBeNull();
        expect(box!.x).toBeGreaterThanOrEqual(0);
        expect(box!.x + box!.width).toBeLessThanOrEqual(w);
      }
    };
    await inside(PHONE.width);
    await page.screenshot({ path: `${shots}/nav-open-${role}.png` });
    if (folded) {
      // Escape closes it and gives the focus back to the button.
      await page.keyboard.press("Escape");
      expect(await menu.getAttribute("aria-expanded")).toBe("false");
      expect(await page.evaluate(() => document.activeElement?.textContent)).toMatch(/Menu/);
      await menu.click();
      await nav.getByRole("link", { name: "Settings" }).click();
      await page.waitForURL("**/settings");
      await page.getByRole("heading", { level: 1 }).waitFor();
      expect(await menu.getAttribute("aria-expanded")).toBe("false");
      await expect.poll(() => menu.innerText()).toMatch(/Menu[\s\S]*Settings/);
    }
    // A tablet: the links themselves, every one on screen (wrapping, never scrolled away).
    await page.setViewportSize(TABLET);
    await frames(page);
    expect(await menu.isVisible().catch(() => false)).toBe(false);
    await inside(TABLET.width);
    await ctx.close();
  });
});

describe("the Menu button names the section of every staff page", () => {
  it("on a phone, every staff page's Menu button says its section (an invoice's: Jobs)", async () => {
    const ctx = await newClient(browser, PHONE);
    const page = await ctx.newPage();
    await signInAs(page, "owner");
    const items = navFor("owner");
    // Pages with no list of their own, and the section a person looks for them in.
    const claimed: Record<string, string> = { "/invoices": "Jobs" };
    const wrong: string[] = [];
    for (const route of routesOf(["shop"])) {
      const url = shopUrls.get(route);
      if (!url) continue; // "finds a URL for every staff page" reports it
      await page.goto(url);
      const top = `/${route.split("/")[1]}`;
      const want = items.find((i) => i.href === top)?.label ?? claimed[top];
      const menu = page.getByTestId("nav-menu");
      await menu.waitFor();
      const text = (await menu.innerText()).replace(/\s+/g, " ").trim();
      const named = /Menu ?· ?(.+)$/.exec(text)?.[1];
      if (!want || named !== want) wrong.push(`${url}: “${text}”, wants ${want ?? "a section"}`);
    }
    expect(wrong).toEqual([]);
    await ctx.close();
  }, 600_000);
});

describe("key columns stay on a phone's screen", () => {
  /** The element's box lies within the screen's width, and it is not cut off by a scroller. */
  const onScreen = async (page: Page, testId: string) => {
    const el = page.getByTestId(testId).first();
    await el.waitFor();
    const box = (await el.boundingBox())!;
    return box.x >= 0 && box.x + box.width <= PHONE.width && box.width > 0;
  };

  it("builds: status, duty and margin; catalog: price and stock; a quote's description and prices", async () => {
    const ctx = await newClient(browser, PHONE);
    const page = await ctx.newPage();
    await signInAs(page, "owner");
    await page.goto("/builds");
    for (const id of ["build-status", "build-duty", "build-margin"])
      expect(await onScreen(page, id), id).toBe(true);
    await page.goto("/parts");
    for (const id of ["part-price", "part-stock"]) expect(await onScreen(page, id), id).toBe(true);

    // A draft quote in the editor: the description box is wide enough to read, prices typeable.
    // The demo shop's first draft that has lines (other tests add drafts without any).
    const [draft] = await sql<{ id: string }[]>`
      select q.id from quotes q
      where q.shop_id = 'demo-shop-ridgeback' and q.status = 'draft'
        and exists (select 1 from quote_lines l where l.quote_id = q.id)
      order by q.number limit 1`;
    await page.goto(`/quotes/${draft!.id}`);
    const description = page.getByLabel("Line 1 description");
    await description.waitFor();
    const d = (await description.boundingBox())!;
    expect(d.width).toBeGreaterThan(250);
    expect(d.x + d.width).toBeLessThanOrEqual(PHONE.width);
    // Every line's description is whole on screen: the box wraps its text, nothing cut off.
    const cut = await page
      .locator('[aria-label$=" description"]')
      .evaluateAll((els) =>
        els
          .filter((e) => e.scrollWidth > e.clientWidth + 1 || e.scrollHeight > e.clientHeight + 1)
          .map((e) => (e as HTMLTextAreaElement).value),
      );
    expect(cut).toEqual([]);
    // The header: "Menu · <section>" does not run under "Sign out".
    const menu = (await page.getByTestId("nav-menu").boundingBox())!;
    const signOut = (await page.getByRole("button", { name: "Sign out" }).boundingBox())!;
    const overlaps =
      menu.x < signOut.x + signOut.width &&
      signOut.x < menu.x + menu.width &&
      menu.y < signOut.y + signOut.height &&
      signOut.y < menu.y + menu.height;
    expect(overlaps).toBe(false);
    expect(menu.x + menu.width).toBeLessThanOrEqual(PHONE.width);
    expect(
      await page.getByTestId("nav-menu").evaluate((e) => e.scrollWidth <= e.clientWidth + 1),
    ).toBe(true);
    const price = page.getByLabel("Line 1 unit price");
    const p = (await price.boundingBox())!;
    expect(p.width).toBeGreaterThan(80);
    expect(p.x + p.width).toBeLessThanOrEqual(PHONE.width);
    await price.fill("123.45");
    expect(await price.inputValue()).toBe("123.45");
    expect(await onScreen(page, "line-total")).toBe(true);
    await page.screenshot({ path: `${shots}/quote-editor-390.png`, fullPage: true });
    await ctx.close();
  });

  it("the build sheet pins duty, margin, ceiling and the worst warning above the inputs, at every width", async () => {
    const ctx = await newClient(browser, PHONE);
    const page = await ctx.newPage();
    await signInAs(page, "tuner");
    await page.goto(`/builds/${DEMO_BUILD}`);
    // The form has taken over the page (its fields hold their values).
    await page.waitForFunction(
      () => (document.querySelector("#b-title") as HTMLInputElement | null)?.value,
    );
    const pinned = page.getByTestId("pinned-summary");
    await pinned.waitFor();
    for (const id of ["pinned-duty", "pinned-margin", "pinned-ceiling", "pinned-warning"])
      expect(await pinned.getByTestId(id).innerText(), id).toMatch(/\S/);
    // The same figures as the results panel.
    const duty = await page.getByTestId("pinned-duty").innerText();
    expect(duty).toMatch(/Duty at E\d+\s+[\d.]+ %/);
    const ceiling = await page.getByTestId("ceiling").innerText();
    expect(await page.getByTestId("pinned-ceiling").innerText()).toContain(
      ceiling.split(" ").slice(0, 2).join(" "),
    );
    // Scrolled down to the injectors' fields, the summary is still at the top of the screen.
    const field = page.getByLabel(/Rated flow/).first();
    await field.scrollIntoViewIfNeeded();
    await page.evaluate(() => window.scrollBy(0, 300));
    await frames(page);
    const box = (await pinned.boundingBox())!;
    expect(box.y).toBeLessThanOrEqual(1);
    expect(box.height).toBeLessThan(PHONE.height / 4);
    // It follows the inputs: a bigger power goal changes its duty figure.
    const power = page.getByLabel(/^Target power/).first();
    const before = await page.getByTestId("pinned-duty").innerText();
    const now = Number((await power.inputValue()).replace(/,/g, ""));
    await power.fill(String(Math.round(now * 1.3)));
    await expect.poll(() => page.getByTestId("pinned-duty").innerText()).not.toBe(before);
    await page.screenshot({ path: `${shots}/build-sheet-pinned.png` });
    // On a wide screen too (the results beside the inputs scroll away with the page).
    await page.setViewportSize({ width: 1280, height: 900 });
    await frames(page);
    expect(await pinned.isVisible()).toBe(true);
    expect((await pinned.boundingBox())!.y).toBeLessThanOrEqual(1);
    await ctx.close();
  }, 300_000);
});
