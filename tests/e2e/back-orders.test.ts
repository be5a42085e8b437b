import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { calendarDay, formatCalendarDate } from "@/lib/format/dates";

import { launchBrowser, newClient, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";
import { request, signIn } from "../helpers/http";

const SHOP = "demo-shop-ridgeback";
const CUSTOMER_ID = "00000000-0000-4000-8000-000000000001"; // the demo portal customer (db/seed.ts)

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

describe("back-orders in the portal, before the customer accepts", () => {
  it("the quote says what is held and what is back-ordered until when; the confirmation says the same; on a phone too", async () => {
    const tag = `BO${Date.now().toString(36).toUpperCase()}`;
    // A pump with 1 on the shelf and 12 days' lead time, and a quote for 2 of it.
    const [part] =
      await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, stock, lead_time_days, specs)
      values (${SHOP}, ${tag}, 'pump', 'Testbrand', 'Back-order pump', 19900, 1, 12,
        ${sql.json({
          curves: [
            {
              voltage: 13.5,
              points: [
                { pressureKpa: 300, flowLPerH: 300 },
                { pressureKpa: 600, flowLPerH: 200 },
              ],
            },
          ],
          mounting: "in-tank",
          ethanolOk: true,
        })})
      returning id`;
    const counter = await signIn("counter@demo.fuelwright.test");
    const made = await request(counter, "POST", "/api/v1/quotes", { customerId: CUSTOMER_ID });
    const q = made.json.quote as { id: string; version: number };
    const saved = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      validUntil: "2099-12-31",
      lines: [
        {
          kind: "part",
          partId: part!.id,
          sku: tag,
          description: "Back-order pump",
          quantityMilli: 2000,
          unitPriceMinor: 19900,
          discountBp: 0,
        },
      ],
    });
    expect(saved.status).toBe(200);
    await sql`update quotes set status = 'sent' where id = ${q.id}`;
    const [s] = await sql`select time_zone from shop_settings where shop_id = ${SHOP}`;
    const day = formatCalendarDate(calendarDay(new Date(), (s?.time_zone as string) ?? "UTC", 12));

    const ctx = await newClient(browser, { width: 390, height: 844 });
    const page = await ctx.newPage();
    await signInAs(page, "customer");
    await page.goto(`/my/quotes/${q.id}`);
    const stock = page.getByTestId("stock-promise");
    await expect
      .poll(() => stock.innerText())
      .toContain(`1 of 2 in stock; the other expected by ${day}`);
    await page.screenshot({ path: "test-results/back-order-portal-390.png", fullPage: true });
    // Nothing overflows the phone's width.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );

    let asked = "";
    page.on("dialog", (d) => {
      asked = d.message();
      void d.accept();
    });
    await page.getByRole("button", { name: "Accept quote" }).click();
    await expect.poll(() => page.getByTestId("my-quote-status").innerText()).toBe("Accepted");
    expect(asked).toBe(
      `Accept this quote? The shop will hold 1 × Back-order pump for you; back-ordered: 1 × Back-order pump (expected by ${day}).`,
    );
    await expect
      .poll(() => stock.innerText())
      .toContain(`1 of 2 held; the other expected by ${day}`);
    const [held] = await sql`select held_qty from quote_lines where quote_id = ${q.id}`;
    expect(held!.held_qty).toBe(1);
    await ctx.close();
  });
});
