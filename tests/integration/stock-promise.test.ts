import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";

import { calendarDay, formatCalendarDate } from "@/lib/format/dates";
import { sweepExpiredQuotes } from "@/lib/quotes/quote-commands";

import { sql } from "../helpers/db";
import { getBytes, request, signIn, type Client } from "../helpers/http";
import { inspectPdf } from "../helpers/pdf";

/**
 * Stock promised once (issue 19): accepting holds only free stock, per line; what cannot be held
 * is back-ordered with its expected day, shown to the counter and to the customer before they
 * accept; declines, expiry and revisions release exactly what was held; concurrent accepts never
 * hold the same unit. And the kit: its ranking does not move after "Use these parts", nor when the
 * build's quote holds the parts.
 */

// Pages and the kit size every catalog part: generous under a dev server compiling on first use.
vi.setConfig({ testTimeout: 180_000 });

const SHOP = "demo-shop-ridgeback";
const CUSTOMER_ID = "00000000-0000-4000-8000-000000000001"; // has the demo portal sign-in (db/seed.ts)
const tag = `SP${Date.now().toString(36).toUpperCase()}`;
let counter: Client, tuner: Client, customer: Client;
let zone = "UTC";

beforeAll(async () => {
  [counter, tuner, customer] = await Promise.all([
    signIn("counter@demo.fuelwright.test"),
    signIn("tuner@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
  ]);
  const [s] = await sql`select time_zone from shop_settings where shop_id = ${SHOP}`;
  zone = (s?.time_zone as string) ?? "UTC";
});
afterAll(async () => {
  await sql.end();
});

let n = 0;
/** A pump of the demo shop with `stock` on the shelf and a lead time. */
async function pumpPart(stock: number, leadTimeDays: number | null = 10) {
  const sku = `${tag}-P${++n}`;
  const [p] =
    await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, stock, lead_time_days, specs)
    values (${SHOP}, ${sku}, 'pump', 'Testbrand', ${`Test pump ${n}`}, 19900, ${stock}, ${leadTimeDays},
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
    returning id, sku, name`;
  return p as { id: string; sku: string; name: string };
}

/** A sent quote for the portal customer with one line of `units` of the part. */
async function sentQuote(part: { id: string; sku: string; name: string }, units = 1) {
  const made = await request(counter, "POST", "/api/v1/quotes", { customerId: CUSTOMER_ID });
  expect(made.status).toBe(201);
  const q = made.json.quote as { id: string; version: number };
  const saved = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
    version: q.version,
    validUntil: "2099-12-31",
    lines: [
      {
        kind: "part",
        partId: part.id,
        sku: part.sku,
        description: `Testbrand ${part.name}`,
        quantityMilli: units * 1000,
        unitPriceMinor: 19900,
        discountBp: 0,
      },
      {
        kind: "labour",
        description: "Fitting",
        quantityMilli: 1000,
        unitPriceMinor: 12000,
        discountBp: 0,
      },
    ],
  });
  expect(saved.status).toBe(200);
  // Sent as the send command records it (the e-mail itself is tested in quote-commands).
  await sql`update quotes set status = 'sent' where id = ${q.id}`;
  return q.id;
}

const partRow = async (id: string) =>
  (await sql`select stock, reserved from parts where id = ${id}`)[0] as {
    stock: number;
    reserved: number;
  };
const heldOf = async (quoteId: string) =>
  (await sql`select held_qty from quote_lines where quote_id = ${quoteId} and kind = 'part'`).map(
    (r) => r.held_qty as number,
  );
const accept = (quoteId: string) =>
  request(customer, "POST", `/api/v1/quotes/${quoteId}/respond`, { decision: "accept" });
/** The page's text without tags (what a person reads). */
const pageText = async (c: Client, path: string) => {
  const r = await request(c, "GET", path);
  expect(r.status).toBe(200);
  const body = r.text.replace(/<script[\s\S]*?<\/script>/g, " ");
  return body
    .replace(/<[^>]+>/g, " ")
    .replace(/&amp;/g, "&")
    .replace(/&#x27;|&#39;/g, "'")
    .replace(/\s+/g, " ");
};
const expectedDay = (leadDays: number) =>
  formatCalendarDate(calendarDay(new Date(), zone, leadDays));

describe("two quotes, one free unit", () => {
  it("both are accepted; the second is back-ordered with its day, shown before accepting; reserved never exceeds stock", async () => {
    const part = await pumpPart(1, 10);
    const first = await sentQuote(part);
    const second = await sentQuote(part);

    // Before anyone accepts: the portal says what accepting holds, never a blanket promise.
    const before = await pageText(customer, `/my/quotes/${first}`);
    expect(before).toContain("Parts if you accept now");
    expect(before).toContain(`The shop will hold 1 × Testbrand ${part.name} for you.`);
    expect(before).not.toContain("will hold the parts for you");

    expect((await accept(first)).status).toBe(200);
    expect(await heldOf(first)).toEqual([1]);
    expect(await partRow(part.id)).toEqual({ stock: 1, reserved: 1 });

    // The second customer is told before accepting that the pump is back-ordered, and until when.
    const day = expectedDay(10);
    const portal = await pageText(customer, `/my/quotes/${second}`);
    expect(portal).toContain(`not in stock: back-ordered, expected by ${day}`);
    expect(portal).toContain(
      `Nothing on this quote is in stock now; back-ordered: 1 × Testbrand ${part.name} (expected by ${day}).`,
    );
    // The JSON API says the same, per line.
    const api = await request(counter, "GET", `/api/v1/quotes/${second}`);
    expect(api.json.stock).toMatchObject({
      holding: false,
      promises: [
        { wanted: 1, held: 0, backOrdered: 1, expectedOn: calendarDay(new Date(), zone, 10) },
        null,
      ],
    });
    // The counter sees the same on the quote page.
    const desk = await pageText(counter, `/quotes/${second}`);
    expect(desk).toContain("Parts if accepted now");
    expect(desk).toContain(`not in stock: back-ordered, expected by ${day}`);

    // Accepting it anyway: accepted, holds nothing, and the stock is not promised twice.
    expect((await accept(second)).status).toBe(200);
    expect(await heldOf(second)).toEqual([0]);
    expect(await partRow(part.id)).toEqual({ stock: 1, reserved: 1 });
    const held = await pageText(counter, `/quotes/${second}`);
    expect(held).toContain("Parts held");
    expect(held).toContain(`none held: back-ordered, expected by ${day}`);
    const firstPage = await pageText(customer, `/my/quotes/${first}`);
    expect(firstPage).toContain("Parts held");
  });

  it("a line wanting 2 with 1 free: '1 of 2 in stock; the other expected by <day>'; the restock day wins over the lead time", async () => {
    const part = await pumpPart(1, 30);
    await sql`update parts set restock_on = ${calendarDay(new Date(), zone, 5)} where id = ${part.id}`;
    const q = await sentQuote(part, 2);
    const text = await pageText(customer, `/my/quotes/${q}`);
    expect(text).toContain(`1 of 2 in stock; the other expected by ${expectedDay(5)}`);
    expect((await accept(q)).status).toBe(200);
    expect(await heldOf(q)).toEqual([1]);
    expect(await pageText(customer, `/my/quotes/${q}`)).toContain(
      `1 of 2 held; the other expected by ${expectedDay(5)}`,
    );
  });
});

describe("after the parts are fitted", () => {
  it("the quote's pages say what was fitted and its job and invoice, never a stock promise; the API answers no stock; the PDF promises none", async () => {
    const part = await pumpPart(1, 10);
    const quoteId = await sentQuote(part);
    expect((await accept(quoteId)).status).toBe(200);
    expect(await heldOf(quoteId)).toEqual([1]);
    // The deposit, paid through the fake checkout (its webhook confirms it).
    const start = await request(customer, "POST", `/api/v1/quotes/${quoteId}/deposit`);
    expect(start.status).toBe(200);
    const session = new URL(start.json.url).pathname.split("/").pop()!;
    const fake = process.env.PAYMENTS_FAKE_URL ?? "http://127.0.0.1:12121";
    expect(
      (await fetch(`${fake}/__fake/sessions/${session}/complete`, { method: "POST" })).status,
    ).toBe(200);
    const opened = await request(counter, "POST", "/api/v1/jobs", { quoteId });
    expect(opened.status, JSON.stringify(opened.json)).toBe(201);
    const job = opened.json.job as { id: string; number: number; version: number };
    // While the job holds the pump, the quote still says it is held.
    expect(await pageText(customer, `/my/quotes/${quoteId}`)).toContain("Parts held");

    const fit = await request(tuner, "POST", `/api/v1/jobs/${job.id}/fit`, {
      version: job.version,
      parts: [{ partId: part.id, quantity: 1 }],
      labourMilli: 1000,
    });
    expect(fit.status, JSON.stringify(fit.json)).toBe(200);
    expect(await partRow(part.id)).toEqual({ stock: 0, reserved: 0 });
    expect(await heldOf(quoteId)).toEqual([0]);

    const jobLabel = `J-${String(job.number).padStart(4, "0")}`;
    const fittedText = `Fitted: 1 × Testbrand ${part.name}.`;
    const noPromise = (text: string) => {
      for (const phrase of [
        "in stock",
        "back-ordered",
        "Parts held",
        "none held",
        "Parts if",
        "expected by",
      ])
        expect(text, phrase).not.toContain(phrase);
    };
    // The customer: what was fitted and their job, nothing about stock.
    const portal = await pageText(customer, `/my/quotes/${quoteId}`);
    noPromise(portal);
    expect(portal).toContain("Parts fitted");
    expect(portal).toContain(fittedText);
    expect(portal).toContain(`Job ${jobLabel}`);
    // The counter: the same.
    const desk = await pageText(counter, `/quotes/${quoteId}`);
    noPromise(desk);
    expect(desk).toContain(fittedText);
    // The API: no stock promise, what was fitted instead.
    const api = await request(customer, "GET", `/api/v1/quotes/${quoteId}`);
    expect(api.json.stock).toBeNull();
    expect(api.json.fitted).toMatchObject({
      jobNumber: job.number,
      summary: fittedText,
      invoice: null,
    });

    // Invoiced: the counter sees the draft; the customer only once it is issued.
    const inv = await request(counter, "POST", "/api/v1/invoices", { jobId: job.id });
    expect(inv.status, JSON.stringify(inv.json)).toBe(201);
    expect(await pageText(counter, `/quotes/${quoteId}`)).toMatch(/Draft invoice \( ?draft ?\)/);
    const beforeIssue = await pageText(customer, `/my/quotes/${quoteId}`);
    expect(beforeIssue).not.toContain("Draft invoice");
    expect(beforeIssue).not.toContain("INV-");
    expect(
      (await request(customer, "GET", `/api/v1/quotes/${quoteId}`)).json.fitted.invoice,
    ).toBeNull();
    const issued = await request(counter, "POST", `/api/v1/invoices/${inv.json.invoice.id}/issue`, {
      version: inv.json.invoice.version,
    });
    expect(issued.status, JSON.stringify(issued.json)).toBe(200);
    const invLabel = `INV-${String(issued.json.invoice.number).padStart(4, "0")}`;
    const after = await pageText(customer, `/my/quotes/${quoteId}`);
    noPromise(after);
    expect(after).toMatch(new RegExp(`Invoice ${invLabel} \\( ?issued ?\\)`));

    // The quote's PDF (as the customer downloads it) makes no stock promise either.
    const pdf = await getBytes(customer, `/api/v1/quotes/${quoteId}/pdf`);
    expect(pdf.status).toBe(200);
    const text = inspectPdf(pdf.bytes).text.replace(/\s+/g, " ");
    expect(text).toContain(`Testbrand ${part.name}`);
    noPromise(text);
  }, 600_000); // a dev server compiles the job, invoice and PDF routes on first use
});

describe("releasing exactly what was held", () => {
  it("declining an accepted quote gives back its held units and no more", async () => {
    const part = await pumpPart(2);
    const a = await sentQuote(part, 1);
    const b = await sentQuote(part, 3); // wants 3, 1 left after a
    expect((await accept(a)).status).toBe(200);
    expect((await accept(b)).status).toBe(200);
    expect([await heldOf(a), await heldOf(b)]).toEqual([[1], [1]]);
    expect(await partRow(part.id)).toEqual({ stock: 2, reserved: 2 });
    // Declining b releases its 1 (not the 3 it wanted: the old code would have gone to 0 via greatest()).
    const declined = await request(counter, "POST", `/api/v1/quotes/${b}/status`, {
      status: "declined",
    });
    expect(declined.status).toBe(200);
    expect(await heldOf(b)).toEqual([0]);
    expect(await partRow(part.id)).toEqual({ stock: 2, reserved: 1 });
    // Declining it again is no move: nothing released twice.
    await request(counter, "POST", `/api/v1/quotes/${b}/status`, { status: "declined" });
    expect(await partRow(part.id)).toEqual({ stock: 2, reserved: 1 });
  });

  it("expiry releases what the quote held; a revision of an accepted quote too, and the new revision holds nothing", async () => {
    const part = await pumpPart(3);
    const old = await sentQuote(part, 2);
    const other = await sentQuote(part, 1);
    expect((await accept(old)).status).toBe(200);
    expect((await accept(other)).status).toBe(200);
    expect(await partRow(part.id)).toEqual({ stock: 3, reserved: 3 });

    const past = calendarDay(new Date(), "UTC", -3);
    await sql`update quotes set valid_until = ${past} where id = ${old}`;
    const swept = await sweepExpiredQuotes();
    expect(swept.expired).toContain(old);
    expect(await heldOf(old)).toEqual([0]);
    expect(await partRow(part.id)).toEqual({ stock: 3, reserved: 1 });

    const revised = await request(counter, "POST", `/api/v1/quotes/${other}/revise`);
    expect(revised.status).toBe(201);
    const rev = (revised.json.quote ?? revised.json).id as string;
    expect(await heldOf(other)).toEqual([0]);
    expect(await heldOf(rev)).toEqual([0]);
    expect(await partRow(part.id)).toEqual({ stock: 3, reserved: 0 });
  });
});

describe("concurrent accepts never hold the same unit", () => {
  it("five rounds of two customers accepting at once for the last unit: one holds it, one is back-ordered", async () => {
    for (let round = 0; round < 5; round++) {
      const part = await pumpPart(1);
      const [a, b] = [await sentQuote(part), await sentQuote(part)];
      const answers = await Promise.all([
        accept(a),
        request(counter, "POST", `/api/v1/quotes/${b}/status`, { status: "accepted" }),
      ]);
      expect(answers.map((r) => r.status)).toEqual([200, 200]);
      const held = [...(await heldOf(a)), ...(await heldOf(b))].sort();
      expect(held).toEqual([0, 1]);
      expect(await partRow(part.id)).toEqual({ stock: 1, reserved: 1 });
    }
  });

  it("four quotes of 2 against 5 on the shelf, all at once: 5 held in all, never more", async () => {
    const part = await pumpPart(5);
    const ids = [];
    for (let i = 0; i < 4; i++) ids.push(await sentQuote(part, 2));
    const answers = await Promise.all(ids.map((id) => accept(id)));
    expect(answers.map((r) => r.status)).toEqual([200, 200, 200, 200]);
    const held = (await Promise.all(ids.map(heldOf))).flat();
    expect(held.reduce((s, h) => s + h, 0)).toBe(5);
    expect(held.sort()).toEqual([0, 1, 2, 2]);
    expect(await partRow(part.id)).toEqual({ stock: 5, reserved: 5 });
  });
});

describe("the kit's ranking does not move after 'Use these parts'", () => {
  type Cand = {
    part: { id: string; sku: string };
    quantity: number;
    fits: boolean;
    stock: { free: number; needed: number; expectedOn: string | null };
  };
  type Kit = {
    buildVersion: number;
    roles: { role: string; needed: boolean; candidates: Cand[] }[];
  };
  const ranking = (k: Kit) =>
    k.roles.map((r) => ({
      role: r.role,
      order: r.candidates.map((c) => `${c.part.sku}×${c.quantity}:${c.fits ? "fits" : "no"}`),
    }));

  it("the counter's choice goes on the quote only: the tuner's sizing stays, the parts are kept", async () => {
    const [demo] =
      await sql`select inputs from builds where id = '10000000-0000-4000-8000-000000000002'`;
    const made = await request(tuner, "POST", "/api/v1/builds", {
      customerId: CUSTOMER_ID,
      title: `${tag} counter kit`,
      inputs: demo!.inputs,
    });
    const id = made.json.build.id as string;
    const kit = (await request(counter, "GET", `/api/v1/builds/${id}/kit`)).json as Kit;
    // The counter picks the smallest injector there is, fitting or not.
    const injectors = kit.roles.find((r) => r.role === "injector")!.candidates;
    const smallest = injectors[injectors.length - 1]!;
    const chose = await request(counter, "POST", `/api/v1/builds/${id}/kit`, {
      version: kit.buildVersion,
      parts: [{ role: "injector", partId: smallest.part.id, quantity: smallest.quantity }],
    });
    expect(chose.status).toBe(200);
    const [row] = await sql`select inputs, parts from builds where id = ${id}`;
    expect(row!.inputs).toEqual(made.json.build.inputs);
    expect(row!.parts).toEqual([expect.objectContaining({ partId: smallest.part.id })]);
  });

  it("the same order before and after choosing the best fits, and after the build's quote holds them", async () => {
    const [demo] =
      await sql`select inputs from builds where id = '10000000-0000-4000-8000-000000000002'`;
    const made = await request(tuner, "POST", "/api/v1/builds", {
      customerId: CUSTOMER_ID,
      title: `${tag} kit`,
      inputs: demo!.inputs,
    });
    expect(made.status).toBe(201);
    const id = made.json.build.id as string;
    const kitOf = async () => {
      const r = await request(counter, "GET", `/api/v1/builds/${id}/kit`);
      expect(r.status).toBe(200);
      return r.json as Kit;
    };
    const first = await kitOf();
    const picks = first.roles.flatMap((r) => {
      const best = r.candidates.find((c) => c.fits);
      return r.needed && best
        ? [{ role: r.role, partId: best.part.id, quantity: best.quantity }]
        : [];
    });
    expect(picks.map((p) => p.role)).toEqual(expect.arrayContaining(["injector", "pump"]));
    const chose = await request(tuner, "POST", `/api/v1/builds/${id}/kit`, {
      version: first.buildVersion,
      parts: picks,
    });
    expect(chose.status).toBe(200);
    // The chosen parts are written into the inputs (the build changed) …
    expect(chose.json.build.inputs).not.toEqual(demo!.inputs);
    expect(chose.json.build).not.toHaveProperty("kitBasis");
    // … and the ranking is the one the choice was made from.
    const after = await kitOf();
    expect(after.buildVersion).toBe(first.buildVersion + 1);
    expect(ranking(after)).toEqual(ranking(first));

    // Choosing again from the new ranking keeps it too (the basis is the first one).
    const again = await request(tuner, "POST", `/api/v1/builds/${id}/kit`, {
      version: after.buildVersion,
      parts: picks.filter((p) => p.role !== "filter"),
    });
    expect(again.status).toBe(200);
    expect(ranking(await kitOf())).toEqual(ranking(first));

    // A quote of the chosen parts, accepted: its holds do not make the build's own parts rank lower.
    const quote = await request(counter, "POST", "/api/v1/quotes", { buildId: id });
    expect(quote.status).toBe(201);
    const qid = quote.json.quote.id as string;
    await sql`update quotes set status = 'sent', valid_until = '2099-12-31' where id = ${qid}`;
    expect((await accept(qid)).status).toBe(200);
    expect((await heldOf(qid)).some((h) => h > 0)).toBe(true);
    const held = await kitOf();
    expect(ranking(held)).toEqual(ranking(first));
    const free = (k: Kit) => k.roles.map((r) => r.candidates.map((c) => c.stock.free));
    expect(free(held)).toEqual(free(first));

    // A save that leaves the inputs as they are keeps the basis; one that changes them clears it
    // (the kit then ranks what the tuner saved).
    const basis = async () =>
      (await sql`select kit_basis from builds where id = ${id}`)[0]!.kit_basis;
    expect(await basis()).not.toBeNull();
    const cur = (await request(tuner, "GET", `/api/v1/builds/${id}`)).json.build;
    const same = await request(tuner, "PATCH", `/api/v1/builds/${id}`, {
      version: cur.version,
      title: `${tag} kit renamed`,
      inputs: cur.inputs,
    });
    expect(same.status).toBe(200);
    expect(await basis()).not.toBeNull();
    const edited = await request(tuner, "PATCH", `/api/v1/builds/${id}`, {
      version: same.json.build.version,
      inputs: {
        ...cur.inputs,
        engine: { ...cur.inputs.engine, idleRpm: cur.inputs.engine.idleRpm + 50 },
      },
    });
    expect(edited.status).toBe(200);
    expect(await basis()).toBeNull();
  });
});
