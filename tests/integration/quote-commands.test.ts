import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { sweepExpiredQuotes } from "@/lib/quotes/quote-commands";

import { actionManifest, callAction, type ActionRef, type ActionResult } from "../helpers/actions";
import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";
import { waitForMail } from "../helpers/mail";

/**
 * The quote commands (lib/quotes/quote-commands.ts) through both of their doors: the JSON API
 * and the server actions of lib/quotes/quote-actions.ts give the same answers; listing quotes
 * only reads, and due quotes expire through the clock's sweep; a refused e-mail writes nothing.
 */

const SHOP = "demo-shop-ridgeback";
const CUSTOMER_ID = "00000000-0000-4000-8000-000000000001"; // has the demo portal sign-in (db/seed.ts)
const ACTIONS_FILE = "lib/quotes/quote-actions.ts";
const prev = { ok: false };
const tag = `QC${Date.now().toString(36).toUpperCase()}`;

let owner: Client, tuner: Client, counter: Client, customer: Client, outsider: Client;
let manifest: ActionRef[];

beforeAll(async () => {
  const other = await makeOtherShop();
  [owner, tuner, counter, customer, outsider] = await Promise.all([
    signIn("owner@demo.fuelwright.test"),
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
  manifest = actionManifest();
});
afterAll(async () => {
  await sql.end();
});

/** Calls one of lib/quotes/quote-actions.ts as the browser does, posted to `page`. */
function action(name: string, page: string, client: Client | null, input: unknown) {
  const found = manifest.find((r) => r.file === ACTIONS_FILE && r.name === name);
  expect(found, `${name} is in the build's action manifest`).toBeTruthy();
  return callAction(client, { ...found!, page }, [prev, input]);
}
type State = NonNullable<ActionResult["state"]> & {
  code?: string;
  data?: Record<string, unknown>;
  current?: Record<string, unknown>;
};
const stateOf = (r: ActionResult) => r.state as State;

async function draftQuote(customerId = CUSTOMER_ID) {
  const r = await request(counter, "POST", "/api/v1/quotes", { customerId });
  expect(r.status).toBe(201);
  return r.json.quote as { id: string; version: number; number: number };
}
const labour = (unitPriceMinor: number) => [
  {
    kind: "labour",
    description: "Fuel system fitting",
    quantityMilli: 2500,
    unitPriceMinor,
    discountBp: 1000,
  },
];

describe("editing a quote: the route and the action give the same result", () => {
  it("a save, a stale version (409 with the quote as it is now), a quote no longer editable (422)", async () => {
    const [a, b] = [await draftQuote(), await draftQuote()];
    const edit = { validUntil: "2099-03-31", notes: "Both doors", lines: labour(9000) };

    // A save.
    const viaRoute = await request(counter, "PATCH", `/api/v1/quotes/${a.id}`, {
      version: a.version,
      ...edit,
    });
    const viaAction = stateOf(
      await action("editQuoteAction", `/quotes/${b.id}`, counter, {
        id: b.id,
        version: b.version,
        ...edit,
      }),
    );
    expect(viaRoute.status).toBe(200);
    expect(viaAction.ok).toBe(true);
    // By hand: 2.5 h × 90.00 = 225.00, less 10 % = 202.50; 8.25 % tax (demo shop) = 16.71 (16.706 half up); 219.21.
    const expected = {
      version: a.version + 1,
      status: "draft",
      validUntil: "2099-03-31",
      notes: "Both doors",
      subtotalMinor: 20250, // after the line's discount
      discountMinor: 2250,
      taxMinor: 1671,
      totalMinor: 21921,
    };
    expect(viaRoute.json.quote).toMatchObject(expected);
    expect(viaAction.data).toMatchObject(expected);

    // A stale version: 409, the quote as it is now, nothing written.
    const before = await fingerprint(["quotes", "quote_lines"]);
    const staleRoute = await request(counter, "PATCH", `/api/v1/quotes/${a.id}`, {
      version: a.version,
      ...edit,
      notes: "Stale",
    });
    const staleAction = stateOf(
      await action("editQuoteAction", `/quotes/${b.id}`, counter, {
        id: b.id,
        version: b.version,
        ...edit,
        notes: "Stale",
      }),
    );
    expect(staleRoute.status).toBe(409);
    expect(staleRoute.json.error.code).toBe("conflict");
    expect(staleRoute.json.current).toMatchObject({ id: a.id, version: a.version + 1 });
    expect(staleAction).toMatchObject({ ok: false, status: 409, code: "conflict" });
    expect(staleAction.message).toBe(staleRoute.json.error.message);
    expect(staleAction.current).toMatchObject({ id: b.id, version: b.version + 1 });
    expect(await fingerprint(["quotes", "quote_lines"])).toBe(before);

    // Accepted: no longer editable, whatever the version says.
    await sql`update quotes set status = 'accepted' where id in ${sql([a.id, b.id])}`;
    const accepted = await fingerprint(["quotes", "quote_lines"]);
    const lockedRoute = await request(counter, "PATCH", `/api/v1/quotes/${a.id}`, {
      version: a.version + 1,
      notes: "Too late",
    });
    const lockedAction = stateOf(
      await action("editQuoteAction", `/quotes/${b.id}`, counter, {
        id: b.id,
        version: b.version + 1,
        notes: "Too late",
      }),
    );
    expect(lockedRoute.status).toBe(422);
    expect(lockedRoute.json.error.code).toBe("invalid_transition");
    expect(lockedAction).toMatchObject({ ok: false, status: 422, code: "invalid_transition" });
    expect(lockedAction.message).toBe(lockedRoute.json.error.message);
    expect(await fingerprint(["quotes", "quote_lines"])).toBe(accepted);
  });

  it("an edit writes only the fields it names: notes alone keep the lines, lines alone keep the notes", async () => {
    const q = await draftQuote();
    const full = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      validUntil: "2099-04-30",
      notes: "Keep me",
      lines: labour(10000),
    });
    expect(full.status).toBe(200);
    const lines = async () =>
      (
        await sql`select description, quantity_milli, unit_price_minor from quote_lines where quote_id = ${q.id} order by position`
      ).map((r) => ({ ...r }));
    const linesBefore = await lines();
    const notesOnly = stateOf(
      await action("editQuoteAction", `/quotes/${q.id}`, counter, {
        id: q.id,
        version: q.version + 1,
        notes: "Changed notes",
      }),
    );
    expect(notesOnly.ok).toBe(true);
    expect(notesOnly.data).toMatchObject({
      notes: "Changed notes",
      validUntil: "2099-04-30",
      totalMinor: full.json.quote.totalMinor,
    });
    expect(await lines()).toEqual(linesBefore);
    const linesOnly = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version + 2,
      lines: labour(20000),
    });
    expect(linesOnly.status).toBe(200);
    expect(linesOnly.json.quote).toMatchObject({
      notes: "Changed notes",
      validUntil: "2099-04-30",
      subtotalMinor: 45000, // 2.5 h × 200.00 = 500.00, less 10 % (by hand)
    });
  });

  it("a line naming another shop's part is a field error, by either door, and writes nothing", async () => {
    const q = await draftQuote();
    const [theirs] =
      await sql`insert into parts (shop_id, sku, category, brand, name, price_minor) select organization_id, ${`${tag}-X`}, 'other', 'Elsewhere', 'Not ours', 100 from member where organization_id <> ${SHOP} limit 1 returning id`;
    const line = {
      kind: "part",
      partId: theirs!.id,
      description: "Not ours",
      quantityMilli: 1000,
      unitPriceMinor: 100,
      discountBp: 0,
    };
    const before = await fingerprint(["quotes", "quote_lines"]);
    const viaRoute = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      lines: [labour(100)[0], line],
    });
    const viaAction = stateOf(
      await action("editQuoteAction", `/quotes/${q.id}`, counter, {
        id: q.id,
        version: q.version,
        lines: [labour(100)[0], line],
      }),
    );
    expect(viaRoute.status).toBe(422);
    expect(viaRoute.json.error.issues).toEqual([
      { path: "lines.1.partId", message: "That part is not in this shop's catalog" },
    ]);
    expect(viaAction).toMatchObject({
      ok: false,
      status: 422,
      fieldErrors: { "lines.1.partId": ["That part is not in this shop's catalog"] },
    });
    expect(await fingerprint(["quotes", "quote_lines"])).toBe(before);
  });
});

