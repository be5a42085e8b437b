import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { getBytes, request, signIn, type Client } from "../helpers/http";
import { attachment, waitForMail } from "../helpers/mail";
import { inspectPdf } from "../helpers/pdf";

/**
 * The counter's quotes (issue 19): a parts-only quote straight from the catalog through
 * POST /api/v1/quotes, labour at the shop's rate added once, the quotes list searched and
 * filtered through GET /api/v1/quotes?q=&status=, and the e-mail carrying the quote PDF and,
 * for a build, its spec sheet. A shop of its own, so its rates are the test's.
 */

const tag = `QK${Date.now().toString(36).toUpperCase()}`;
let owner: Client;
let shopId: string;
let customerId: string;
let otherCustomerId: string;
let pumpId: string;
let theirPartId: string;

const pumpLine = (discountBp: number) => ({
  kind: "part",
  partId: pumpId,
  sku: `${tag}-PUMP`,
  description: "Testbrand 340 L/h in-tank pump",
  quantityMilli: 1000,
  unitPriceMinor: 18000,
  discountBp,
});

beforeAll(async () => {
  const shop = await makeOtherShop();
  shopId = shop.shopId;
  // Invented rates (inputs): labour 95.00 an hour, tax 10 %.
  await sql`update shop_settings set labour_rate_minor = 9500, tax_rate_bp = 1000, currency = 'USD' where shop_id = ${shopId}`;
  owner = await signIn(shop.email, shop.password);
  const c = await request(owner, "POST", "/api/v1/customers", {
    name: `Rosalind Okafor ${tag}`,
    email: `rosalind-${tag.toLowerCase()}@example.test`,
  });
  expect(c.status).toBe(201);
  customerId = c.json.customer.id;
  const d = await request(owner, "POST", "/api/v1/customers", {
    name: `Teodor Lindqvist ${tag}`,
    email: `teodor-${tag.toLowerCase()}@example.test`,
  });
  otherCustomerId = d.json.customer.id;
  const [p] =
    await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, stock) values (${shopId}, ${`${tag}-PUMP`}, 'pump', 'Testbrand', '340 L/h in-tank pump', 18000, 3) returning id`;
  pumpId = p!.id;
  const [t] =
    await sql`insert into parts (shop_id, sku, category, brand, name, price_minor) values ('demo-shop-ridgeback', ${`${tag}-THEIRS`}, 'other', 'Elsewhere', 'Not this shop''s', 100) returning id`;
  theirPartId = t!.id;
});
afterAll(async () => {
  await sql.end();
});

describe("a parts-only quote through the API", () => {
  it("no build: the lines given, one labour line at the shop's rate, totals after discounts", async () => {
    const r = await request(owner, "POST", "/api/v1/quotes", {
      customerId,
      lines: [pumpLine(1000)],
      labourHours: 1.5,
    });
    expect(r.status).toBe(201);
    // By hand: pump 180.00 less 10 % = 162.00; labour 1.5 h × 95.00 = 142.50; subtotal
    // (after discounts) 304.50; tax 10 % = 30.45; total 334.95.
    expect(r.json.quote).toMatchObject({
      buildId: null,
      customerId,
      status: "draft",
      subtotalMinor: 30450,
      discountMinor: 1800,
      taxMinor: 3045,
      totalMinor: 33495,
    });
    const lines =
      await sql`select kind, part_id, quantity_milli, unit_price_minor, discount_bp from quote_lines where quote_id = ${r.json.quote.id} order by position`;
    expect(lines.map((l) => ({ ...l }))).toEqual([
      {
        kind: "part",
        part_id: pumpId,
        quantity_milli: 1000,
        unit_price_minor: 18000,
        discount_bp: 1000,
      },
      {
        kind: "labour",
        part_id: null,
        quantity_milli: 1500,
        unit_price_minor: 9500,
        discount_bp: 0,
      },
    ]);
  });

  it("labour is added once: lines that carry labour get no second labour line", async () => {
    const r = await request(owner, "POST", "/api/v1/quotes", {
      customerId,
      lines: [
        pumpLine(0),
        {
          kind: "labour",
          description: "Pump swap",
          quantityMilli: 2000,
          unitPriceMinor: 9500,
          discountBp: 0,
        },
      ],
      labourHours: 2,
    });
    expect(r.status).toBe(201);
    const [{ n }] =
      (await sql`select count(*)::int as n from quote_lines where quote_id = ${r.json.quote.id} and kind = 'labour'`) as unknown as [
        { n: number },
      ];
    expect(n).toBe(1);
  });

  it("refusals name the field and write nothing: lines with a build, another shop's part", async () => {
    const before = await fingerprint(["quotes", "quote_lines", "shop_counters"]);
    const both = await request(owner, "POST", "/api/v1/quotes", {
      buildId: "10000000-0000-4000-8000-000000000002",
      lines: [pumpLine(0)],
    });
    expect(both.status).toBe(422);
    expect(both.json.error.issues.map((i: { path: string }) => i.path)).toContain("lines");
    const theirs = await request(owner, "POST", "/api/v1/quotes", {
      customerId,
      lines: [{ ...pumpLine(0), partId: theirPartId }],
    });
    expect(theirs.status).toBe(422);
    expect(theirs.json.error.issues[0].path).toBe("lines.0.partId");
    expect(await fingerprint(["quotes", "quote_lines", "shop_counters"])).toBe(before);
  });
});

describe("the quotes list: search and status from the query string", () => {
  it("finds quotes by number, customer name and build vehicle; filters by status as of today", async () => {
    const build = await request(owner, "POST", "/api/v1/builds", {
      customerId: otherCustomerId,
      title: `Pump swap ${tag}`,
      vehicle: `Halvorsen K7 coupe ${tag}`,
    });
    expect(build.status).toBe(201);
    const fromBuild = await request(owner, "POST", "/api/v1/quotes", {
      buildId: build.json.build.id,
      labourHours: 0,
    });
    expect(fromBuild.status).toBe(201);
    const parts = await request(owner, "POST", "/api/v1/quotes", {
      customerId,
      lines: [pumpLine(0)],
    });
    const q1 = fromBuild.json.quote as { id: string; number: number };
    const q2 = parts.json.quote as { id: string; number: number };
    const ids = async (query: string) =>
      (
        (await request(owner, "GET", `/api/v1/quotes?${query}`)).json.quotes as { id: string }[]
      ).map((q) => q.id);

    expect(await ids(`q=${encodeURIComponent(`halvorsen k7 coupe ${tag}`)}`)).toEqual([q1.id]);
    expect(await ids(`q=${encodeURIComponent(`Lindqvist ${tag}`)}`)).toEqual([q1.id]);
    expect(await ids(`q=Q-${String(q2.number).padStart(4, "0")}`)).toEqual([q2.id]);
    const okafor = await ids(`q=${encodeURIComponent(`okafor ${tag}`)}`);
    expect(okafor).toContain(q2.id);
    expect(okafor).not.toContain(q1.id);

    // A sent quote past its day is expired as of today, before any sweep writes it.
    await sql`update quotes set status = 'sent', valid_until = '2020-01-31' where id = ${q1.id}`;
    expect(await ids("status=expired")).toContain(q1.id);
    expect(await ids("status=sent")).not.toContain(q1.id);
    expect(await ids("status=draft")).toContain(q2.id);
    expect(await ids("status=draft")).not.toContain(q1.id);
    const listed = (await request(owner, "GET", `/api/v1/quotes?status=expired`)).json.quotes;
    expect(listed.find((q: { id: string }) => q.id === q1.id).status).toBe("expired");

    // Sorted by total, highest first.
    const totals = (
      (await request(owner, "GET", "/api/v1/quotes?sort=total")).json.quotes as {
        totalMinor: number;
      }[]
    ).map((q) => q.totalMinor);
    expect(totals).toEqual([...totals].sort((a, b) => b - a));

    // Bad filters are a 422 naming the parameter.
    const bad = await request(owner, "GET", "/api/v1/quotes?status=lost&sort=cheapest");
    expect(bad.status).toBe(422);
    expect(bad.json.error.issues.map((i: { path: string }) => i.path).sort()).toEqual([
      "sort",
      "status",
    ]);
  });
});

describe("sending a quote attaches its PDF and, for a build, the spec sheet", () => {
  it("the e-mail carries the quote PDF (and the spec sheet of a build's quote), both PDFs that open", async () => {
    const build = await request(owner, "POST", "/api/v1/builds", {
      customerId,
      title: `Attachment build ${tag}`,
    });
    expect(build.status).toBe(201);
    const q = (
      await request(owner, "POST", "/api/v1/quotes", {
        buildId: build.json.build.id,
        labourHours: 1,
      })
    ).json.quote as { id: string; number: number; version: number };
    // The build has no kit: give the quote a discounted part line beside its labour.
    const edited = await request(owner, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      lines: [
        pumpLine(1000),
        {
          kind: "labour",
          description: "Fuel system fitting and setup",
          quantityMilli: 1000,
          unitPriceMinor: 9500,
          discountBp: 0,
        },
      ],
    });
    expect(edited.status).toBe(200);
    const sent = await request(owner, "POST", `/api/v1/quotes/${q.id}/send`);
    expect(sent.status).toBe(200);
    const label = `Q-${String(q.number).padStart(4, "0")}`;
    const mail = await waitForMail(sent.json.to, new RegExp(label));
    expect(mail.attachments.map((a) => a.contentType)).toEqual([
      "application/pdf",
      "application/pdf",
    ]);
    expect(mail.text).toContain(`Attached: quote-${label}.pdf, Attachment-build-${tag}-v1.pdf.`);

    const quotePdf = inspectPdf(attachment(mail, /^quote-/));
    expect(quotePdf.title).toBe(`Quote ${label}`);
    const spec = inspectPdf(attachment(mail, /^Attachment-build-/));
    expect(spec.pages).toBeGreaterThan(0);
    expect(spec.text).toContain(`Attachment build ${tag}`);

    // The attached PDF is the one the customer downloads once sent (status Sent).
    const flat = quotePdf.text.replace(/\s+/g, " ");
    expect(flat).toContain("Sent");
    // By hand: 180.00 less 10 % (18.00) = 162.00; 1 h × 95.00; subtotal 257.00; tax 25.70;
    // total 282.70. The PDF prints "−" as "-" (its font's latin subset).
    for (const s of [
      "10 % (-$18.00)",
      "$162.00",
      "Subtotal $257.00",
      "Includes discounts of $18.00",
      "Tax (10 %) $25.70",
      "Total $282.70",
    ])
      expect(flat).toContain(s);
    expect(mail.text).toContain("$180.00 each, discount 10 % (−$18.00): $162.00");
    expect(mail.text).toContain("Subtotal $257.00 (includes discounts of $18.00)");
    expect(mail.text).toContain("Tax (10 %) $25.70");
    expect(mail.text).toContain("Total $282.70");

    // The download now matches the attachment's words.
    const download = await getBytes(owner, `/api/v1/quotes/${q.id}/pdf`);
    expect(inspectPdf(download.bytes).text.replace(/\s+/g, " ")).toContain("Total $282.70");
  });

  it("a parts-only quote's e-mail carries the quote PDF alone", async () => {
    const q = (await request(owner, "POST", "/api/v1/quotes", { customerId, lines: [pumpLine(0)] }))
      .json.quote as { id: string; number: number };
    const sent = await request(owner, "POST", `/api/v1/quotes/${q.id}/send`);
    expect(sent.status).toBe(200);
    const label = `Q-${String(q.number).padStart(4, "0")}`;
    const mail = await waitForMail(sent.json.to, new RegExp(`${label} `));
    expect(mail.attachments.map((a) => a.filename)).toEqual([`quote-${label}.pdf`]);
    expect(inspectPdf(attachment(mail, /^quote-/)).pages).toBe(1);
  });
});
