import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { boostedSix } from "../calc/fixtures";
import { sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";

// The test servers count each JSON API request's database statements and answer them in
// `x-db-round-trips` (DB_QUERY_COUNT=on in scripts/test-env.vars; db/query-count.ts).
const trips = (h: Headers) => Number(h.get("x-db-round-trips"));

let tuner: Client;
beforeAll(async () => {
  tuner = await signIn("tuner@demo.fuelwright.test");
});

const tokenOf = (c: Client) =>
  decodeURIComponent(/session_token=([^;]+)/.exec(c.cookie)![1]!).split(".")[0]!;

describe("the cost of being signed in", () => {
  it("one round trip finds the session, the person, the membership and the shop's sizing settings", async () => {
    // The sizing route's one query reads the session with the shop's sizing settings, nothing else.
    const r = await request(tuner, "POST", "/api/v1/calc/size", boostedSix);
    expect(r.status).toBe(200);
    expect(trips(r.headers)).toBe(1);
    // Signed out: the cookie-less request never reaches the database.
    const out = await request(null, "POST", "/api/v1/calc/size", boostedSix);
    expect(out.status).toBe(401);
    expect(trips(out.headers)).toBe(0);
  });

  it("the sizing reads the shop's settings as they are now: a change made elsewhere shows on the next request", async () => {
    // Written straight into the database, as another instance of the app would: nothing cached.
    const [shop] = await sql<{ shop_id: string; design_duty_pct: number }[]>`
      select ss.shop_id, ss.design_duty_pct from shop_settings ss
      join member m on m.organization_id = ss.shop_id
      join "user" u on u.id = m.user_id
      where u.email = 'tuner@demo.fuelwright.test'`;
    const before = shop!.design_duty_pct;
    const body = { ...boostedSix, limits: undefined };
    try {
      for (const duty of [before === 71 ? 72 : 71, before === 73 ? 74 : 73]) {
        await sql`update shop_settings set design_duty_pct = ${duty} where shop_id = ${shop!.shop_id}`;
        const r = await request(tuner, "POST", "/api/v1/calc/size", body);
        expect(r.status).toBe(200);
        expect(r.json.inputs.limits.designDutyPct).toBe(duty);
        expect(trips(r.headers)).toBe(1);
      }
    } finally {
      await sql`update shop_settings set design_duty_pct = ${before} where shop_id = ${shop!.shop_id}`;
    }
  });

  it("a forged or altered cookie is nobody, and costs no query", async () => {
    const token = tokenOf(tuner);
    for (const cookie of [
      `better-auth.session_token=${token}.${"A".repeat(43)}=`, // a signature of our own making
      `better-auth.session_token=${token}`, // no signature at all
      tuner.cookie.replace(/session_token=./, "session_token=x"), // the token changed
    ]) {
      const r = await request({ ...tuner, cookie }, "POST", "/api/v1/calc/size", boostedSix);
      expect(r.status, cookie).toBe(401);
      expect(trips(r.headers)).toBe(0);
    }
  });

  it("a revoked session ends at once, and an expired one is refused", async () => {
    const a = await signIn("tuner@demo.fuelwright.test");
    expect((await request(a, "GET", "/api/v1/shop/settings")).status).toBe(200);
    await sql`update session set expires_at = now() - interval '1 minute' where token = ${tokenOf(a)}`;
    expect((await request(a, "GET", "/api/v1/shop/settings")).status).toBe(401);

    const b = await signIn("tuner@demo.fuelwright.test");
    await sql`delete from session where token = ${tokenOf(b)}`;
    expect((await request(b, "GET", "/api/v1/shop/settings")).status).toBe(401);
  });

  it("a session due for its daily extension is extended by the auth library's own path", async () => {
    const c = await signIn("tuner@demo.fuelwright.test");
    // Two days into its seven: due (the extension comes after one day of age).
    await sql`update session set expires_at = now() + interval '5 days' where token = ${tokenOf(c)}`;
    const r = await request(c, "GET", "/api/v1/shop/settings");
    expect(r.status).toBe(200);
    expect(trips(r.headers)).toBeGreaterThan(2);
    const [row] = await sql<{ days: number }[]>`
      select extract(epoch from (expires_at - now())) / 86400 as days from session
      where token = ${tokenOf(c)}`;
    expect(Number(row!.days)).toBeGreaterThan(6.9);
    // Extended, the next request takes the one-trip path again.
    const again = await request(c, "GET", "/api/v1/shop/settings");
    expect(again.status).toBe(200);
    expect(trips(again.headers)).toBe(2);
  });

  it("the member's active shop decides the role", async () => {
    const r = await request(tuner, "GET", "/api/v1/shop/settings");
    expect(r.status).toBe(200);
    // A counter may not change settings, an owner may: the role comes from the same query.
    const counter = await signIn("counter@demo.fuelwright.test");
    const refused = await request(counter, "PATCH", "/api/v1/shop/settings", { designDutyPct: 80 });
    expect(refused.status).toBe(403);
  });
});

afterAll(async () => {
  await sql.end();
});