describe("listing quotes only reads; due quotes expire through the clock's sweep", () => {
  const TABLES = [
    "quotes",
    "quote_lines",
    "quote_messages",
    "parts",
    "payments",
    "invitation",
    "shop_counters",
  ];
  const lists = () =>
    Promise.all([
      request(counter, "GET", "/api/v1/quotes"),
      request(counter, "GET", "/quotes"),
      request(customer, "GET", "/api/v1/quotes"),
      request(customer, "GET", "/my"),
    ]);

  it("with nothing due, the API list, the quotes page and the portal write nothing", async () => {
    await sweepExpiredQuotes(); // whatever was due is expired now
    const before = await fingerprint(TABLES);
    const newest = async () =>
      (await sql`select max(updated_at) as max from quotes where shop_id = ${SHOP}`)[0]!.max;
    const updatedBefore = await newest();
    const got = await lists();
    expect(got.map((r) => r.status)).toEqual([200, 200, 200, 200]);
    expect(await fingerprint(TABLES)).toBe(before);
    expect(await newest()).toEqual(updatedBefore);
  });

  it("a quote past its date is listed as expired before the sweep; the sweep expires it once and an accepted one releases its stock", async () => {
    const [part] =
      await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, stock, specs) values (${SHOP}, ${`${tag}-EXP`}, 'other', 'Testbrand', 'Expirable', 1000, 6, '{}') returning id`;
    const partLine = {
      kind: "part",
      partId: part!.id,
      description: "Expirable",
      quantityMilli: 2000,
      unitPriceMinor: 1000,
      discountBp: 0,
    };
    const make = async (status: "draft" | "sent" | "accepted", validUntil: string) => {
      const q = await draftQuote();
      const saved = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
        version: q.version,
        validUntil: "2099-01-01",
        lines: [partLine],
      });
      expect(saved.status).toBe(200);
      if (status !== "draft") await sql`update quotes set status = 'sent' where id = ${q.id}`;
      if (status === "accepted")
        expect(
          (
            await request(customer, "POST", `/api/v1/quotes/${q.id}/respond`, {
              decision: "accept",
            })
          ).status,
        ).toBe(200);
      await sql`update quotes set valid_until = ${validUntil} where id = ${q.id}`;
      return (await sql`select id, version, updated_at from quotes where id = ${q.id}`)[0]!;
    };
    const past = new Date(Date.now() - 3 * 86_400_000).toISOString().slice(0, 10);
    const accepted = await make("accepted", past);
    const sent = await make("sent", past);
    const draft = await make("draft", past); // a draft never went out: it does not expire
    const current = await make("sent", "2099-12-31");
    const reserved = async () =>
      (await sql`select reserved from parts where id = ${part!.id}`)[0]!.reserved as number;
    expect(await reserved()).toBe(2);

    // Before the sweep: listed as expired everywhere, and nothing written.
    const unswept = await fingerprint(TABLES);
    const [early, page] = await lists();
    expect(page!.status).toBe(200);
    const earlyStatus = Object.fromEntries(
      early!.json.quotes.map((q: { id: string; status: string }) => [q.id, q.status]),
    );
    expect(earlyStatus[accepted.id]).toBe("expired");
    expect(earlyStatus[sent.id]).toBe("expired");
    expect(earlyStatus[current.id]).toBe("sent");
    expect(await fingerprint(TABLES)).toBe(unswept);
    expect(await reserved()).toBe(2);

    const swept = await sweepExpiredQuotes();
    expect(swept.expired).toEqual(expect.arrayContaining([accepted.id, sent.id]));
    expect(swept.expired).not.toContain(draft.id);
    expect(swept.expired).not.toContain(current.id);
    const rows =
      await sql`select id, status, version, status_changed_by from quotes where id in ${sql([accepted.id, sent.id, draft.id, current.id])}`;
    const byId = Object.fromEntries(rows.map((r) => [r.id, r]));
    expect(byId[accepted.id]).toMatchObject({
      status: "expired",
      version: accepted.version + 1,
      status_changed_by: null,
    });
    expect(byId[sent.id]).toMatchObject({ status: "expired", version: sent.version + 1 });
    expect(byId[draft.id]).toMatchObject({ status: "draft", version: draft.version });
    expect(byId[current.id]).toMatchObject({ status: "sent", version: current.version });
    expect(await reserved()).toBe(0);

    // Listed as expired, and listing or sweeping again changes nothing more.
    const before = await fingerprint(TABLES);
    const [list] = await lists();
    const listed = Object.fromEntries(
      list!.json.quotes.map((q: { id: string; status: string }) => [q.id, q.status]),
    );
    expect(listed[accepted.id]).toBe("expired");
    expect((await sweepExpiredQuotes()).expired).not.toContain(accepted.id);
    expect(await fingerprint(TABLES)).toBe(before);
  });
});

describe("a sent quote is never edited in place", () => {
  const TABLES = ["quotes", "quote_lines", "quote_messages", "parts", "invitation"];
  const EMAIL = "customer@demo.fuelwright.test"; // the portal customer's address (db/seed.ts)
  const label = (n: number, r: number) => `Q-${String(n).padStart(4, "0")}${r > 1 ? `-r${r}` : ""}`;

  /** A quote with one labour line at `price`, e-mailed to the portal customer. */
  async function sentQuote(price: number) {
    const q = await draftQuote();
    const saved = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      validUntil: "2099-05-31",
      notes: "As sent",
      lines: labour(price),
    });
    expect(saved.status).toBe(200);
    const sent = await request(counter, "POST", `/api/v1/quotes/${q.id}/send`);
    expect(sent.status).toBe(200);
    const row = (await request(counter, "GET", `/api/v1/quotes/${q.id}`)).json.quote;
    expect(row).toMatchObject({ status: "sent", revision: 1 });
    return row as { id: string; version: number; number: number; totalMinor: number };
  }

  it("the edit becomes revision 2 (a draft), the sent one is superseded, and the customer's total stays what they were sent", async () => {
    const q = await sentQuote(9000);
    // By hand: 2.5 h × 90.00 = 225.00, less 10 % = 202.50; 8.25 % tax = 16.71 (half up); 219.21.
    expect(q.totalMinor).toBe(21921);
    const mail = await waitForMail(EMAIL, new RegExp(`quote ${label(q.number, 1)} for`));
    expect(mail.text).toContain("Total $219.21");
    const linesOf = async (id: string) =>
      (
        await sql`select description, quantity_milli, unit_price_minor, discount_bp from quote_lines where quote_id = ${id} order by position`
      ).map((r) => ({ ...r }));
    const sentLines = await linesOf(q.id);

    const edit = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      lines: labour(12000),
    });
    expect(edit.status).toBe(200);
    const rev = edit.json.quote;
    // By hand: 2.5 h × 120.00 = 300.00, less 10 % = 270.00; 8.25 % tax = 22.28 (22.275 half up); 292.28.
    expect(rev).toMatchObject({
      number: q.number,
      revision: 2,
      status: "draft",
      version: 1,
      validUntil: "2099-05-31", // what the edit left out is the sent one's
      notes: "As sent",
      totalMinor: 29228,
    });
    expect(rev.id).not.toBe(q.id);
    const [old] = await sql`select status, version, total_minor from quotes where id = ${q.id}`;
    expect(old).toMatchObject({ status: "superseded", version: q.version + 1, total_minor: 21921 });
    expect(await linesOf(q.id)).toEqual(sentLines);
    expect((await linesOf(rev.id))[0]).toMatchObject({ unit_price_minor: 12000 });

    // The customer's link to what they were sent: its total, said to be replaced, nothing to accept.
    const portal = await request(customer, "GET", `/my/quotes/${q.id}`);
    expect(portal.status).toBe(200);
    expect(portal.text).toContain("This quote was replaced by a new revision");
    expect(portal.text).toContain("$219.21");
    expect(portal.text).not.toContain("$292.28");
    expect(portal.text).not.toContain("Accept quote");
    expect(portal.text).not.toContain(`/my/quotes/${rev.id}`); // the draft is not theirs to see yet
    expect((await request(customer, "GET", `/my/quotes/${rev.id}`)).status).toBe(404);
    const before = await fingerprint(TABLES);
    const accept = await request(customer, "POST", `/api/v1/quotes/${q.id}/respond`, {
      decision: "accept",
    });
    expect(accept.status).toBe(409);
    expect(accept.json.error.message).toMatch(/replaced by a new revision/);
    expect(await fingerprint(TABLES)).toBe(before);

    // Sent, the revision is the customer's: its e-mail and its portal page say the same total.
    expect((await request(counter, "POST", `/api/v1/quotes/${rev.id}/send`)).status).toBe(200);
    const revMail = await waitForMail(EMAIL, new RegExp(`quote ${label(q.number, 2)} for`));
    expect(revMail.text).toContain("Total $292.28");
    expect(revMail.text).toContain(`/my/quotes/${rev.id}`);
    const revPage = await request(customer, "GET", `/my/quotes/${rev.id}`);
    expect(revPage.text).toContain("$292.28");
    expect(revPage.text).toContain("Accept quote");
    expect((await request(customer, "GET", `/my/quotes/${q.id}`)).text).toContain(
      `/my/quotes/${rev.id}`,
    );
  });

  it("through the editor's action too; a stale version or an edit that changes nothing writes nothing", async () => {
    const q = await sentQuote(5000);
    const before = await fingerprint(TABLES);
    const same = stateOf(
      await action("editQuoteAction", `/quotes/${q.id}`, counter, {
        id: q.id,
        version: q.version,
        validUntil: "2099-05-31",
        notes: "As sent",
        lines: labour(5000),
      }),
    );
    expect(same).toMatchObject({ ok: true, data: { id: q.id, status: "sent" } });
    expect(await fingerprint(TABLES)).toBe(before);
    const stale = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version - 1,
      notes: "Stale",
    });
    expect(stale.status).toBe(409);
    expect(stale.json.current).toMatchObject({ id: q.id, status: "sent" });
    expect(await fingerprint(TABLES)).toBe(before);

    const viaAction = stateOf(
      await action("editQuoteAction", `/quotes/${q.id}`, counter, {
        id: q.id,
        version: q.version,
        notes: "Changed",
      }),
    );
    expect(viaAction).toMatchObject({
      ok: true,
      data: { number: q.number, revision: 2, status: "draft", notes: "Changed" },
    });
    expect(viaAction.data!.id).not.toBe(q.id);
    expect((await sql`select status from quotes where id = ${q.id}`)[0]!.status).toBe("superseded");
    // Only one revision: the superseded quote is no longer edited, by either door.
    const again = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version + 1,
      notes: "Again",
    });
    expect(again.status).toBe(422);
    expect(
      (
        await sql`select count(*)::int as n from quotes where shop_id = ${SHOP} and number = ${q.number}`
      )[0]!.n,
    ).toBe(2);
  });

  it("a sent quote no longer goes back to draft", async () => {
    const q = await sentQuote(4000);
    const before = await fingerprint(TABLES);
    const r = await request(counter, "POST", `/api/v1/quotes/${q.id}/status`, { status: "draft" });
    expect(r.status).toBe(422);
    expect(r.json.error.code).toBe("invalid_transition");
    expect(await fingerprint(TABLES)).toBe(before);
  });
});

describe("a quote past its valid-until day is not accepted, declined or paid, whatever its stored status", () => {
  const TABLES = ["quotes", "quote_lines", "quote_messages", "parts", "payments", "invitation"];
  const yesterday = () => new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);

  /** The portal customer's quote with one labour line, in `status`, valid until yesterday. */
  async function lapsed(status: "sent" | "accepted") {
    const q = await draftQuote();
    const saved = await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      lines: labour(8000),
    });
    expect(saved.status).toBe(200);
    // Stored as the expiry command has not seen it yet (nobody listed quotes since).
    await sql`update quotes set status = ${status}, valid_until = ${yesterday()} where id = ${q.id}`;
    return q;
  }

  it("the customer's acceptance (API and action) is refused with 409 quote_expired and changes no row; the portal shows it expired", async () => {
    const q = await lapsed("sent");
    const before = await fingerprint(TABLES);
    const viaRoute = await request(customer, "POST", `/api/v1/quotes/${q.id}/respond`, {
      decision: "accept",
    });
    expect(viaRoute.status).toBe(409);
    expect(viaRoute.json.error.code).toBe("quote_expired");
    expect(viaRoute.json.error.message).toContain(`valid until ${yesterday()}`);
    const viaAction = stateOf(
      await action("respondToQuoteAction", `/my/quotes/${q.id}`, customer, {
        id: q.id,
        decision: "decline",
      }),
    );
    expect(viaAction).toMatchObject({ ok: false, status: 409, code: "quote_expired" });
    expect(await fingerprint(TABLES)).toBe(before);

    const page = await request(customer, "GET", `/my/quotes/${q.id}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain("can no longer be accepted");
    expect(page.text).toMatch(/data-testid="my-quote-status">Expired</);
    expect(page.text).not.toContain("Accept quote");
    expect(await fingerprint(TABLES)).toBe(before); // reading it wrote nothing
    const [row] = await sql`select status from quotes where id = ${q.id}`;
    expect(row!.status).toBe("sent");
  });

  it("the shop cannot mark it accepted, declined or its deposit paid (422), only expired; nor send it again", async () => {
    const sent = await lapsed("sent");
    const accepted = await lapsed("accepted");
    const before = await fingerprint(TABLES);
    for (const [id, status] of [
      [sent.id, "accepted"],
      [sent.id, "declined"],
      [accepted.id, "deposit_paid"],
      [accepted.id, "declined"],
    ] as const) {
      const r = await request(counter, "POST", `/api/v1/quotes/${id}/status`, { status });
      expect(r.status, `${status}`).toBe(422);
      expect(r.json.error.code).toBe("quote_expired");
    }
    const resend = await request(counter, "POST", `/api/v1/quotes/${sent.id}/send`);
    expect(resend.status).toBe(422);
    expect(resend.json.error.code).toBe("quote_expired");
    expect(await fingerprint(TABLES)).toBe(before);
    const expire = await request(counter, "POST", `/api/v1/quotes/${sent.id}/status`, {
      status: "expired",
    });
    expect(expire.status).toBe(200);
  });

  it("the deposit on an accepted quote past its date is refused (API and action) and no checkout is opened", async () => {
    const q = await lapsed("accepted");
    const before = await fingerprint(TABLES);
    const viaRoute = await request(customer, "POST", `/api/v1/quotes/${q.id}/deposit`);
    expect(viaRoute.status).toBe(409);
    expect(viaRoute.json.error.code).toBe("quote_expired");
    const viaAction = stateOf(
      await action("startDepositAction", `/my/quotes/${q.id}`, customer, { id: q.id }),
    );
    expect(viaAction).toMatchObject({ ok: false, status: 409, code: "quote_expired" });
    expect(await fingerprint(TABLES)).toBe(before);
    const page = await request(customer, "GET", `/my/quotes/${q.id}`);
    expect(page.text).not.toContain("Pay deposit");
    await sql`update quotes set status = 'expired' where id = ${q.id}`; // as the expiry command would
  });

  it("a draft with a past date is not sent: a field error on validUntil", async () => {
    const q = await draftQuote();
    await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
      version: q.version,
      lines: labour(1000),
      validUntil: yesterday(),
    });
    const before = await fingerprint(TABLES);
    const r = await request(counter, "POST", `/api/v1/quotes/${q.id}/send`);
    expect(r.status).toBe(422);
    expect(r.json.error.issues.map((i: { path: string }) => i.path)).toEqual(["validUntil"]);
    expect(await fingerprint(TABLES)).toBe(before);
  });
});

