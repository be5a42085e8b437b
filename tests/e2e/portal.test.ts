import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { launchBrowser, newClient, signInAs } from "../helpers/browser";
import { sql } from "../helpers/db";
import { request, signIn } from "../helpers/http";
import { waitForMail } from "../helpers/mail";
import { inspectPdf } from "../helpers/pdf";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await sql.end();
});

describe("customer portal", () => {
  it("counter sends a quote → the customer is invited, sets a password, downloads the spec sheet, accepts, pays the deposit → the counter sees it paid", async () => {
    // Set-up through the API: a new customer (no sign-in yet) with a build and a draft quote for it.
    const tag = Date.now().toString(36);
    const email = `portal-${tag}@customer.fuelwright.test`;
    const api = await signIn("counter@demo.fuelwright.test");
    const customer = await request(api, "POST", "/api/v1/customers", {
      name: `Portal Customer ${tag}`,
      email,
    });
    expect(customer.status).toBe(201);
    const [demo] =
      await sql`select inputs from builds where id = '10000000-0000-4000-8000-000000000002'`;
    const tuner = await signIn("tuner@demo.fuelwright.test");
    const build = await request(tuner, "POST", "/api/v1/builds", {
      customerId: customer.json.customer.id,
      title: `Portal E2E build ${tag}`,
      inputs: demo!.inputs,
    });
    expect(build.status).toBe(201);
    const quote = await request(api, "POST", "/api/v1/quotes", { buildId: build.json.build.id });
    expect(quote.status).toBe(201);
    const quoteId = quote.json.quote.id;

    // The counter sends it from the quote page.
    const counterCtx = await newClient(browser);
    const counter = await counterCtx.newPage();
    await signInAs(counter, "counter");
    await counter.goto(`/quotes/${quoteId}`);
    await counter.getByRole("button", { name: "Send to customer" }).click();
    await expect.poll(() => counter.getByTestId("quote-status").innerText()).toBe("Sent");

    // The invitation arrives in the mail sink with the quote.
    const mail = await waitForMail(email, /quote/);
    const invite = /https?:\/\/\S+\/accept-invitation\/[\w-]+/.exec(mail.text)?.[0];
    expect(invite).toBeTruthy();

    const ctx = await newClient(browser);
    const page = await ctx.newPage();
    page.on("dialog", (d) => void d.accept());
    await page.goto(new URL(invite!).pathname);
    await page.getByLabel("Your name").fill(`Portal Customer ${tag}`);
    await page.getByLabel("Choose a password").fill("portal-e2e-password");
    await page.getByRole("button", { name: "Join the shop" }).click();
    await page.waitForURL("**/my");
    await expect.poll(() => page.getByText(`Portal E2E build ${tag}`).count()).toBeGreaterThan(0);

    // The spec sheet downloads as a PDF with the build's title.
    const href = await page
      .getByRole("link", { name: "Download the spec sheet (PDF)" })
      .first()
      .getAttribute("href");
    const pdf = await ctx.request.get(href!);
    expect(pdf.headers()["content-type"]).toBe("application/pdf");
    const sheet = inspectPdf(Buffer.from(await pdf.body()));
    expect(sheet.title).toContain(`Portal E2E build ${tag}`);

    // Accept, then pay the deposit at the local test checkout.
    await page
      .getByRole("link", { name: /^Quote Q-/ })
      .first()
      .click();
    await page.waitForURL(`**/my/quotes/${quoteId}`);
    // Before accepting, the deposit asked is on the page beside the total (as on the PDF).
    const asked = await page.getByTestId("deposit-asked").innerText();
    expect(asked).toMatch(/Deposit on acceptance: \d+(\.\d+)?\s?%\s\(\D*[\d,.]+\) of the total/);
    await page.getByRole("button", { name: "Accept quote" }).click();
    await expect.poll(() => page.getByTestId("my-quote-status").innerText()).toBe("Accepted");
    await page.getByRole("button", { name: /^Pay deposit/ }).click();
    await page.waitForURL(/\/pay\/cs_/);
    const amount = await page.getByTestId("amount").innerText();
    await page.screenshot({ path: "test-results/screenshots/checkout.png", fullPage: true });
    await page.getByRole("button", { name: /^Pay / }).click();
    await page.waitForURL(`**/my/quotes/${quoteId}?payment=paid`);
    await expect.poll(() => page.getByTestId("my-quote-status").innerText()).toBe("Deposit paid");
    expect(await page.getByText("Thank you: your deposit is paid.").count()).toBe(1);
    await page.screenshot({ path: "test-results/screenshots/portal-paid.png", fullPage: true });

    // The counter sees it.
    await counter.reload();
    await expect.poll(() => counter.getByTestId("quote-status").innerText()).toBe("Deposit paid");
    const paidLine = await counter.getByTestId("quote-payments").innerText();
    expect(paidLine).toContain("deposit paid");
    expect(paidLine).toContain(amount.split(" ")[0]); // "156.00 USD" at the checkout, "$156.00" here (labour only: under $1,000)
    await ctx.close();
    await counterCtx.close();
  });
});
