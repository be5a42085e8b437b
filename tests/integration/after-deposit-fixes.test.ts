import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";

import { sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";
import { attachment, waitForMail } from "../helpers/mail";
import { inspectPdf } from "../helpers/pdf";

/**
 * What an outside tester found in the flow after the deposit (issue 20), as the shop and the
 * customer see it: the fit form starts at the quoted labour (1.5 h, not 2) and the invoice bills
 * it; a part other than the quoted one is fitted and issued; the parts API takes JSON numbers;
 * the e-mail names its attachment as the file is named; the invoice PDF says the discount's
 * amount; the owner hears the shop's notices without opting in.
 *
 * Prices are invented; the sums are worked by hand (common practice, no source).
 */

vi.setConfig({ testTimeout: 600_000 });

const SHOP = "demo-shop-ridgeback";
const CUSTOMER_ID = "00000000-0000-4000-8000-000000000001";
const CUSTOMER_EMAIL = "customer@demo.fuelwright.test";
const OWNER_EMAIL = "owner@demo.fuelwright.test";
const FAKE = process.env.PAYMENTS_FAKE_URL ?? "http://127.0.0.1:12121";
const tag = `FX${Date.now().toString(36).toUpperCase()}`;
let counter: Client, customer: Client, tuner: Client;

beforeAll(async () => {
  [counter, customer, tuner] = await Promise.all([
    signIn("counter@demo.fuelwright.test"),
    signIn(CUSTOMER_EMAIL),
    signIn("tuner@demo.fuelwright.test"),
  ]);
});
afterAll(async () => {
  await sql.end();
});

let n = 0;
async function part(stock: number, priceMinor = 14340) {
  const sku = `${tag}-${++n}`;
  const [p] =
    await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, cost_minor, stock, specs)
    values (${SHOP}, ${sku}, 'filter', 'Testbrand', ${`Test filter ${n}`}, ${priceMinor}, 9000, ${stock}, ${sql.json({ micron: 10 })})
    returning id, sku, name`;
  return p as { id: string; sku: string; name: string };
}
const stockOf = async (id: string) => {
  const [p] = await sql`select stock, reserved from parts where id = ${id}`;
  return { stock: p!.stock as number, reserved: p!.reserved as number };
};

describe("fitting and invoicing as quoted", () => {
  it("the fit form starts at the quoted 1.5 h, a swapped part is issued, the invoice bills 1.5 h and names its PDF as it is", async () => {
    const quoted = await part(1);
    const fittedInstead = await part(1);
    // 1 × 143.40 at 7.5 % off (−10.76 rounded half up from 10.755) and 1.5 h at 120.00.
    const made = await request(counter, "POST", "/api/v1/quotes", { customerId: CUSTOMER_ID });
    const q = made.json.quote as { id: string; version: number };
    const saved = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      validUntil: "2099-12-31",
      lines: [
        {
          kind: "part",
          partId: quoted.id,
          sku: quoted.sku,
          description: `Testbrand ${quoted.name}`,
          quantityMilli: 1000,
          unitPriceMinor: 14340,
          discountBp: 750,
        },
        {
          kind: "labour",
          description: "Fitting",
          quantityMilli: 1500,
          unitPriceMinor: 12000,
          discountBp: 0,
        },
      ],
    });
    expect(saved.status, JSON.stringify(saved.json)).toBe(200);
    await sql`update quotes set status = 'sent' where id = ${q.id}`;
    const accepted = await request(customer, "POST", `/api/v1/quotes/${q.id}/respond`, {
      decision: "accept",
    });
    expect(accepted.status).toBe(200);
    // The owner hears of it without having opted in (the seeded owner is opted in).
    await waitForMail(OWNER_EMAIL, /accepted quote/);

    const start = await request(customer, "POST", `/api/v1/quotes/${q.id}/deposit`);
    expect(start.status).toBe(200);
    const sessionId = new URL(start.json.url).pathname.split("/").pop()!;
    const done = await fetch(`${FAKE}/__fake/sessions/${sessionId}/complete`, { method: "POST" });
    expect(done.status).toBe(200);
    const opened = await request(counter, "POST", "/api/v1/jobs", { quoteId: q.id });
    expect(opened.status, JSON.stringify(opened.json)).toBe(201);
    const job = opened.json.job as { id: string; version: number };

    // The tuner's job page: "Labour used (hours)" starts at the quoted 1.5, not a made-up 2;
    // each quoted part can be swapped and a part not quoted added.
    const page = await request(tuner, "GET", `/jobs/${job.id}`);
    expect(page.status).toBe(200);
    const labourBox = /<input[^>]*name="labour-hours"[^>]*>/.exec(page.text)?.[0] ?? "";
    expect(labourBox).toContain('value="1.5"');
    expect(page.text).toContain("Fitted another part instead");
    expect(page.text).toContain("Add a part that was fitted");

    // Fitted with the other part (as the form sends a swap) and the 1.5 h.
    const fitted = await request(tuner, "POST", `/api/v1/jobs/${job.id}/fit`, {
      version: job.version,
      parts: [{ partId: fittedInstead.id, quantity: 1 }],
      labourMilli: 1500,
    });
    expect(fitted.status, JSON.stringify(fitted.json)).toBe(200);
    expect(await stockOf(fittedInstead.id)).toEqual({ stock: 0, reserved: 0 });
    expect(await stockOf(quoted.id)).toEqual({ stock: 1, reserved: 0 });

    const inv = await request(counter, "POST", "/api/v1/invoices", { jobId: job.id });
    expect(inv.status, JSON.stringify(inv.json)).toBe(201);
    const lines = inv.json.invoice.lines as {
      kind: string;
      sku: string | null;
      quantityMilli: number;
    }[];
    expect(lines.map((l) => [l.kind, l.sku, l.quantityMilli])).toEqual([
      ["part", fittedInstead.sku, 1000],
      ["labour", null, 1500],
    ]);

    // The invoice PDF's discount column: the quoted part was not fitted, so put a discount on
    // the draft's labour line to see one: 1.5 h × 120.00 = 180.00, 7.5 % off = −13.50.
    const withDiscount = await request(
      counter,
      "PATCH",
      `/api/v1/invoices/${inv.json.invoice.id}`,
      {
        version: inv.json.invoice.version,
        lines: inv.json.invoice.lines.map((l: Record<string, unknown>) => ({
          kind: l.kind,
          partId: l.partId ?? undefined,
          sku: l.sku ?? undefined,
          description: l.description,
          quantityMilli: l.quantityMilli,
          unitPriceMinor: l.unitPriceMinor,
          discountBp: l.kind === "labour" ? 750 : 0,
        })),
      },
    );
    expect(withDiscount.status, JSON.stringify(withDiscount.json)).toBe(200);
    const issued = await request(counter, "POST", `/api/v1/invoices/${inv.json.invoice.id}/issue`, {
      version: withDiscount.json.invoice.version,
    });
    expect(issued.status, JSON.stringify(issued.json)).toBe(200);
    const label = `INV-${String(issued.json.invoice.number).padStart(4, "0")}`;
    const mail = await waitForMail(CUSTOMER_EMAIL, new RegExp(`invoice ${label}`));
    const named = /Attached: ([^\s,]+\.pdf)/.exec(mail.text)?.[1];
    expect(mail.attachments.map((a) => a.filename)).toEqual([named]);
    const pdf = inspectPdf(attachment(mail, /\.pdf$/));
    // The PDF font writes the minus sign as a hyphen (pdfText), as the quote PDF does.
    expect(pdf.text).toMatch(/7\.5 % \([−-]\$13\.50\)/);
    // The labour line's hours with their unit, as on the quote PDF (the quantity registry's "h").
    expect(pdf.text).toMatch(/1\.5 ?h\s/);
  });
});

describe("the JSON API takes numbers as numbers", () => {
  it("POST /api/v1/parts with stock, price, reorder level and lead time as JSON numbers", async () => {
    const sku = `${tag}-NUM`;
    const r = await request(counter, "POST", "/api/v1/parts", {
      sku,
      category: "filter",
      brand: "Testbrand",
      name: "Numbered filter",
      price: 25.5,
      stock: 1,
      reorder_level: 2,
      lead_time_days: 7,
      micron: 10,
    });
    expect(r.status, JSON.stringify(r.json)).toBe(201);
    expect(r.json.part).toMatchObject({
      sku,
      stock: 1,
      priceMinor: 2550,
      reorderLevel: 2,
      leadTimeDays: 7,
    });
    // A number that is not a whole count is refused on its field, as the text "1.5" is.
    const bad = await request(counter, "POST", "/api/v1/parts", {
      sku: `${sku}-2`,
      category: "filter",
      brand: "Testbrand",
      name: "Half filter",
      price: 10,
      stock: 1.5,
      micron: 10,
    });
    expect(bad.status).toBe(422);
    expect(bad.json.error.issues.map((i: { path: string }) => i.path)).toContain("stock");
    // A part's PATCH takes them too.
    const patched = await request(counter, "PATCH", `/api/v1/parts/${r.json.part.id}`, {
      stock: 4,
    });
    expect(patched.status, JSON.stringify(patched.json)).toBe(200);
    expect(patched.json.part.stock).toBe(4);
  });
});
