import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { boostedSix } from "../calc/fixtures";
import { makeOtherShop, sql } from "../helpers/db";
import { once, request, signIn, type Client } from "../helpers/http";

// The test servers count each JSON API request's database statements and answer them in
// `x-db-round-trips` (DB_QUERY_COUNT=on in scripts/test-env.vars; db/query-count.ts). The
// session look-up is kept in memory between requests until anything it read changes
// (db/session-cache.ts): a change this app makes shows on the very next request; one written
// straight into the database, as another instance would, once the database's notice arrives.
const trips = (h: Headers) => {
  const n = h.get("x-db-round-trips");
  // Every answer says it, a refusal too: a missing header is not "no queries".
  expect(n, "x-db-round-trips").toMatch(/^\d+$/);
  return Number(n);
};

let tuner: Client;
beforeAll(async () => {
  tuner = await signIn("tuner@demo.fuelwright.test");
});

const tokenOf = (c: Client) =>
  decodeURIComponent(/session_token=([^;]+)/.exec(c.cookie)![1]!).split(".")[0]!;

describe("the cost of being signed in", () => {
  it("one round trip finds the session, the person, the membership and the shop's sizing settings; the next request none", async () => {
    const fresh = await signIn("tuner@demo.fuelwright.test");
    // The first request of a session reads it with the shop's sizing settings, nothing else.
    const r = await request(fresh, "POST", "/api/v1/calc/size", boostedSix);
    expect(r.status).toBe(200);
    expect(trips(r.headers)).toBe(1);
    // The next ones find it kept. (Polled: the sign-in's own writes keep nothing for a moment.)
    const again = await once(
      () => request(fresh, "POST", "/api/v1/calc/size", boostedSix),
      (a) => trips(a.headers) === 0,
    );
    expect(again.status).toBe(200);
    expect(trips(again.headers)).toBe(0);
    expect(again.json).toEqual(r.json);
    // Signed out: the cookie-less request never reaches the database.
    const out = await request(null, "POST", "/api/v1/calc/size", boostedSix);
    expect(out.status).toBe(401);
    expect(trips(out.headers)).toBe(0);
  });

  it("the sizing reads the shop's settings as they are now: a change made elsewhere shows as soon as the database tells the app", async () => {
    // A shop of its own: other test files size and save the demo shop's builds meanwhile.
    const shop = await makeOtherShop();
    const owner = await signIn(shop.email, shop.password);
    const body = { ...boostedSix, limits: undefined };
    for (const duty of [71, 73]) {
      // Kept first, so the change has something to make stale.
      await once(
        () => request(owner, "POST", "/api/v1/calc/size", body),
        (a) => trips(a.headers) === 0,
      );
      // Written straight into the database, as another instance of the app would.
      await sql`update shop_settings set design_duty_pct = ${duty} where shop_id = ${shop.shopId}`;
      const r = await once(
        () => request(owner, "POST", "/api/v1/calc/size", body),
        (a) => a.json?.inputs?.limits?.designDutyPct === duty,
      );
      expect(r.status).toBe(200);
      expect(r.json.inputs.limits.designDutyPct).toBe(duty);
    }
  });

  it("a change made through the app shows on the writer's very next request, with nothing to wait for", async () => {
    const shop = await makeOtherShop();
    const owner = await signIn(shop.email, shop.password);
    const read = () => request(owner, "GET", "/api/v1/shop/settings");
    const kept = await once(read, (a) => trips(a.headers) === 1); // the session kept, 1 for the settings
    expect(kept.status).toBe(200);
    const duty = kept.json.designDutyPct === 76 ? 77 : 76;
    const saved = await request(owner, "PATCH", "/api/v1/shop/settings", { designDutyPct: duty });
    expect(saved.status).toBe(200);
    // No polling: the very next sizing uses the new level.
    const r = await request(owner, "POST", "/api/v1/calc/size", {
      ...boostedSix,
      limits: undefined,
    });
    expect(r.status).toBe(200);
    expect(r.json.inputs.limits.designDutyPct).toBe(duty);
  });

  it("signing out ends the session on the very next request, though it was kept", async () => {
    const a = await signIn("tuner@demo.fuelwright.test");
    const kept = await once(
      () => request(a, "GET", "/api/v1/shop/settings"),
      (x) => trips(x.headers) === 1,
    );
    expect(kept.status).toBe(200);
    expect(trips(kept.headers)).toBe(1);
    const out = await request(a, "POST", "/api/auth/sign-out", {});
    expect(out.status).toBe(200);
    // The old cookie, replayed at once.
    expect((await request(a, "GET", "/api/v1/shop/settings")).status).toBe(401);
    expect((await request(a, "POST", "/api/v1/calc/size", boostedSix)).status).toBe(401);
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

  it("a password change ends the person's other sessions at once, whatever the caller asks", async () => {
    const shop = await makeOtherShop();
    const a = await signIn(shop.email, shop.password);
    const b = await signIn(shop.email, shop.password);
    expect((await request(b, "GET", "/api/v1/builds")).status).toBe(200);
    const changed = await request(a, "POST", "/api/auth/change-password", {
      currentPassword: shop.password,
      newPassword: "a-new-password-42",
      revokeOtherSessions: false,
    });
    expect(changed.status).toBe(200);
    expect((await request(b, "GET", "/api/v1/builds")).status).toBe(401);
    expect((await request(b, "POST", "/api/v1/calc/size", boostedSix)).status).toBe(401);
    // The new password signs in; the old one no longer does.
    await signIn(shop.email, "a-new-password-42");
    await expect(signIn(shop.email, shop.password)).rejects.toThrow(/401/);
  });

  it("a session revoked or expired elsewhere ends as soon as the database tells the app", async () => {
    const keep = async (c: Client) =>
      once(
        () => request(c, "GET", "/api/v1/shop/settings"),
        (x) => trips(x.headers) === 1,
      );
    const a = await signIn("tuner@demo.fuelwright.test");
    expect((await keep(a)).status).toBe(200);
    await sql`update session set expires_at = now() - interval '1 minute' where token = ${tokenOf(a)}`;
    const expired = await once(
      () => request(a, "GET", "/api/v1/shop/settings"),
      (x) => x.status === 401,
    );
    expect(expired.status).toBe(401);

    const b = await signIn("tuner@demo.fuelwright.test");
    expect((await keep(b)).status).toBe(200);
    await sql`delete from session where token = ${tokenOf(b)}`;
    const revoked = await once(
      () => request(b, "GET", "/api/v1/shop/settings"),
      (x) => x.status === 401,
    );
    expect(revoked.status).toBe(401);
  });

  it("a role taken away elsewhere is refused as soon as the database tells the app", async () => {
    const shop = await makeOtherShop();
    const owner = await signIn(shop.email, shop.password);
    const save = () => request(owner, "PATCH", "/api/v1/shop/settings", {});
    expect((await once(save, (x) => trips(x.headers) <= 2)).status).toBe(200);
    await sql`update member set role = 'counter' where user_id = ${shop.userId}`;
    expect((await once(save, (x) => x.status === 403)).status).toBe(403);
  });

  it("a session due for its daily extension is extended by the auth library's own path", async () => {
    const c = await signIn("tuner@demo.fuelwright.test");
    // Two days into its seven: due (the extension comes after one day of age).
    await sql`update session set expires_at = now() + interval '5 days' where token = ${tokenOf(c)}`;
    const r = await once(
      () => request(c, "GET", "/api/v1/shop/settings"),
      (x) => trips(x.headers) > 2,
    );
    expect(r.status).toBe(200);
    expect(trips(r.headers)).toBeGreaterThan(2);
    const [row] = await sql<{ days: number }[]>`
      select extract(epoch from (expires_at - now())) / 86400 as days from session
      where token = ${tokenOf(c)}`;
    expect(Number(row!.days)).toBeGreaterThan(6.9);
    // Extended, the next request takes the one-trip path again (the extension was a write of
    // this app's: nothing is kept for a moment, so the session is read, not found kept).
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
