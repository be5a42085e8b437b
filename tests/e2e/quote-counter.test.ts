import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, newClient, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";
import { getBytes, request, signIn, type Client } from "../helpers/http";
import { attachment, waitForMail } from "../helpers/mail";
import { inspectPdf } from "../helpers/pdf";

/**
 * The counter's quotes as people see them (issue 19): a parts-only quote made from the quotes
 * page with the keyboard; a discount that reads the same on the quote page, the PDF, the portal
 * and the e-mail; the e-mail's attachments and the portal's links; the quotes list and the
 * catalog filtered from the URL; what changed since the revision the customer saw.
 */

const PORTAL_CUSTOMER = "00000000-0000-4000-8000-000000000001"; // Dashiell Moreau, has a portal sign-in (db/seed.ts)
const PORTAL_BUILD = "10000000-0000-4000-8000-000000000002"; // his "500 whp on pump E85" build (db/seed.ts)
const tag = `QE${Date.now().toString(36).toUpperCase()}`;
let browser: Browser;
let api: Client;
let partId: string;

beforeAll(async () => {
  browser = await launchBrowser();
  api = await signIn("counter@demo.fuelwright.test");
  const [p] =
    await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, stock) values ('demo-shop-ridgeback', ${`${tag}-PMP`}, 'other', 'Testbrand', ${`Counter pump ${tag}`}, 18000, 2) returning id`;
  partId = p!.id;
  // "other": a part the kit does not size (a pump without curves would stop every build's kit).
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

const label = (n: number, r = 1) => `Q-${String(n).padStart(4, "0")}${r > 1 ? `-r${r}` : ""}`;
const flat = (s: string) => s.replace(/\s+/g, " ");

async function counterPage(): Promise<Page> {
  const ctx = await newClient(browser);
  const page = await ctx.newPage();
  await signInAs(page, "counter");
  return page;
}

describe("a parts-only quote", () => {
  it("made from the quotes page with the keyboard: customer and part found as you type", async () => {
    const page = await counterPage();
    await page.goto("/quotes");
    await page.getByRole("link", { name: "New quote" }).click();
    await page.waitForURL("**/quotes/new");
    const who = page.getByRole("combobox", { name: "Find the customer" });
    await who.focus();
    await page.keyboard.type("Moreau");
    await expect.poll(() => page.getByRole("option").count()).toBeGreaterThan(0);
    await page.keyboard.press("Enter");
    await expect
      .poll(() => page.getByTestId("quote-customer").innerText())
      .toContain("Dashiell Moreau");
    const part = page.getByRole("combobox", { name: "Add a part from the catalog" });
    await part.focus();
    await page.keyboard.type(`${tag}-PMP`);
    await expect
      .poll(() => page.getByRole("option").first().innerText())
      .toContain(`Counter pump ${tag}`);
    await page.keyboard.press("ArrowDown");
    await page.keyboard.press("Enter");
    await page.getByLabel(`Quantity of ${tag}-PMP`).fill("2");
    await page.getByLabel(/Labour hours at \$120\.00 an hour/).fill("1.5");
    // By hand: 2 × 180.00 = 360.00; 1.5 h × 120.00 = 180.00; 540.00; 8.25 % = 44.55; 584.55.
    await expect.poll(() => page.getByTestId("new-quote-total").innerText()).toContain("$584.55");
    await page.screenshot({ path: "test-results/screenshots/new-quote.png", fullPage: true });
    await page.getByRole("button", { name: "Create quote" }).click();
    await page.waitForURL(/\/quotes\/[0-9a-f-]{36}$/);
    await expect.poll(() => page.getByTestId("quote-total").innerText()).toBe("$584.55");
    const id = page.url().split("/").pop()!;
    const [q] = await sql`select build_id, total_minor from quotes where id = ${id}`;
    expect(q).toMatchObject({ build_id: null, total_minor: 58455 });

    // Labour is on the quote: the button goes to its hours and adds no second line.
    await page.getByRole("button", { name: "Labour hours" }).click();
    await expect.poll(() => page.getByText(/Labour is already on line 2/).count()).toBe(1);
    await expect.poll(() => page.getByTestId("line-total").count()).toBe(2);
    await expect
      .poll(() => page.evaluate(() => document.activeElement?.getAttribute("aria-label")))
      .toBe("Line 2 quantity");
    await page.context().close();
  });

  it("the customer page starts one for that customer", async () => {
    const page = await counterPage();
    await page.goto(`/customers/${PORTAL_CUSTOMER}`);
    await page.getByRole("link", { name: "New quote" }).click();
    await page.waitForURL(`**/quotes/new?customer=${PORTAL_CUSTOMER}`);
    await expect
      .poll(() => page.getByTestId("quote-customer").innerText())
      .toContain("Dashiell Moreau");
    await page.context().close();
  });
});

describe("a discount reads the same on the page, the PDF, the portal and the e-mail", () => {
  it("price, discount, line total; subtotal after discounts; the e-mail carries the quote PDF and the spec sheet, the portal links both", async () => {
    const created = await request(api, "POST", "/api/v1/quotes", {
      buildId: PORTAL_BUILD,
      labourHours: 0,
    });
    expect(created.status).toBe(201);
    const q = created.json.quote as { id: string; number: number; version: number };
    const saved = await request(api, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      lines: [
        {
          kind: "part",
          partId,
          sku: `${tag}-PMP`,
          description: `Counter pump ${tag}`,
          quantityMilli: 1000,
          unitPriceMinor: 18000,
          discountBp: 1000,
        },
        {
          kind: "labour",
          description: "Fuel system fitting and setup",
          quantityMilli: 1500,
          unitPriceMinor: 12000,
          discountBp: 0,
        },
      ],
    });
    expect(saved.status).toBe(200);
    const sent = await request(api, "POST", `/api/v1/quotes/${q.id}/send`);
    expect(sent.status).toBe(200);

    // By hand: 1 × 180.00, 10 % off (18.00) = 162.00; 1.5 h × 120.00 = 180.00; subtotal after
    // discounts 342.00; 8.25 % tax = 28.215 → 28.22; total 370.22.
    const figures = [
      "$180.00",
      "10 % (−$18.00)",
      "$162.00",
      "Subtotal $342.00",
      "Includes discounts of $18.00",
      "Tax (8.25 %) $28.22",
      "Total $370.22",
    ];

    // The shop's quote page: a sent quote's editor still shows its inputs (an edit makes the
    // next revision), so the figures are read from the table's text beside them.
    const page = await counterPage();
    await page.goto(`/quotes/${q.id}`);
    const shop = flat(await page.locator("table").first().innerText());
    for (const f of ["−$18.00", "$162.00", "$342.00", "Includes discounts of $18.00", "$28.22"])
      expect(shop).toContain(f);
    expect(await page.getByTestId("quote-subtotal").innerText()).toBe("$342.00");
    expect(await page.getByTestId("quote-total").innerText()).toBe("$370.22");
    // Nothing subtracted below the subtotal: no "Discounts" row taken off again.
    expect(shop).not.toMatch(/Discounts\s*−/);
    await page.context().close();

    // The PDF (its latin font prints "−" as "-").
    const pdf = await getBytes(api, `/api/v1/quotes/${q.id}/pdf`);
    const pdfText = flat(inspectPdf(pdf.bytes).text);
    for (const f of figures) expect(pdfText).toContain(f.replace("−", "-"));

    // The e-mail, with its attachments.
    const mail = await waitForMail("customer@demo.fuelwright.test", new RegExp(label(q.number)));
    for (const f of [
      "$180.00 each, discount 10 % (−$18.00): $162.00",
      "Subtotal $342.00 (includes discounts of $18.00)",
      "Tax (8.25 %) $28.22",
      "Total $370.22",
    ])
      expect(mail.text).toContain(f);
    expect(mail.attachments.map((a) => a.filename)).toEqual([
      `quote-${label(q.number)}.pdf`,
      expect.stringMatching(/^500-whp-on-pump-E85-v\d+\.pdf$/),
    ]);
    expect(flat(inspectPdf(attachment(mail, /^quote-/)).text)).toContain("Total $370.22");
    expect(inspectPdf(attachment(mail, /^500-whp/)).text).toContain("500 whp on pump E85");

    // The portal: the same lines and totals, and links to both documents.
    const ctx = await newClient(browser);
    const portal = await ctx.newPage();
    await signInAs(portal, "customer");
    await portal.goto(`/my/quotes/${q.id}`);
    const mine = flat(await portal.getByTestId("quote-lines").innerText());
    for (const f of ["$180.00", "10 % (−$18.00)", "$162.00", "$342.00", "Tax (8.25 %)", "$28.22"])
      expect(mine).toContain(f);
    expect(mine).toContain("Includes discounts of $18.00");
    expect(await portal.getByTestId("quote-total").innerText()).toBe("$370.22");
    const specHref = await portal
      .getByRole("link", { name: "Spec sheet (PDF)" })
      .getAttribute("href");
    expect(specHref).toBe(`/api/v1/builds/${PORTAL_BUILD}/spec-sheet`);
    const spec = await portal.request.get(specHref!);
    expect(spec.status()).toBe(200);
    expect(spec.headers()["content-type"]).toBe("application/pdf");
    const quoteHref = await portal
      .getByRole("link", { name: "Download quote (PDF)" })
      .getAttribute("href");
    const download = await portal.request.get(quoteHref!);
    expect(flat(inspectPdf(Buffer.from(await download.body())).text)).toContain("Total $370.22");
    await portal.screenshot({
      path: "test-results/screenshots/portal-discount.png",
      fullPage: true,
    });
    await ctx.close();
  });
});

describe("lists filtered from the URL", () => {
  it("the quotes list reads ?q=&status= and writes what is typed and chosen back into the URL", async () => {
    const c = await request(api, "POST", "/api/v1/customers", {
      name: `Marit Ensor ${tag}`,
      email: `marit-${tag.toLowerCase()}@example.test`,
    });
    const customerId = c.json.customer.id as string;
    const make = async () =>
      (
        await request(api, "POST", "/api/v1/quotes", {
          customerId,
          lines: [
            {
              kind: "fee",
              description: "Fuel pressure test",
              quantityMilli: 1000,
              unitPriceMinor: 5000,
              discountBp: 0,
            },
          ],
        })
      ).json.quote as { id: string; number: number };
    const [a, b] = [await make(), await make()];
    await sql`update quotes set status = 'sent', valid_until = '2099-12-31' where id = ${b.id}`;

    const page = await counterPage();
    const rows = () => page.getByTestId("quotes-table").locator("tbody tr");
    await page.goto(`/quotes?q=${encodeURIComponent(`Ensor ${tag}`)}`);
    await expect.poll(() => rows().count()).toBe(2);
    expect(await page.getByLabel("Search quotes").inputValue()).toBe(`Ensor ${tag}`);
    await page.goto(`/quotes?q=${encodeURIComponent(`Ensor ${tag}`)}&status=sent`);
    await expect.poll(() => rows().count()).toBe(1);
    expect(await rows().first().innerText()).toContain(label(b.number));
    expect(await page.getByLabel("Status").inputValue()).toBe("sent");

    // Choosing and typing change the URL (and so the list).
    await page.getByLabel("Status").selectOption("draft");
    await page.waitForURL((u) => u.searchParams.get("status") === "draft");
    await expect.poll(() => rows().first().innerText()).toContain(label(a.number));
    await page.getByLabel("Search quotes").fill(label(a.number));
    await page.waitForURL((u) => u.searchParams.get("q") === label(a.number));
    await expect.poll(() => rows().count()).toBe(1);
    // Reloading keeps the filters.
    await page.reload();
    await expect.poll(() => rows().count()).toBe(1);
    expect(await page.getByLabel("Search quotes").inputValue()).toBe(label(a.number));

    // Nothing matches: said so.
    await page.goto(`/quotes?q=${encodeURIComponent(`nobody ${tag}`)}`);
    await expect.poll(() => page.getByText("No quote matches").count()).toBe(1);
    await page.context().close();
  });

  it("the catalog reads ?q=&category= and keeps what is typed in the URL", async () => {
    const page = await counterPage();
    await page.goto(`/parts?q=${tag}&category=other`);
    await expect.poll(() => page.locator("tbody tr").count()).toBe(1);
    expect(await page.getByLabel("Search parts").inputValue()).toBe(tag);
    await page.getByLabel("Category").selectOption("injector");
    await page.waitForURL((u) => u.searchParams.get("category") === "injector");
    await expect.poll(() => page.getByText("No part matches").count()).toBe(1);
    await page.reload();
    expect(await page.getByLabel("Category").inputValue()).toBe("injector");
    await page.context().close();
  });
});

describe("a new revision shows what changed since the one the customer saw", () => {
  it("lines changed and added, and the totals before → after", async () => {
    const created = await request(api, "POST", "/api/v1/quotes", {
      customerId: PORTAL_CUSTOMER,
      lines: [
        {
          kind: "labour",
          description: "Fitting",
          quantityMilli: 1000,
          unitPriceMinor: 12000,
          discountBp: 0,
        },
      ],
    });
    const q = created.json.quote as { id: string; number: number; version: number };
    expect((await request(api, "POST", `/api/v1/quotes/${q.id}/send`)).status).toBe(200);
    const revised = await request(api, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version + 1,
      lines: [
        {
          kind: "labour",
          description: "Fitting",
          quantityMilli: 2000,
          unitPriceMinor: 12000,
          discountBp: 0,
        },
        {
          kind: "part",
          partId,
          sku: `${tag}-PMP`,
          description: `Counter pump ${tag}`,
          quantityMilli: 1000,
          unitPriceMinor: 18000,
          discountBp: 1000,
        },
      ],
    });
    expect(revised.status).toBe(200);
    const page = await counterPage();
    await page.goto(`/quotes/${revised.json.quote.id}`);
    const changes = flat(await page.getByTestId("revision-changes").innerText());
    expect(changes).toContain(`Changes since ${label(q.number)}`);
    // By hand: was 1 h × 120.00 = 120.00 (+ 9.90 tax = 129.90); now 2 h = 240.00 and the pump
    // 180.00 less 10 % = 162.00: 402.00, tax 33.165 → 33.17, total 435.17.
    expect(changes).toContain(
      `+ Added Counter pump ${tag} (${tag}-PMP): 1 × $180.00, discount 10 % (−$18.00) = $162.00`,
    );
    expect(changes).toContain("~ Changed Fitting: qty 1 h → 2 h; line total $120.00 → $240.00");
    expect(changes).toContain("Subtotal: $120.00 → $402.00");
    expect(changes).toContain("Total: $129.90 → $435.17");
    await page.context().close();
  });
});
