import type { Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";

import { launchBrowser, newClient, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";
import { attachment, waitForMail as waitForMailIn, type Mail } from "../helpers/mail";
import { inspectPdf } from "../helpers/pdf";

/**
 * Issue 20's whole job, driven on the screens as each role works it: the customer accepts a
 * quote in the portal and pays the deposit at the (fake) checkout; the counter opens the job,
 * orders the back-ordered line on a purchase order from the reorder list, e-mails it and
 * receives it; the tuner fits the job; the counter raises the invoice (the deposit deducted) and
 * issues it; the customer pays the balance in the portal (on a phone) and the receipt arrives.
 * Stock (on hand and reserved) is read through the JSON API at every step.
 *
 * Prices and quantities are invented; the sums are worked by hand (common practice, no source).
 */

vi.setConfig({ testTimeout: 900_000 });

const SHOP = "demo-shop-ridgeback";
const CUSTOMER_ID = "00000000-0000-4000-8000-000000000001"; // the demo portal customer (db/seed.ts)
const CUSTOMER_EMAIL = "customer@demo.fuelwright.test";
const INBOX = process.env.MAIL_INBOX_URL ?? "http://127.0.0.1:2536/messages";
const tag = `WJ${Date.now().toString(36).toUpperCase()}`;

let browser: Browser;
let api: Client;
const contexts: BrowserContext[] = [];
beforeAll(async () => {
  browser = await launchBrowser();
  api = await signIn("counter@demo.fuelwright.test");
});
afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => {});
  await browser?.close();
  await sql.end();
});

async function pageAs(who: "owner" | "tuner" | "counter" | "customer", width = 1280) {
  const ctx = await newClient(browser, { width, height: width < 640 ? 844 : 900 });
  contexts.push(ctx);
  const page = await ctx.newPage();
  // A dev server compiles each page on its first visit, on a shared machine.
  page.setDefaultTimeout(120_000);
  // Every confirmation on the way is answered yes.
  page.on("dialog", (d) => void d.accept());
  await signInAs(page, who);
  return page;
}

/** On hand and reserved of a part, as the JSON API answers them. */
async function stockOf(partId: string) {
  const r = await request(api, "GET", `/api/v1/parts/${partId}`);
  expect(r.status).toBe(200);
  return { stock: r.json.part.stock as number, reserved: r.json.part.reserved as number };
}

/** Waits for what the screen shows (a dev server compiles and renders PDFs slowly). */
const poll = <T>(fn: () => Promise<T>) => expect.poll(fn, { timeout: 90_000, interval: 250 });
const waitForMail = (to: string, subject: RegExp) => waitForMailIn(to, subject, 60_000);
const inbox = async () => (await (await fetch(INBOX)).json()) as Mail[];
const noWiderThan = async (page: Page, width: number) =>
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
    width,
  );