describe("sending a quote the mail server refuses", () => {
  it("answers 502 mail_failed by either door and writes nothing: no status, no message, no invitation", async () => {
    // An address the mail server turns down (501): the customer form would refuse it, so it is set in SQL.
    const [c] =
      await sql`insert into customers (shop_id, name, email) values (${SHOP}, 'Refused Mail', 'refused@@mail.fuelwright.test') returning id`;
    const q = await draftQuote(c!.id);
    expect(
      (
        await request(counter, "PATCH", `/api/v1/quotes/${q.id}`, {
          version: q.version,
          lines: labour(5000),
        })
      ).status,
    ).toBe(200);
    const TABLES = ["quotes", "quote_messages", "invitation"];
    const before = await fingerprint(TABLES);
    const viaRoute = await request(counter, "POST", `/api/v1/quotes/${q.id}/send`);
    expect(viaRoute.status).toBe(502);
    expect(viaRoute.json.error.code).toBe("mail_failed");
    expect(viaRoute.json.error.message).toMatch(/not sent.*unchanged; try again/i);
    const viaAction = stateOf(
      await action("sendQuoteAction", `/quotes/${q.id}`, counter, { id: q.id }),
    );
    expect(viaAction).toMatchObject({ ok: false, status: 502, code: "mail_failed" });
    expect(await fingerprint(TABLES)).toBe(before);
    const [after] = await sql`select status, version from quotes where id = ${q.id}`;
    expect(after).toMatchObject({ status: "draft", version: q.version + 1 });
  });
});

