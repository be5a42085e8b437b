import Stripe from "stripe";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { BASE_URL, getBytes, request, signIn, type Client } from "../helpers/http";
import { waitForMail } from "../helpers/mail";
import { inspectPdf } from "../helpers/pdf";
import { solidPng } from "../helpers/png";

const FAKE = process.env.PAYMENTS_FAKE_URL ?? "http://127.0.0.1:12121";
// The app's webhook secret (random per checkout: scripts/test-env.vars).
const SECRET = process.env.STRIPE_WEBHOOK_SECRET!;
const CUSTOMER_ID = "00000000-0000-4000-8000-000000000001"; // has the demo portal sign-in (db/seed.ts)
const TABLES = ["payments", "payment_events", "quotes"];
let counter: Client, customer: Client, owner: Client, outsider: Client;
let other: Awaited<ReturnType<typeof makeOtherShop>>;

beforeAll(async () => {
  other = await makeOtherShop();
  [counter, customer, owner, outsider] = await Promise.all([
    signIn("counter@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn("owner@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
});
afterAll(async () => {
  await sql.end();
});

/** A quote with one labour line, sent and accepted by the demo customer. */
async function acceptedQuote(unitPriceMinor = 36805) {
  const q = (await request(counter, "POST", "/api/v1/quotes", { customerId: CUSTOMER_ID })).json
    .quote;
  await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
    version: q.version,
    validUntil: "2099-01-01",
    lines: [
      {
        kind: "labour",
        description: "Fuel system fitting",
        quantityMilli: 3000,
        unitPriceMinor,
        discountBp: 0,
      },
    ],
  });
  await sql`update quotes set status = 'sent' where id = ${q.id}`;
  expect(
    (await request(customer, "POST", `/api/v1/quotes/${q.id}/respond`, { decision: "accept" }))
      .status,
  ).toBe(200);
  return (await sql`select * from quotes where id = ${q.id}`)[0]!;
}

/** A provider event as the SDK would receive it, signed with the SDK's own test-header helper. */
function signedEvent(
  type: string,
  session: Record<string, unknown>,
  id = `evt_test_${Math.random().toString(36).slice(2)}`,
  secret = SECRET,
) {
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

/** An accepted quote with its deposit checkout opened by the customer (pending, not paid). */
async function openCheckout(unitPriceMinor?: number) {
  const q = await acceptedQuote(unitPriceMinor);
  const start = await request(customer, "POST", `/api/v1/quotes/${q.id}/deposit`);
  expect(start.status).toBe(200);
  const sessionId = new URL(start.json.url).pathname.split("/").pop()!;
  return { q, sessionId, amountMinor: start.json.amountMinor as number };
}

/** The quote still awaits its deposit: its payment pending, its status and version as they were. */
async function nothingPaid(q: Record<string, any>) {
  expect(
    (await sql`select status from payments where quote_id = ${q.id}`).map((r) => r.status),
  ).toEqual(["pending"]);
  expect((await sql`select status, version from quotes where id = ${q.id}`)[0]).toMatchObject({
    status: "accepted",
    version: q.version,
  });
}

const deliver = (e: { payload: string; header: string }) =>
  request(null, "POST", "/api/webhooks/payments", e.payload, {
    "content-type": "application/json",
    "stripe-signature": e.header,
  });

describe("deposit payments", () => {
  it("the customer opens a checkout for the shop's deposit share; the fake's completion webhook marks the quote paid", async () => {
    const q = await acceptedQuote();
    const start = await request(customer, "POST", `/api/v1/quotes/${q.id}/deposit`);
    expect(start.status).toBe(200);
    // Demo shop deposit 30 % (db/seed.ts) of the total, rounded half up (by hand, as a check of the rounding).
    expect(start.json.amountMinor).toBe(Math.round((q.total_minor * 30) / 100));
    const sessionId = new URL(start.json.url).pathname.split("/").pop()!;
    const [pending] = await sql`select * from payments where checkout_session_id = ${sessionId}`;
    expect(pending).toMatchObject({
      status: "pending",
      amount_minor: start.json.amountMinor,
      quote_id: q.id,
    });
    // A second click before paying reuses the open checkout.
    expect((await request(customer, "POST", `/api/v1/quotes/${q.id}/deposit`)).json.url).toBe(
      start.json.url,
    );
    const done = await (
      await fetch(`${FAKE}/__fake/sessions/${sessionId}/complete`, { method: "POST" })
    ).json();
    expect(done.status).toBe(200);
    const [paid] =
      await sql`select p.status, p.paid_event_id, q.status as quote_status from payments p join quotes q on q.id = p.quote_id where p.checkout_session_id = ${sessionId}`;
    expect(paid).toMatchObject({
      status: "paid",
      paid_event_id: done.event.id,
      quote_status: "deposit_paid",
    });
    // The customer's return from checkout confirms without a second payment.
    const back = await request(
      customer,
      "GET",
      `/api/v1/quotes/${q.id}/deposit?session=${sessionId}`,
    );
    expect(back.status).toBe(303);
    expect(back.headers.get("location")).toContain(`/my/quotes/${q.id}?payment=paid`);
    expect(
      (
        await sql`select count(*)::int as n from payments where quote_id = ${q.id} and status = 'paid'`
      )[0]!.n,
    ).toBe(1);
    expect((await request(customer, "POST", `/api/v1/quotes/${q.id}/deposit`)).status).toBe(409);
  });

  it("a webhook with a bad, missing or foreign signature is refused with 400 and records nothing", async () => {
    const q = await acceptedQuote();
    const start = await request(customer, "POST", `/api/v1/quotes/${q.id}/deposit`);
    const sessionId = new URL(start.json.url).pathname.split("/").pop()!;
    const before = await fingerprint(TABLES);
    const good = signedEvent("checkout.session.completed", {
      id: sessionId,
      payment_status: "paid",
      status: "complete",
    });
    const forged = signedEvent(
      "checkout.session.completed",
      { id: sessionId, payment_status: "paid", status: "complete" },
      undefined,
      "whsec_someone_else",
    );
    for (const bad of [
      forged,
      { payload: good.payload, header: "t=1,v1=00" },
      { payload: good.payload.replace('"paid"', '"unpaid"'), header: good.header },
    ]) {
      const r = await deliver(bad);
      expect(r.status).toBe(400);
      expect(r.json.error.code).toBe("bad_signature");
    }
    expect(
      (
        await request(null, "POST", "/api/webhooks/payments", good.payload, {
          "content-type": "application/json",
        })
      ).status,
    ).toBe(400);
    expect(await fingerprint(TABLES)).toBe(before);
  });

  it("the same event twice, or a second event for the same checkout, records one payment", async () => {
    const { q, sessionId } = await openCheckout(12345);
    // Paid at the provider; its own webhook held back, so the test sends the events.
    await fakePost(`/__fake/sessions/${sessionId}/complete?deliver=0`);
    const e = signedEvent("checkout.session.completed", { id: sessionId });
    const first = await deliver(e);
    expect(first.status).toBe(200);
    expect(first.json.outcome).toBe("paid");
    const again = await deliver(e);
    expect(again.status).toBe(200);
    expect(again.json.outcome).toBe("duplicate");
    const other = await deliver(signedEvent("checkout.session.completed", { id: sessionId }));
    expect(other.json.outcome).toBe("already");
    // A late "expired" for the paid checkout changes nothing (the provider says it is complete).
    const expired = await deliver(
      signedEvent("checkout.session.expired", { id: sessionId, status: "expired" }),
    );
    expect(expired.status).toBe(200);
    expect(expired.json.outcome).toBe("ignored");
    const rows = await sql`select status from payments where quote_id = ${q.id}`;
    expect(rows.map((r) => r.status)).toEqual(["paid"]);
    const [after] = await sql`select status, version from quotes where id = ${q.id}`;
    expect(after).toMatchObject({ status: "deposit_paid", version: q.version + 1 });
    expect(
      (
        await sql`select count(*)::int as n from payment_events where checkout_session_id = ${sessionId}`
      )[0]!.n,
    ).toBe(3);
  });

  it("only the quote's own customer pays, and only once it is accepted", async () => {
    const q = await acceptedQuote();
    const before = await fingerprint(TABLES);
    expect((await request(counter, "POST", `/api/v1/quotes/${q.id}/deposit`)).status).toBe(403);
    expect((await request(outsider, "POST", `/api/v1/quotes/${q.id}/deposit`)).status).toBe(403); // another shop's owner: not a customer
    expect((await request(null, "POST", `/api/v1/quotes/${q.id}/deposit`)).status).toBe(401);
    const [others] =
      await sql`select q.id from quotes q join customers c on c.id = q.customer_id where c.user_id is null and q.shop_id = 'demo-shop-ridgeback' limit 1`;
    expect((await request(customer, "POST", `/api/v1/quotes/${others!.id}/deposit`)).status).toBe(
      404,
    );
    expect(
      (await request(customer, "GET", `/api/v1/quotes/${q.id}/deposit?session=nonsense`)).status,
    ).toBe(422);
    expect(
      (await request(customer, "GET", `/api/v1/quotes/${q.id}/deposit?session=cs_test_not_ours`))
        .status,
    ).toBe(404);
    expect(await fingerprint(TABLES)).toBe(before);
    const draft = (await request(counter, "POST", "/api/v1/quotes", { customerId: CUSTOMER_ID }))
      .json.quote;
    await sql`update quotes set status = 'sent' where id = ${draft.id}`;
    expect((await request(customer, "POST", `/api/v1/quotes/${draft.id}/deposit`)).status).toBe(
      409,
    );
  });
});

describe("the payment webhook: nothing forged", () => {
  it("a completed checkout is read from the provider, never from the event: an event claiming paid for a checkout the provider reports unpaid marks nothing", async () => {
    const { q, sessionId } = await openCheckout();
    const r = await deliver(
      signedEvent("checkout.session.completed", {
        id: sessionId,
        payment_status: "paid",
        status: "complete",
        amount_total: 1,
      }),
    );
    expect(r.status).toBe(200);
    expect(r.json.outcome).toBe("unpaid");
    await nothingPaid(q);
    // The provider later reports it unpaid again after completion: still nothing.
    await fakePost(`/__fake/sessions/${sessionId}/tamper`, { payment_status: "unpaid" });
    const back = await request(
      customer,
      "GET",
      `/api/v1/quotes/${q.id}/deposit?session=${sessionId}`,
    );
    expect(back.headers.get("location")).toContain("payment=pending");
    await nothingPaid(q);
  });

  it("a validly signed event for a checkout the provider does not know marks nothing", async () => {
    const { q } = await openCheckout();
    const before = await fingerprint(["payments", "quotes"]);
    for (const id of [
      "cs_test_unknown_to_the_provider",
      "cs_test_../../v1/charges",
      "not-a-session",
    ]) {
      const r = await deliver(
        signedEvent("checkout.session.completed", {
          id,
          payment_status: "paid",
          status: "complete",
          metadata: { shop_id: "demo-shop-ridgeback", quote_id: q.id },
          client_reference_id: q.id,
        }),
      );
      expect(r.status, id).toBe(200);
      expect(r.json.outcome, id).toBe("unknown");
    }
    expect(await fingerprint(["payments", "quotes"])).toBe(before);
    await nothingPaid(q);
  });

  it("a checkout whose amount or currency is not the deposit the app asked is refused, by the webhook and on the customer's return", async () => {
    for (const tamper of [
      (amount: number) => ({ amount_total: amount - 1 }),
      (amount: number) => ({ amount_total: 1, payment_status: "paid" }),
      () => ({ currency: "eur" }),
      () => ({ currency: "" }),
    ]) {
      const { q, sessionId, amountMinor } = await openCheckout();
      await fakePost(`/__fake/sessions/${sessionId}/tamper`, tamper(amountMinor));
      // The provider's own completion, its webhook signed with the real secret.
      const done = await fakePost(`/__fake/sessions/${sessionId}/complete`);
      expect(done.status).toBe(200);
      const seen = await sql`select id from payment_events where id = ${done.event.id}`;
      expect(seen.length).toBe(1);
      const back = await request(
        customer,
        "GET",
        `/api/v1/quotes/${q.id}/deposit?session=${sessionId}`,
      );
      expect(back.headers.get("location")).toContain("payment=pending");
      await nothingPaid(q);
    }
  });

  it("a checkout that names another shop's quote, or another quote, pays for neither", async () => {
    const theirCustomer = await request(outsider, "POST", "/api/v1/customers", {
      name: "Their Customer",
      email: `their-${Date.now()}@customer.fuelwright.test`,
    });
    expect(theirCustomer.status).toBe(201);
    const theirs = (
      await request(outsider, "POST", "/api/v1/quotes", {
        customerId: theirCustomer.json.customer.id,
      })
    ).json.quote;
    await sql`update quotes set status = 'accepted' where id = ${theirs.id}`;
    const [theirsBefore] = await sql`select status, version from quotes where id = ${theirs.id}`;
    const ours = await acceptedQuote();
    for (const metadata of [
      { shop_id: other.shopId, quote_id: theirs.id },
      { shop_id: "demo-shop-ridgeback", quote_id: theirs.id },
      { shop_id: "demo-shop-ridgeback", quote_id: ours.id },
    ]) {
      const { q, sessionId } = await openCheckout();
      await fakePost(`/__fake/sessions/${sessionId}/tamper`, {
        metadata,
        client_reference_id: metadata.quote_id,
      });
      const done = await fakePost(`/__fake/sessions/${sessionId}/complete`);
      expect(done.status).toBe(200);
      await nothingPaid(q);
    }
    // The quote and the client reference must name the same quote.
    const { q, sessionId } = await openCheckout();
    await fakePost(`/__fake/sessions/${sessionId}/tamper`, { client_reference_id: ours.id });
    await fakePost(`/__fake/sessions/${sessionId}/complete`);
    await nothingPaid(q);
    expect((await sql`select status, version from quotes where id = ${theirs.id}`)[0]).toEqual(
      theirsBefore,
    );
    expect(
      (await sql`select count(*)::int as n from payments where quote_id = ${theirs.id}`)[0]!.n,
    ).toBe(0);
    // `ours` never opened a checkout: no payment at all, and it still awaits its deposit.
    expect(
      (await sql`select count(*)::int as n from payments where quote_id = ${ours.id}`)[0]!.n,
    ).toBe(0);
    expect((await sql`select status, version from quotes where id = ${ours.id}`)[0]).toMatchObject({
      status: "accepted",
      version: ours.version,
    });
  });

  it("the honest path: the provider's signed completion marks the deposit paid once, and a replay of it changes nothing", async () => {
    const { q, sessionId } = await openCheckout(22222);
    const done = await fakePost(`/__fake/sessions/${sessionId}/complete`);
    expect(done.status).toBe(200);
    const paid = async () =>
      sql`select p.status, p.paid_event_id, q.status as quote_status, q.version from payments p join quotes q on q.id = p.quote_id where p.quote_id = ${q.id}`;
    expect(await paid()).toEqual([
      {
        status: "paid",
        paid_event_id: done.event.id,
        quote_status: "deposit_paid",
        version: q.version + 1,
      },
    ]);
    const before = await fingerprint(["payments", "quotes"]);
    const replay = await fakePost(`/__fake/events/${done.event.id}/deliver`);
    expect(replay.status).toBe(200);
    // The same body and a fresh signature, as an attacker who captured it would send it.
    const captured = signedEvent("checkout.session.completed", { id: sessionId }, done.event.id);
    const again = await deliver(captured);
    expect(again.json.outcome).toBe("duplicate");
    expect(await fingerprint(["payments", "quotes"])).toBe(before);
  });
});

describe("quote PDF", () => {
  it("staff and the quote's customer download it; others get 404; a customer never sees a draft", async () => {
    const q = await acceptedQuote();
    const label = `Q-${String(q.number).padStart(4, "0")}`;
    const staff = await getBytes(counter, `/api/v1/quotes/${q.id}/pdf`);
    expect(staff.status).toBe(200);
    expect(staff.headers.get("content-type")).toBe("application/pdf");
    const { text, title } = inspectPdf(staff.bytes);
    expect(title).toBe(`Quote ${label}`);
    expect(text).toContain("Fuel system fitting");
    expect(text).toContain("Fuel burns.");
    expect((await getBytes(customer, `/api/v1/quotes/${q.id}/pdf`)).status).toBe(200);
    expect((await getBytes(outsider, `/api/v1/quotes/${q.id}/pdf`)).status).toBe(404);
    const draft = (await request(counter, "POST", "/api/v1/quotes", { customerId: CUSTOMER_ID }))
      .json.quote;
    expect((await getBytes(customer, `/api/v1/quotes/${draft.id}/pdf`)).status).toBe(404);
    expect((await request(customer, "GET", `/api/v1/quotes/${draft.id}`)).status).toBe(404);
    expect((await getBytes(counter, `/api/v1/quotes/${draft.id}/pdf`)).status).toBe(200);
  });
});

describe("shop logo", () => {
  it("the owner uploads a PNG; it is served to members and embedded in PDFs; bad uploads change nothing", async () => {
    const png = solidPng(96, 32);
    const send = (client: Client, body: Buffer, type = "image/png") =>
      fetch(`${BASE_URL}/api/v1/shop/logo`, {
        method: "PUT",
        body: new Uint8Array(body),
        headers: {
          cookie: client.cookie,
          origin: BASE_URL,
          "content-type": type,
          "x-forwarded-for": client.ip,
        },
      });
    const put = await send(owner, png);
    expect(put.status).toBe(200);
    expect((await put.json()).logo).toMatchObject({
      width: 96,
      height: 32,
      contentType: "image/png",
    });
    const got = await getBytes(customer, "/api/v1/shop/logo");
    expect(got.status).toBe(200);
    expect(got.bytes.equals(png)).toBe(true);
    const q = await acceptedQuote();
    expect(inspectPdf((await getBytes(customer, `/api/v1/quotes/${q.id}/pdf`)).bytes).images).toBe(
      1,
    );
    const ours = async () =>
      (await sql`select sha256 from shop_logos where shop_id = 'demo-shop-ridgeback'`)[0]?.sha256;
    const before = await ours();
    expect((await send(counter, png)).status).toBe(403);
    const notImage = await send(owner, Buffer.from("%PDF-1.7 not a logo"));
    expect(notImage.status).toBe(415);
    expect((await notImage.json()).error.message).toBe("The logo must be a PNG or JPEG image");
    expect((await send(owner, Buffer.alloc(2 * 1024 * 1024, 1))).status).toBe(413);
    expect((await send(owner, Buffer.alloc(0))).status).toBe(400);
    expect(await ours()).toBe(before);
    // Another shop's owner sets their own shop's logo, never ours, and reads back only theirs.
    expect((await getBytes(outsider, "/api/v1/shop/logo")).status).toBe(404);
    const theirs = solidPng(40, 40, [0, 0, 0]);
    expect((await send(outsider, theirs)).status).toBe(200);
    expect((await getBytes(outsider, "/api/v1/shop/logo")).bytes.equals(theirs)).toBe(true);
    expect(await ours()).toBe(before);
  });
});

describe("portal invitation", () => {
  it("sending a quote to a customer without a sign-in invites them in the same e-mail, once", async () => {
    const email = `new-${Date.now()}@customer.fuelwright.test`;
    const [c] =
      await sql`insert into customers (shop_id, name, email) values ('demo-shop-ridgeback', 'Invited Customer', ${email}) returning id`;
    const q = (await request(counter, "POST", "/api/v1/quotes", { customerId: c!.id })).json.quote;
    await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      validUntil: "2099-01-01",
      lines: [
        {
          kind: "labour",
          description: "Fitting",
          quantityMilli: 1000,
          unitPriceMinor: 10000,
          discountBp: 0,
        },
      ],
    });
    const sent = await request(counter, "POST", `/api/v1/quotes/${q.id}/send`);
    expect(sent.status).toBe(200);
    const mail = await waitForMail(email, /quote/);
    const link = /https?:\/\/\S+\/accept-invitation\/([\w-]+)/.exec(mail.text);
    expect(link).toBeTruthy();
    const [inv] = await sql`select * from invitation where id = ${link![1]!}`;
    expect(inv).toMatchObject({
      email,
      role: "customer",
      status: "pending",
      organization_id: "demo-shop-ridgeback",
    });
    expect((await request(counter, "POST", `/api/v1/quotes/${q.id}/send`)).status).toBe(200);
    expect(
      (await sql`select count(*)::int as n from invitation where email = ${email}`)[0]!.n,
    ).toBe(1);
    const page = await request(null, "GET", `/accept-invitation/${link![1]}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain("Customer");
  });
});

describe("a deposit taken at the counter", () => {
  it("is a payment of the shop's deposit, recorded by the counter with the move; once", async () => {
    const q = await acceptedQuote(41235);
    const [terms] =
      await sql`select deposit_bp from shop_settings where shop_id = 'demo-shop-ridgeback'`;
    // The deposit is the shop's share of the total, rounded half-up to the cent
    // (lib/payments/deposit.ts; common practice, no source).
    const expected = Math.round((q.total_minor * terms!.deposit_bp) / 10_000);
    const r = await request(counter, "POST", `/api/v1/quotes/${q.id}/status`, {
      status: "deposit_paid",
      amountMinor: 1, // the caller never names the amount
    });
    expect(r.status).toBe(200); // the stray amount is ignored: the shop's terms set it
    const paid = await sql`select * from payments where quote_id = ${q.id}`;
    expect(paid).toHaveLength(1);
    expect(paid[0]).toMatchObject({
      provider: "counter",
      status: "paid",
      amount_minor: expected,
      kind: "deposit",
    });
    expect(paid[0]!.paid_at).not.toBeNull();
    const [by] =
      await sql`select u.email from "user" u where u.id = ${paid[0]!.created_by as string}`;
    expect(by!.email).toBe("counter@demo.fuelwright.test");
    const [after] = await sql`select status from quotes where id = ${q.id}`;
    expect(after!.status).toBe("deposit_paid");

    // Asking again changes nothing: no second payment.
    const before = await fingerprint(TABLES);
    const twice = await request(counter, "POST", `/api/v1/quotes/${q.id}/status`, {
      status: "deposit_paid",
    });
    expect(twice.status).toBe(200);
    expect(await fingerprint(TABLES)).toBe(before);

    // The shop's page shows what was taken, where.
    const page = await request(counter, "GET", `/quotes/${q.id}`);
    expect(page.text).toMatch(/deposit paid<!-- --> at the counter|deposit paid at the counter/);
  });

  it("cannot be recorded on a quote the customer has not accepted", async () => {
    const q = (await request(counter, "POST", "/api/v1/quotes", { customerId: CUSTOMER_ID })).json
      .quote;
    const before = await fingerprint(TABLES);
    const r = await request(counter, "POST", `/api/v1/quotes/${q.id}/status`, {
      status: "deposit_paid",
    });
    expect(r.status).toBeGreaterThanOrEqual(400);
    expect(r.status).toBeLessThan(500);
    expect(await fingerprint(TABLES)).toBe(before);
  });
});