// Valid filter specs: the catalog CSV round trip (integration/round-trip) exports every part.
async function newPart(sku: string, name: string, stock: number, priceMinor: number) {
  const [p] =
    await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, cost_minor, stock, lead_time_days, specs)
    values (${SHOP}, ${sku}, 'filter', 'Wholejob', ${name}, ${priceMinor}, ${Math.round(priceMinor / 2)}, ${stock}, 7, ${sql.json({ micron: 10, dropKpa: 5, ethanolOk: true })})
    returning id`;
  return p!.id as string;
}

describe("a whole job after the deposit", () => {
  it("quote accepted → deposit → PO for the back-order → received → fitted → invoice → balance paid → receipt", async () => {
    // ---- Set-up: two parts of its own (one on the shelf, one not) and a quote for the demo portal customer: 1 × filter A (in stock), 2 × filter B
    // (none on the shelf) and 1.5 h of labour.
    const skuA = `${tag}-A`;
    const skuB = `${tag}-B`;
    const partA = await newPart(skuA, `Inline filter ${tag}`, 3, 4500); // 45.00
    const partB = await newPart(skuB, `Pre-pump strainer ${tag}`, 0, 3000); // 30.00
    const supplierName = `Wholejob Supply ${tag}`;
    const supplierEmail = `orders-${tag.toLowerCase()}@supplier.fuelwright.test`;
    const made = await request(api, "POST", "/api/v1/quotes", { customerId: CUSTOMER_ID });
    expect(made.status).toBe(201);
    const q = made.json.quote as { id: string; version: number; number: number };
    const saved = await request(api, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      validUntil: "2099-12-31",
      lines: [
        {
          kind: "part",
          partId: partA,
          sku: skuA,
          description: `Wholejob Inline filter ${tag}`,
          quantityMilli: 1000,
          unitPriceMinor: 4500,
          discountBp: 0,
        },
        {
          kind: "part",
          partId: partB,
          sku: skuB,
          description: `Wholejob Pre-pump strainer ${tag}`,
          quantityMilli: 2000,
          unitPriceMinor: 3000,
          discountBp: 0,
        },
        {
          kind: "labour",
          description: "Fitting",
          quantityMilli: 1500,
          unitPriceMinor: 10000,
          discountBp: 0,
        },
      ],
    });
    expect(saved.status, JSON.stringify(saved.json)).toBe(200);
    const quote = saved.json.quote as { subtotalMinor: number; number: number };
    // Lines: 45.00 + 60.00 + 1.5 h × 100.00 = 255.00 before tax (worked by hand).
    expect(quote.subtotalMinor).toBe(25500);
    expect(await stockOf(partA)).toEqual({ stock: 3, reserved: 0 });
    expect(await stockOf(partB)).toEqual({ stock: 0, reserved: 0 });

    // ---- The counter sends the quote from its page.
    const counter = await pageAs("counter");
    await counter.goto(`/quotes/${q.id}`);
    await counter.getByRole("button", { name: "Send to customer" }).click();
    await poll(() => counter.getByTestId("quote-status").innerText()).toBe("Sent");

    // ---- The customer, on a phone, accepts and pays the deposit at the test checkout.
    const customer = await pageAs("customer", 390);
    await customer.goto(`/my/quotes/${q.id}`);
    await customer.getByRole("button", { name: "Accept quote" }).click();
    await poll(() => customer.getByTestId("my-quote-status").innerText()).toBe("Accepted");
    // Accepting holds the filter on the shelf; the strainer is back-ordered.
    expect(await stockOf(partA)).toEqual({ stock: 3, reserved: 1 });
    expect(await stockOf(partB)).toEqual({ stock: 0, reserved: 0 });
    await customer.getByRole("button", { name: /^Pay deposit/ }).click();
    await customer.waitForURL(/\/pay\/cs_/);
    await customer.getByRole("button", { name: /^Pay / }).click();
    await customer.waitForURL(`**/my/quotes/${q.id}?payment=paid`);
    await poll(() => customer.getByTestId("my-quote-status").innerText()).toBe("Deposit paid");
    await noWiderThan(customer, 390);
    const [dep] =
      await sql`select amount_minor from payments where quote_id = ${q.id} and kind = 'deposit' and status = 'paid'`;
    const depositMinor = dep!.amount_minor as number;
    expect(depositMinor).toBeGreaterThan(0);

    // ---- The counter opens the job from the Jobs page.
    await counter.goto("/jobs");
    const waiting = counter
      .getByRole("listitem")
      .filter({ hasText: `Q-${String(quote.number).padStart(4, "0")}` });
    await waiting.getByRole("button", { name: "Open job" }).click();
    await counter.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
    const jobId = counter.url().split("/").pop()!;
    const jobLabelText = (await counter.getByRole("heading", { level: 1 }).innerText()).replace(
      "Job ",
      "",
    );
    expect(await counter.getByTestId("job-status").innerText()).toBe("Waiting for parts");
    expect(await stockOf(partA)).toEqual({ stock: 3, reserved: 1 });
    expect(await stockOf(partB)).toEqual({ stock: 0, reserved: 0 });

    // ---- The counter adds the strainer's supplier on screen: name, e-mail, lead time, then
    // (on the supplier's own page) their SKU and our cost; a wrong field says so by itself.
    await counter.goto("/purchasing");
    await counter.getByLabel("Supplier", { exact: true }).fill(supplierName);
    await counter.getByLabel("Orders e-mail").fill(supplierEmail);
    await counter.getByLabel("Lead time (days)").fill("4");
    await counter.getByRole("button", { name: "Add supplier" }).click();
    await counter.waitForURL(/\/purchasing\/suppliers\/[0-9a-f-]{36}$/);
    const addPart = counter.getByRole("combobox", { name: "Add a part they sell" });
    await addPart.fill(skuB);
    await counter.getByRole("option", { name: new RegExp(skuB) }).click();
    await counter.getByLabel(/^Their SKU for/).fill(`SUP-${tag}`);
    await counter.getByLabel(/^Cost of/).fill("14,00x");
    await counter.getByLabel("Lead time (days)").fill("four");
    await counter.getByRole("button", { name: "Save supplier" }).click();
    await poll(() => counter.getByRole("alert").allInnerTexts()).toEqual(
      expect.arrayContaining([
        expect.stringContaining("A whole number of days from 0 to 3650"),
        expect.stringContaining("A cost such as 12.50"),
      ]),
    );
    // The supplier's page fits a phone, its messages included.
    await counter.setViewportSize({ width: 390, height: 844 });
    await noWiderThan(counter, 390);
    await counter.setViewportSize({ width: 1280, height: 900 });
    await counter.getByLabel("Lead time (days)").fill("4");
    await counter.getByLabel(/^Cost of/).fill("14.00");
    await counter.getByRole("button", { name: "Save supplier" }).click();
    await poll(() => counter.getByText(/^✓ Saved$/).count()).toBe(1);
    const sup = await request(api, "GET", `/api/v1/suppliers/${counter.url().split("/").pop()}`);
    expect(sup.json.supplier).toMatchObject({
      name: supplierName,
      email: supplierEmail,
      leadTimeDays: 4,
      parts: [{ partId: partB, supplierSku: `SUP-${tag}`, costMinor: 1400 }],
    });

    // ---- Purchasing: the strainer is on the reorder list; the counter orders it.
    await counter.goto("/purchasing");
    const row = counter.getByTestId("reorder-list").getByRole("row").filter({ hasText: skuB });
    // Back-ordered 2, nothing on order: order 2.
    await poll(() => row.locator("td").nth(1).innerText()).toBe("2");
    expect(await row.locator("td").last().innerText()).toBe("2");
    const makeOrder = counter.getByRole("button", {
      name: `Make a purchase order for ${supplierName} (1 part)`,
    });
    // A first order is made by mistake and cancelled (after a confirmation): the strainer is
    // back on the reorder list with nothing on order.
    await makeOrder.click();
    await counter.waitForURL(/\/purchasing\/orders\/[0-9a-f-]{36}$/);
    let asked = "";
    counter.once("dialog", (d) => {
      asked = d.message();
    });
    await counter.getByRole("button", { name: "Cancel this order" }).click();
    await poll(() => counter.getByTestId("po-status").innerText()).toBe("Cancelled");
    expect(asked).toMatch(/^Cancel PO-\d{4}\? What it was for goes back on the reorder list/);
    expect(await counter.getByRole("button", { name: "Cancel this order" }).count()).toBe(0);
    expect(await counter.getByRole("button", { name: "Receive", exact: true }).count()).toBe(0);
    await counter.goto("/purchasing");
    await poll(() => row.locator("td").last().innerText()).toBe("2");
    expect(await stockOf(partB)).toEqual({ stock: 0, reserved: 0 });

    await makeOrder.click();
    await counter.waitForURL(/\/purchasing\/orders\/[0-9a-f-]{36}$/);
    const poId = counter.url().split("/").pop()!;
    const poLabelText = (await counter.getByRole("heading", { level: 1 }).innerText()).replace(
      "Purchase order ",
      "",
    );
    expect(await counter.getByTestId("po-lines").innerText()).toContain(skuB);
    await counter.getByRole("button", { name: "E-mail to the supplier" }).click();
    await poll(() => counter.getByTestId("po-status").innerText()).toBe("Sent to supplier");
    const poMail = await waitForMail(supplierEmail, new RegExp(poLabelText));
    expect(poMail.text).toContain(`2 × SUP-${tag}`);
    expect(inspectPdf(attachment(poMail, /\.pdf$/)).text).toContain(poLabelText);
    // Ordered, not yet here: nothing on the shelf moves.
    expect(await stockOf(partB)).toEqual({ stock: 0, reserved: 0 });

    // ---- The parts arrive: received in full on the order's page.
    const recv = counter.getByLabel(`${skuB} (of 2 outstanding)`);
    expect(await recv.inputValue()).toBe("2");
    await counter.getByRole("button", { name: "Receive", exact: true }).click();
    await poll(() => counter.getByTestId("po-status").innerText()).toBe("Received");
    // On the shelf and held for this job straight away.
    expect(await stockOf(partB)).toEqual({ stock: 2, reserved: 2 });
    expect(await stockOf(partA)).toEqual({ stock: 3, reserved: 1 });
    await waitForMail(CUSTOMER_EMAIL, new RegExp(`job ${jobLabelText}, ready to fit`));

    // ---- The tuner fits the job: what was quoted, and the labour used.
    const tuner = await pageAs("tuner");
    await tuner.goto(`/jobs/${jobId}`);
    expect(await tuner.getByTestId("job-status").innerText()).toBe("Ready to fit");
    expect(
      await tuner.getByLabel(`Wholejob Inline filter ${tag} (units fitted)`).inputValue(),
    ).toBe("1");
    expect(
      await tuner.getByLabel(`Wholejob Pre-pump strainer ${tag} (units fitted)`).inputValue(),
    ).toBe("2");
    // The labour starts at what was quoted.
    const labour = tuner.getByLabel("Labour used (hours)");
    expect(await labour.inputValue()).toBe("1.5");
    await labour.fill("2");
    await tuner.getByRole("button", { name: "Mark fitted" }).click();
    await poll(() => tuner.getByTestId("job-status").innerText()).toBe("Fitted");
    // Issued from the shelf; nothing reserved any more.
    expect(await stockOf(partA)).toEqual({ stock: 2, reserved: 0 });
    expect(await stockOf(partB)).toEqual({ stock: 0, reserved: 0 });
    await waitForMail(CUSTOMER_EMAIL, new RegExp(`job ${jobLabelText}, fitted`));

    // ---- The counter raises the invoice: fitted parts, 2 h at the quoted rate, deposit deducted.
    await counter.goto(`/jobs/${jobId}`);
    await counter.getByRole("button", { name: "Raise invoice" }).click();
    await counter.waitForURL(/\/invoices\/[0-9a-f-]{36}$/);
    const invoiceId = counter.url().split("/").pop()!;
    const inv = await request(api, "GET", `/api/v1/invoices/${invoiceId}`);
    expect(inv.status).toBe(200);
    const i = inv.json.invoice;
    // 45.00 + 60.00 + 2 h × 100.00 = 305.00 before tax (worked by hand).
    expect(i.subtotalMinor).toBe(30500);
    expect(i.depositMinor).toBe(depositMinor);
    expect(i.balanceMinor).toBe(i.totalMinor - depositMinor);
    // The draft is edited before it goes: the labour line says 2 h; a price that is no price
    // is marked on its own field; a note for the customer is saved.
    const totals = counter.getByTestId("invoice-editor-totals");
    expect(await totals.innerText()).toContain("Deposit paid");
    expect(await counter.getByLabel("Line 3: hours").inputValue()).toBe("2");
    await counter.getByLabel("Line 3: unit price").fill("a hundred");
    await counter.getByRole("button", { name: "Save draft" }).click();
    await poll(() => counter.getByText("Check the fields marked").count()).toBe(1);
    expect(await counter.getByLabel("Line 3: unit price").getAttribute("aria-invalid")).toBe(
      "true",
    );
    await counter.setViewportSize({ width: 390, height: 844 });
    await noWiderThan(counter, 390);
    await counter.screenshot({
      path: "test-results/whole-job-draft-invoice-390.png",
      fullPage: true,
    });
    await counter.setViewportSize({ width: 1280, height: 900 });
    await counter.getByLabel("Line 3: unit price").fill("100.00");
    await counter
      .getByLabel("Notes (printed on the invoice)")
      .fill(`Fitted and leak-checked ${tag}`);
    await counter.getByRole("button", { name: "Save draft" }).click();
    await poll(() => counter.getByText("Draft saved").count()).toBe(1);
    const edited = (await request(api, "GET", `/api/v1/invoices/${invoiceId}`)).json.invoice;
    expect(edited).toMatchObject({
      notes: `Fitted and leak-checked ${tag}`,
      subtotalMinor: 30500,
      version: i.version + 1,
    });
    await counter.getByRole("button", { name: "Issue and e-mail" }).click();
    await poll(() => counter.getByTestId("invoice-status").innerText()).toBe("Issued");
    const invoiceLabelText = (await counter.getByRole("heading", { level: 1 }).innerText()).replace(
      "Invoice ",
      "",
    );
    expect(invoiceLabelText).toMatch(/^INV-\d{4}$/);
    const invMail = await waitForMail(CUSTOMER_EMAIL, new RegExp(`invoice ${invoiceLabelText}`));
    expect(invMail.text).toContain("Deposit paid");
    expect(inspectPdf(attachment(invMail, /\.pdf$/)).text).toContain(invoiceLabelText);
    // An issued invoice offers no edit, only a credit note; it reads the deposit and the note.
    expect(await counter.getByRole("button", { name: "Issue and e-mail" }).count()).toBe(0);
    expect(await counter.getByRole("button", { name: "Save draft" }).count()).toBe(0);
    expect(await counter.getByTestId("invoice-ledger").innerText()).toContain("Deposit paid");
    expect(await counter.getByTestId("invoice-notes").innerText()).toContain(tag);
    expect(await counter.getByRole("button", { name: "Raise credit note" }).count()).toBe(1);

    // ---- The customer pays the balance in the portal (the link in the e-mail), on the phone.
    const link = new URL(/https?:\/\/\S+\/my\/invoices\/[0-9a-f-]{36}/.exec(invMail.text)![0]);
    await customer.goto(link.pathname);
    const due = await customer.getByTestId("balance-due").innerText();
    await customer.getByRole("button", { name: `Pay ${due}` }).click();
    await customer.waitForURL(/\/pay\/cs_/);
    await customer.getByRole("button", { name: /^Pay / }).click();
    await customer.waitForURL(`**/my/invoices/${invoiceId}?payment=paid`);
    expect(await customer.getByText("Thank you: your payment is received.").count()).toBe(1);
    await poll(() => customer.getByTestId("my-invoice-status").innerText()).toBe("Paid");
    await noWiderThan(customer, 390);
    await customer.screenshot({ path: "test-results/whole-job-paid-390.png", fullPage: true });

    // ---- The receipt is in the sink, once; so is every other e-mail of the job.
    const receipt = await waitForMail(
      CUSTOMER_EMAIL,
      new RegExp(`receipt for .* on invoice ${invoiceLabelText}`),
    );
    expect(receipt.text).toContain("Nothing more is owed on it.");
    const after = await request(api, "GET", `/api/v1/invoices/${invoiceId}`);
    expect(after.json.invoice).toMatchObject({ status: "paid", balanceMinor: 0 });
    const mine = (await inbox()).filter((m) => m.to.includes(CUSTOMER_EMAIL));
    const count = (re: RegExp) => mine.filter((m) => re.test(m.subject)).length;
    expect(count(new RegExp(`job ${jobLabelText}, ready to fit`))).toBe(1);
    expect(count(new RegExp(`job ${jobLabelText}, fitted`))).toBe(1);
    expect(count(new RegExp(`invoice ${invoiceLabelText},`))).toBe(1);
    expect(count(new RegExp(`receipt for .* on invoice ${invoiceLabelText}`))).toBe(1);
    expect((await inbox()).filter((m) => m.to.includes(supplierEmail)).length).toBe(1);
    // The stock ends where it started less what was fitted.
    expect(await stockOf(partA)).toEqual({ stock: 2, reserved: 0 });
    expect(await stockOf(partB)).toEqual({ stock: 0, reserved: 0 });
    expect(poId).toBeTruthy();
  });
});