describe("who may call the quote actions", () => {
  const WHO = ["anon", "owner", "tuner", "counter", "customer", "outsider"] as const;
  /**
   * Outcomes per caller, as in the access matrix: ok, or the refusal's status. (The access
   * matrix lists the actions under app/ only. createQuoteAction is in a build's manifest once a
   * screen calls it: the kit picker's "Create quote".)
   */
  const cases: {
    name: string;
    page: (id: string) => string;
    input: (id: string) => unknown;
    expect: string;
  }[] = [
    {
      name: "editQuoteAction",
      page: (id) => `/quotes/${id}`,
      input: (id) => ({ id, version: 1, notes: "Matrix" }),
      expect: "401 ok 403 ok 403 404",
    },
    {
      name: "changeQuoteStatusAction",
      page: (id) => `/quotes/${id}`,
      input: (id) => ({ id, status: "draft" }),
      expect: "401 ok 403 ok 403 404",
    },
    {
      name: "sendQuoteAction",
      page: (id) => `/quotes/${id}`,
      input: (id) => ({ id }),
      expect: "401 ok 403 ok 403 404",
    },
    {
      name: "reviseQuoteAction",
      page: (id) => `/quotes/${id}`,
      input: (id) => ({ id }),
      expect: "401 ok 403 ok 403 404",
    },
    {
      name: "respondToQuoteAction",
      page: (id) => `/my/quotes/${id}`,
      input: (id) => ({ id, decision: "decline" }),
      expect: "401 403 403 403 404 403",
    },
    {
      name: "startDepositAction",
      page: (id) => `/my/quotes/${id}`,
      input: (id) => ({ id }),
      expect: "401 403 403 403 404 403",
    },
  ];
  const TABLES = [
    "quotes",
    "quote_lines",
    "quote_messages",
    "parts",
    "payments",
    "invitation",
    "shop_counters",
  ];

  it.each(cases)(
    "$name: each caller gets the expected outcome; a refusal changes nothing",
    async (c) => {
      const clients = { anon: null, owner, tuner, counter, customer, outsider };
      const expected = c.expect.split(" ");
      for (const [i, who] of WHO.entries()) {
        const q = await draftQuote(); // a draft: the customer may not see it at all (404)
        const before = await fingerprint(TABLES);
        const r = await action(c.name, c.page(q.id), clients[who], c.input(q.id));
        expect(r.http, `${c.name} as ${who}: the action answered`).toBeLessThan(500);
        const status = r.redirect
          ? /\/sign-in\b/.test(r.redirect)
            ? 401
            : 200
          : (r.state?.status ?? 200);
        const label = `${c.name} as ${who} (${r.state?.message ?? r.redirect ?? ""})`;
        if (expected[i] === "ok") {
          expect([401, 403, 404], label).not.toContain(status);
          expect(status, label).toBeLessThan(500);
        } else {
          expect(status, label).toBe(Number(expected[i]));
          expect(await fingerprint(TABLES), `${label}: a refusal changed the database`).toBe(
            before,
          );
        }
      }
    },
  );
});
