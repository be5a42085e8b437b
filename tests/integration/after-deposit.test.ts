import Stripe from "stripe";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";

import { fingerprint, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";
import { waitForMail, type Mail } from "../helpers/mail";

/**
 * After the deposit (issue 20): a purchase order received in part and in full puts stock in and
 * gives it to back-orders in the order their quotes were accepted; jobs get their parts and are
 * ready to fit; fitting issues stock; the invoice deducts the deposit, is frozen once issued and
 * corrected by a credit note; its balance is paid through the payment provider, confirmed by a
 * verified webhook, and a replayed or forged event changes nothing; every e-mail of a job goes
 * out once.
 *
 * Prices and quantities are invented; the sums are worked by hand (common practice, no source).
 */

// Generous: a dev server compiles routes on first use, on a shared machine.
vi.setConfig({ testTimeout: 600_000 });

const SHOP = "demo-shop-ridgeback";
const CUSTOMER_ID = "00000000-0000-4000-8000-000000000001"; // has the demo portal sign-in
const CUSTOMER_EMAIL = "customer@demo.fuelwright.test";
const FAKE = process.env.PAYMENTS_FAKE_URL ?? "http://127.0.0.1:12121";
const INBOX = process.env.MAIL_INBOX_URL ?? "http://127.0.0.1:2536/messages";
const SECRET = process.env.STRIPE_WEBHOOK_SECRET!;
const tag = `AD${Date.now().toString(36).toUpperCase()}`;
let counter: Client, customer: Client, tuner: Client;

beforeAll(async () => {
  [counter, customer, tuner] = await Promise.all([
    signIn("counter@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn("tuner@demo.fuelwright.test"),
  ]);
});
afterAll(async () => {
  await sql.end();
});

let n = 0;
async function part(stock: number, priceMinor = 19900) {
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

/** A quote for the portal customer: `units` of the part and 2 h of labour at 120.00, sent and accepted. */
async function acceptedQuote(p: { id: string; sku: string; name: string }, units: number) {
  const made = await request(counter, "POST", "/api/v1/quotes", { customerId: CUSTOMER_ID });
  const q = made.json.quote as { id: string; version: number };
  const saved = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
    version: q.version,
    validUntil: "2099-12-31",
    lines: [
      {
        kind: "part",
        partId: p.id,
        sku: p.sku,
        description: `Testbrand ${p.name}`,
        quantityMilli: units * 1000,
        unitPriceMinor: 19900,
        discountBp: 0,
      },
      {
        kind: "labour",
        description: "Fitting",
        quantityMilli: 2000,
        unitPriceMinor: 12000,
        discountBp: 0,
      },
    ],
  });
  expect(saved.status).toBe(200);
  await sql`update quotes set status = 'sent' where id = ${q.id}`;
  const r = await request(customer, "POST", `/api/v1/quotes/${q.id}/respond`, {
    decision: "accept",
  });
  expect(r.status).toBe(200);
  return q.id;
}

const fakePost = async (path: string, body?: unknown) => {
  const r = await fetch(`${FAKE}${path}`, {
    method: "POST",
    ...(body === undefined
      ? {}
      : { body: JSON.stringify(body), headers: { "content-type": "application/json" } }),
  });
  expect(r.status, path).toBe(200);
  return r.json();
};

/** The customer pays the deposit through the fake checkout (its webhook confirms it). */
async function payDeposit(quoteId: string) {
  const start = await request(customer, "POST", `/api/v1/quotes/${quoteId}/deposit`);
  expect(start.status).toBe(200);
  const sessionId = new URL(start.json.url).pathname.split("/").pop()!;
  await fakePost(`/__fake/sessions/${sessionId}/complete`);
  const [q] = await sql`select status from quotes where id = ${quoteId}`;
  expect(q!.status).toBe("deposit_paid");
  return start.json.amountMinor as number;
}

async function openJob(quoteId: string) {
  const r = await request(counter, "POST", "/api/v1/jobs", { quoteId });
  expect(r.status, JSON.stringify(r.json)).toBe(201);
  return r.json.job as { id: string; number: number; status: string; version: number };
}

async function supplierWith(partId: string) {
  const r = await request(counter, "POST", "/api/v1/suppliers", {
    name: `Test Supply ${tag}-${++n}`,
    email: `orders-${tag.toLowerCase()}-${n}@supplier.fuelwright.test`,
    leadTimeDays: 5,
    parts: [{ partId, supplierSku: `SUP-${n}`, costMinor: 8500 }],
  });
  expect(r.status, JSON.stringify(r.json)).toBe(201);
  return r.json.supplier as { id: string };
}

async function orderOf(partId: string, quantity: number) {
  const s = await supplierWith(partId);
  const r = await request(counter, "POST", "/api/v1/purchase-orders", {
    supplierId: s.id,
    lines: [{ partId, quantity }],
  });
  expect(r.status, JSON.stringify(r.json)).toBe(201);
  return r.json.purchaseOrder as {
    po: { id: string; number: number; status: string };
    lines: { id: string; quantity: number }[];
  };
}

const held = async (quoteId: string) =>
  (await sql`select held_qty from quote_lines where quote_id = ${quoteId} and kind = 'part'`).map(
    (r) => r.held_qty as number,
  );

async function inbox(): Promise<Mail[]> {
  return (await (await fetch(INBOX)).json()) as Mail[];
}

describe("purchase orders and back-orders", () => {
  it("a partial receipt puts stock in, fills the earlier acceptance first, and the rest arrives later", async () => {
    const p = await part(0);
    const first = await acceptedQuote(p, 1);
    const second = await acceptedQuote(p, 2);
    expect([await held(first), await held(second)]).toEqual([[0], [0]]);
    await payDeposit(first);
    await payDeposit(second);
    const [j1, j2] = [await openJob(first), await openJob(second)];
    expect([j1.status, j2.status]).toEqual(["waiting_parts", "waiting_parts"]);

    // The reorder list asks for the three back-ordered units.
    const list = await request(counter, "GET", "/api/v1/reorder-list");
    expect(list.status).toBe(200);
    expect(list.json.parts.find((r: { partId: string }) => r.partId === p.id)).toMatchObject({
      backOrdered: 3,
      onOrder: 0,
      suggested: 3,
    });

    const po = await orderOf(p.id, 3);
    expect(po.po.status).toBe("draft");
    const line = po.lines[0]!;
    // More than was ordered is refused, naming the line's field; nothing moves.
    const before = await fingerprint(["parts", "quote_lines", "purchase_order_lines", "jobs"]);
    const over = await request(counter, "POST", `/api/v1/purchase-orders/${po.po.id}/receive`, {
      lines: [{ lineId: line.id, quantity: 4 }],
    });
    expect(over.status).toBe(422);
    expect(over.json.error.issues[0].path).toBe("lines.0.quantity");
    expect(await fingerprint(["parts", "quote_lines", "purchase_order_lines", "jobs"])).toBe(
      before,
    );

    // Two of three arrive: the first quote (accepted first) gets its one, the second one of two.
    const part1 = await request(counter, "POST", `/api/v1/purchase-orders/${po.po.id}/receive`, {
      lines: [{ lineId: line.id, quantity: 2 }],
    });
    expect(part1.status, JSON.stringify(part1.json)).toBe(200);
    expect(part1.json.purchaseOrder.po.status).toBe("partly_received");
    expect(
      part1.json.released.map((r: { quoteId: string; quantity: number }) => [
        r.quoteId,
        r.quantity,
      ]),
    ).toEqual([
      [first, 1],
      [second, 1],
    ]);
    expect(await stockOf(p.id)).toEqual({ stock: 2, reserved: 2 });
    expect([await held(first), await held(second)]).toEqual([[1], [1]]);
    const jobs1 = await request(counter, "GET", `/api/v1/jobs/${j1.id}`);
    const jobs2 = await request(counter, "GET", `/api/v1/jobs/${j2.id}`);
    expect(jobs1.json.job.status).toBe("ready");
    expect(jobs2.json.job).toMatchObject({ status: "waiting_parts" });
    expect(jobs2.json.job.lines[0]).toMatchObject({ quantity: 2, allocatedQty: 1 });
    // The reorder list now counts the one still on order.
    const list2 = await request(counter, "GET", "/api/v1/reorder-list");
    expect(list2.json.parts.find((r: { partId: string }) => r.partId === p.id)).toMatchObject({
      backOrdered: 1,
      onOrder: 1,
      suggested: 0,
    });

    // The last one arrives: the order is received and the second job ready.
    const rest = await request(counter, "POST", `/api/v1/purchase-orders/${po.po.id}/receive`, {
      lines: [{ lineId: line.id, quantity: 1 }],
    });
    expect(rest.json.purchaseOrder.po.status).toBe("received");
    expect(await stockOf(p.id)).toEqual({ stock: 3, reserved: 3 });
    expect((await request(counter, "GET", `/api/v1/jobs/${j2.id}`)).json.job.status).toBe("ready");
    // Nothing more is received against a received order.
    expect(
      (
        await request(counter, "POST", `/api/v1/purchase-orders/${po.po.id}/receive`, {
          lines: [{ lineId: line.id, quantity: 1 }],
        })
      ).status,
    ).toBe(422);
  });

  it("two back-orders are filled in the order the quotes were accepted, not the order they were made", async () => {
    const p = await part(0);
    // Made first, accepted second.
    const madeFirst = await acceptedQuote(p, 1);
    const madeSecond = await acceptedQuote(p, 1);
    await sql`update quotes set accepted_at = now() - interval '1 hour' where id = ${madeSecond}`;
    const po = await orderOf(p.id, 1);
    const r = await request(counter, "POST", `/api/v1/purchase-orders/${po.po.id}/receive`, {
      lines: [{ lineId: po.lines[0]!.id, quantity: 1 }],
    });
    expect(r.status).toBe(200);
    expect(await held(madeSecond)).toEqual([1]);
    expect(await held(madeFirst)).toEqual([0]);
  });

  it("a purchase order is cancelled only while nothing is received; its back-orders are on the reorder list again", async () => {
    const p = await part(0);
    const q = await acceptedQuote(p, 2);
    const row = async () =>
      (await request(counter, "GET", "/api/v1/reorder-list")).json.parts.find(
        (r: { partId: string }) => r.partId === p.id,
      );
    expect(await row()).toMatchObject({ backOrdered: 2, onOrder: 0, suggested: 2 });
    const po = await orderOf(p.id, 2);
    expect(await row()).toMatchObject({ backOrdered: 2, onOrder: 2, suggested: 0 });
    const [{ version }] =
      (await sql`select version from purchase_orders where id = ${po.po.id}`) as unknown as [
        { version: number },
      ];

    // Not by the tuner, not with a stale version: nothing changes.
    const tables = ["purchase_orders", "purchase_order_lines", "parts", "quote_lines"];
    const before = await fingerprint(tables);
    expect(
      (await request(tuner, "POST", `/api/v1/purchase-orders/${po.po.id}/cancel`, { version }))
        .status,
    ).toBe(403);
    const stale = await request(counter, "POST", `/api/v1/purchase-orders/${po.po.id}/cancel`, {
      version: version + 5,
    });
    expect(stale.status).toBe(409);
    expect(stale.json.current).toMatchObject({ id: po.po.id, status: "draft" });
    const noVersion = await request(
      counter,
      "POST",
      `/api/v1/purchase-orders/${po.po.id}/cancel`,
      {},
    );
    expect(noVersion.status).toBe(422);
    expect(noVersion.json.error.issues[0].path).toBe("version");
    expect(await fingerprint(tables)).toBe(before);

    // Cancelled: nothing counts as on order, so the back-order is to order again.
    const done = await request(counter, "POST", `/api/v1/purchase-orders/${po.po.id}/cancel`, {
      version,
    });
    expect(done.status, JSON.stringify(done.json)).toBe(200);
    expect(done.json.purchaseOrder.po).toMatchObject({ status: "cancelled", version: version + 1 });
    expect(await row()).toMatchObject({ backOrdered: 2, onOrder: 0, suggested: 2 });
    expect(await stockOf(p.id)).toEqual({ stock: 0, reserved: 0 });
    expect(await held(q)).toEqual([0]);
    // A cancelled order receives nothing and is not cancelled twice.
    const late = await request(counter, "POST", `/api/v1/purchase-orders/${po.po.id}/receive`, {
      lines: [{ lineId: po.lines[0]!.id, quantity: 1 }],
    });
    expect(late.status).toBe(422);
    const twice = await request(counter, "POST", `/api/v1/purchase-orders/${po.po.id}/cancel`, {
      version: version + 1,
    });
    expect(twice.status).toBe(422);
    expect(twice.json.error.code).toBe("not_cancellable");
    expect(await stockOf(p.id)).toEqual({ stock: 0, reserved: 0 });

    // An order with one unit received stays: 422, nothing written.
    const again = await orderOf(p.id, 2);
    const got = await request(counter, "POST", `/api/v1/purchase-orders/${again.po.id}/receive`, {
      lines: [{ lineId: again.lines[0]!.id, quantity: 1 }],
    });
    expect(got.status).toBe(200);
    const [{ version: v2 }] =
      (await sql`select version from purchase_orders where id = ${again.po.id}`) as unknown as [
        { version: number },
      ];
    const before2 = await fingerprint(tables);
    const refused = await request(
      counter,
      "POST",
      `/api/v1/purchase-orders/${again.po.id}/cancel`,
      {
        version: v2,
      },
    );
    expect(refused.status).toBe(422);
    expect(refused.json.error).toMatchObject({ code: "not_cancellable" });
    expect(refused.json.error.message).toContain("received");
    expect(await fingerprint(tables)).toBe(before2);
  });

  it("suppliers and purchase orders are staff only; the tuner reads but does not write them", async () => {
    expect((await request(customer, "GET", "/api/v1/suppliers")).status).toBe(403);
    expect((await request(customer, "GET", "/api/v1/purchase-orders")).status).toBe(403);
    expect((await request(tuner, "GET", "/api/v1/purchase-orders")).status).toBe(200);
    expect(
      (await request(tuner, "POST", "/api/v1/suppliers", { name: `Nope ${tag}` })).status,
    ).toBe(403);
  });
});

/** A provider event as the SDK would receive it, signed. */
function signedEvent(type: string, session: Record<string, unknown>, secret = SECRET) {
  const id = `evt_test_${Math.random().toString(36).slice(2)}`;
  const payload = JSON.stringify({
    id,
    object: "event",
    type,
    api_version: "2026-01-01",
    created: Math.floor(Date.now() / 1000),
    livemode: false,
    data: { object: { object: "checkout.session", ...session } },
  });
  return { id, payload, header: Stripe.webhooks.generateTestHeaderString({ payload, secret }) };
}
const deliver = (e: { payload: string; header: string }) =>
  request(null, "POST", "/api/webhooks/payments", e.payload, {
    "content-type": "application/json",
    "stripe-signature": e.header,
  });

describe("a whole job: fitted, invoiced, paid", () => {
  it("fits, invoices with the deposit deducted, refuses edits once issued, credits, and takes the balance once", async () => {
    const p = await part(1);
    const quoteId = await acceptedQuote(p, 1);
    expect(await held(quoteId)).toEqual([1]);
    const deposit = await payDeposit(quoteId);
    const job = await openJob(quoteId);
    // Everything was held at acceptance: ready to fit straight away.
    expect(job.status).toBe("ready");
    const label = `J-${String(job.number).padStart(4, "0")}`;

    // The tuner fits it with 1.5 h of labour; the customer may not.
    const fit = {
      version: job.version,
      parts: [{ partId: p.id, quantity: 1 }],
      labourMilli: 1500,
    };
    expect((await request(customer, "POST", `/api/v1/jobs/${job.id}/fit`, fit)).status).toBe(403);
    const fitted = await request(tuner, "POST", `/api/v1/jobs/${job.id}/fit`, fit);
    expect(fitted.status, JSON.stringify(fitted.json)).toBe(200);
    expect(fitted.json.job.status).toBe("fitted");
    expect(await stockOf(p.id)).toEqual({ stock: 0, reserved: 0 });
    expect(
      (await request(tuner, "POST", `/api/v1/jobs/${job.id}/fit`, { ...fit, version: 2 })).status,
    ).toBeGreaterThanOrEqual(409);

    // The invoice: 1 × 199.00 + 1.5 h × 120.00 = 379.00, tax at the quote's rate, less the deposit.
    const made = await request(counter, "POST", "/api/v1/invoices", { jobId: job.id });
    expect(made.status, JSON.stringify(made.json)).toBe(201);
    const inv = made.json.invoice;
    const [q] = await sql`select tax_rate_bp, total_minor from quotes where id = ${quoteId}`;
    const tax = Math.round((37900 * (q!.tax_rate_bp as number)) / 10000);
    expect(inv).toMatchObject({
      status: "draft",
      number: null,
      subtotalMinor: 37900,
      taxMinor: tax,
      totalMinor: 37900 + tax,
      depositMinor: deposit,
      balanceMinor: 37900 + tax - deposit,
    });
    expect(
      inv.lines.map((l: { kind: string; quantityMilli: number }) => [l.kind, l.quantityMilli]),
    ).toEqual([
      ["part", 1000],
      ["labour", 1500],
    ]);
    // A customer does not see a draft.
    expect((await request(customer, "GET", `/api/v1/invoices/${inv.id}`)).status).toBe(404);
    // The draft is edited; then issued (numbered) and frozen.
    const edited = await request(counter, "PATCH", `/api/v1/invoices/${inv.id}`, {
      version: inv.version,
      notes: "Thank you for your business",
    });
    expect(edited.status).toBe(200);
    const issued = await request(counter, "POST", `/api/v1/invoices/${inv.id}/issue`, {
      version: edited.json.invoice.version,
    });
    expect(issued.status, JSON.stringify(issued.json)).toBe(200);
    expect(issued.json.invoice.status).toBe("issued");
    expect(issued.json.invoice.number).toBeGreaterThan(0);
    const frozen = await fingerprint(["invoices", "invoice_lines"]);
    const edit = await request(counter, "PATCH", `/api/v1/invoices/${inv.id}`, {
      version: issued.json.invoice.version,
      notes: "Changed after issue",
      lines: [
        {
          kind: "fee",
          description: "Sneaky fee",
          quantityMilli: 1000,
          unitPriceMinor: 100,
          discountBp: 0,
        },
      ],
    });
    expect(edit.status).toBe(422);
    expect(edit.json.error.code).toBe("invoice_issued");
    expect(await fingerprint(["invoices", "invoice_lines"])).toBe(frozen);

    // A credit note of 10.00 corrects it: the invoice's own figures stay, the balance drops.
    const credit = await request(counter, "POST", `/api/v1/invoices/${inv.id}/credit-notes`, {
      reason: "Goodwill: fitting ran late",
      amountMinor: 1000,
    });
    expect(credit.status, JSON.stringify(credit.json)).toBe(201);
    const due = 37900 + tax - deposit - 1000;
    expect(credit.json.invoice).toMatchObject({
      totalMinor: 37900 + tax,
      creditedMinor: 1000,
      balanceMinor: due,
    });
    expect(credit.json.invoice.creditNotes[0].label).toMatch(/^CN-\d{4}$/);
    // More than is left to credit is refused.
    expect(
      (
        await request(counter, "POST", `/api/v1/invoices/${inv.id}/credit-notes`, {
          reason: "Too much",
          amountMinor: 37900 + tax,
        })
      ).status,
    ).toBe(409);

    // The balance, through the provider: a checkout for what the ledger says is owed.
    expect((await request(counter, "POST", `/api/v1/invoices/${inv.id}/payment`)).status).toBe(403);
    const start = await request(customer, "POST", `/api/v1/invoices/${inv.id}/payment`);
    expect(start.status, JSON.stringify(start.json)).toBe(200);
    expect(start.json.amountMinor).toBe(due);
    const sessionId = new URL(start.json.url).pathname.split("/").pop()!;

    // A forged event (another secret) is refused and changes nothing.
    const before = await fingerprint(["payments", "invoices"]);
    const forged = signedEvent(
      "checkout.session.completed",
      { id: sessionId, payment_status: "paid", status: "complete" },
      "whsec_someone_else",
    );
    expect((await deliver(forged)).status).toBe(400);
    // A rightly signed event claiming paid while the provider says unpaid changes nothing.
    const claim = await deliver(
      signedEvent("checkout.session.completed", { id: sessionId, payment_status: "paid" }),
    );
    expect(claim.json.outcome).toBe("unpaid");
    expect(await fingerprint(["payments", "invoices"])).toBe(before);

    // Paid at the provider, its webhook held back: the test delivers it, then replays it.
    await fakePost(`/__fake/sessions/${sessionId}/complete?deliver=0`);
    const event = signedEvent("checkout.session.completed", { id: sessionId });
    const first = await deliver(event);
    expect(first.json.outcome).toBe("paid");
    const afterPaid = await fingerprint(["payments", "invoices"]);
    const replay = await deliver(event);
    expect(replay.status).toBe(200);
    expect(replay.json.outcome).toBe("duplicate");
    const another = await deliver(signedEvent("checkout.session.completed", { id: sessionId }));
    expect(another.json.outcome).toBe("already");
    // The customer's return confirms without a second payment.
    const back = await request(
      customer,
      "GET",
      `/api/v1/invoices/${inv.id}/payment?session=${sessionId}`,
    );
    expect(back.status).toBe(303);
    expect(back.headers.get("location")).toContain(`/my/invoices/${inv.id}?payment=paid`);
    const paid = await request(customer, "GET", `/api/v1/invoices/${inv.id}`);
    expect(paid.json.invoice).toMatchObject({ status: "paid", balanceMinor: 0, paidMinor: due });
    expect(
      (
        await sql`select count(*)::int as n from payments where invoice_id = ${inv.id} and status = 'paid'`
      )[0]!.n,
    ).toBe(1);
    // The replay, the second event and the return changed nothing after the first.
    expect(await fingerprint(["payments", "invoices"])).toBe(afterPaid);

    // Every e-mail of the job, once: ready to fit, fitted, the invoice, the balance receipt.
    const invLabel = `INV-${String(issued.json.invoice.number).padStart(4, "0")}`;
    await waitForMail(CUSTOMER_EMAIL, new RegExp(`receipt .* invoice ${invLabel}`));
    const mails = (await inbox()).filter(
      (m) =>
        m.to.includes(CUSTOMER_EMAIL) &&
        (m.subject.includes(label) || m.subject.includes(invLabel)),
    );
    const subjects = mails.map((m) => m.subject).sort();
    expect(subjects).toHaveLength(4);
    expect(new Set(subjects).size).toBe(4);
    expect(subjects.some((s) => /ready to fit/.test(s))).toBe(true);
    expect(subjects.some((s) => /fitted/.test(s))).toBe(true);
    expect(subjects.some((s) => /invoice .* to pay/.test(s))).toBe(true);
    // And each is logged once on its record, sent.
    const log =
      await sql`select notice, status from mail_log where record_id in (${job.id}, ${inv.id}) and "to" = ${CUSTOMER_EMAIL} order by created_at`;
    expect(log.map((r) => `${r.notice}:${r.status}`)).toEqual([
      "ready_to_fit:sent",
      "fitted:sent",
      "invoice:sent",
      "balance_receipt:sent",
    ]);
    // The owner (opted in to the shop's notices from the start) hears of the balance once.
    const shop =
      await sql`select notice, status from mail_log where record_id = ${inv.id} and "to" = 'owner@demo.fuelwright.test'`;
    expect(shop.map((r) => `${r.notice}:${r.status}`)).toEqual(["staff_payment_received:sent"]);
  });
});

describe("the screens after the deposit", () => {
  it("the shop reads jobs, purchasing, a job, its invoice and a purchase order; the customer reads their own invoice with the pay button", async () => {
    const [job] =
      await sql`select j.id, i.id as invoice_id from jobs j join invoices i on i.job_id = j.id where j.shop_id = ${SHOP} and i.status <> 'draft' order by j.number limit 1`;
    const [po] = await sql`select id from purchase_orders where shop_id = ${SHOP} limit 1`;
    expect(job && po, "the tests above made a job, an invoice and an order").toBeTruthy();
    for (const [path, text] of [
      ["/jobs", "Jobs"],
      ["/purchasing", "To reorder"],
      [`/jobs/${job!.id}`, "E-mails about this job"],
      [`/invoices/${job!.invoice_id}`, "Balance due"],
      [`/purchasing/orders/${po!.id}`, "Received"],
    ] as const) {
      const r = await request(counter, "GET", path);
      expect(r.status, path).toBe(200);
      expect(r.text, path).toContain(text);
    }
    const mine = await request(customer, "GET", `/my/invoices/${job!.invoice_id}`);
    expect(mine.status).toBe(200);
    expect(mine.text).toContain("Invoice INV-");
    // Staff pages are not the customer's.
    const refused = await request(customer, "GET", "/purchasing");
    expect([303, 307, 308]).toContain(refused.status);
  });
});
