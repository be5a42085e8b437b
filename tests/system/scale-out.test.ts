import { afterAll, beforeAll, describe, expect, it } from "vitest";

import {
  call,
  freshDatabase,
  signInAt,
  signInFrom,
  sqlFor,
  startApp,
  type App,
} from "../helpers/system";

/**
 * docs/architecture.md's claim, tested: app instances are stateless — sessions live in the
 * database — so a load balancer may send any request to any instance.
 */
let a: App, b: App;
let sql: ReturnType<typeof sqlFor>;
beforeAll(async () => {
  const url = freshDatabase();
  sql = sqlFor(url);
  // Both instances answer for one public address, as they would behind a load balancer; the
  // auth rate limits on, and no trusted proxy (the default): the client is the socket's peer.
  const limits = { AUTH_RATE_LIMIT: "on", TRUSTED_PROXY_HEADER: "" };
  [a, b] = await Promise.all([
    startApp(3201, { APP_URL: "http://127.0.0.1:3201", ...limits }),
    startApp(3202, { APP_URL: "http://127.0.0.1:3201", ...limits }),
  ]);
}, 120_000);
afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
  await sql?.end();
});

describe("two app instances on one database", () => {
  it("a user signed in on one is served by the other, and a save on one is seen on the other", async () => {
    const origin = a.url;
    const { cookie } = await signInAt(
      a.url,
      "tuner@demo.fuelwright.test",
      "fuelwright-demo",
      origin,
    );
    const onB = await call(b.url, cookie, "GET", "/api/v1/builds", undefined, origin);
    expect(onB.status).toBe(200);
    expect(onB.json.builds.length).toBeGreaterThan(0);
    const page = await call(b.url, cookie, "GET", "/builds", undefined, origin);
    expect(page.status).toBe(200);
    expect(page.text).toContain("Teodor Vance");

    const id = "10000000-0000-4000-8000-000000000002";
    const cur = await call(a.url, cookie, "GET", `/api/v1/builds/${id}`, undefined, origin);
    const saved = await call(
      a.url,
      cookie,
      "PATCH",
      `/api/v1/builds/${id}`,
      {
        version: cur.json.build.version,
        title: "Saved on instance A",
        inputs: cur.json.build.inputs,
      },
      origin,
    );
    expect(saved.status).toBe(200);
    const seen = await call(b.url, cookie, "GET", `/api/v1/builds/${id}`, undefined, origin);
    expect(seen.json.build).toMatchObject({
      title: "Saved on instance A",
      version: cur.json.build.version + 1,
    });
    // Signing out on B ends the session everywhere: on B at once, on A as soon as the database's
    // notice reaches it (A keeps session look-ups in memory, db/session-cache.ts) — tried for at
    // most 3 s, and the session must stay ended.
    expect((await call(b.url, cookie, "POST", "/api/auth/sign-out", {}, origin)).status).toBe(200);
    expect((await call(b.url, cookie, "GET", "/api/v1/builds", undefined, origin)).status).toBe(
      401,
    );
    const end = Date.now() + 3000;
    let onA = 0;
    do onA = (await call(a.url, cookie, "GET", "/api/v1/builds", undefined, origin)).status;
    while (onA !== 401 && Date.now() < end);
    expect(onA).toBe(401);
    expect((await call(a.url, cookie, "GET", "/api/v1/builds", undefined, origin)).status).toBe(
      401,
    );
  });

  it("the sign-in limits hold across both instances, and no X-Forwarded-For value buys an attempt", async () => {
    const wrong = "wrong-password-123";
    const nobody = (i: number) => `nobody-${i}-${Date.now()}@limits.fuelwright.test`;
    // One address (127.0.0.2 on the socket), alternating instances, a new forwarded address and
    // a new account each time: three attempts in ten seconds, all told.
    const byAddress: number[] = [];
    for (let i = 0; i < 5; i++)
      byAddress.push(
        await signInFrom([a, b][i % 2]!.url, "127.0.0.2", nobody(i), wrong, {
          "x-forwarded-for": `203.0.113.${i + 1}`,
          "x-real-ip": `198.51.100.${i + 1}`,
          // The server's own header for the address: a client's value is replaced.
          "x-fuelwright-client-address": `192.0.2.${i + 1}`,
        }),
      );
    expect(byAddress, byAddress.join()).toEqual([401, 401, 401, 429, 429]);
    // Another address on the socket has its own allowance.
    expect(await signInFrom(b.url, "127.0.0.3", nobody(9), wrong)).toBe(401);
    // One account from six addresses across both instances: five failures a minute, all told.
    const email = nobody(10);
    const byAccount: number[] = [];
    for (let i = 0; i < 6; i++)
      byAccount.push(await signInFrom([a, b][i % 2]!.url, `127.0.0.${10 + i}`, email, wrong));
    expect(byAccount, byAccount.join()).toEqual([401, 401, 401, 401, 401, 429]);
    // The counters are rows of the one database, not memory of either instance.
    const rows = await sql`select key, count from rate_limits where key in ${sql([
      "127.0.0.2|/sign-in/email",
      `account:${email}|/sign-in/email`,
    ])} order by key`;
    expect(rows).toEqual([
      { key: "127.0.0.2|/sign-in/email", count: 5 },
      { key: `account:${email}|/sign-in/email`, count: 6 },
    ]);
  });

  it("an instance whose webhook or auth secret is left at a default refuses to start, saying which", async () => {
    for (const [name, value] of [
      ["STRIPE_WEBHOOK_SECRET", "whsec_fuelwright_local_fake"],
      ["BETTER_AUTH_SECRET", "test-secret-test-secret-test-secret-0123"],
    ] as const) {
      await expect(startApp(3204, { [name]: value })).rejects.toThrow(
        new RegExp(`exited: [\\s\\S]*${name} is a default or placeholder value`),
      );
    }
  }, 90_000);

  it("with an https address the session cookie is Secure (and __Secure- prefixed), HttpOnly and SameSite", async () => {
    const c = await startApp(3203, { APP_URL: "https://fuelwright.example.test" });
    try {
      const { setCookie } = await signInAt(
        c.url,
        "counter@demo.fuelwright.test",
        "fuelwright-demo",
        "https://fuelwright.example.test",
      );
      const session = setCookie.find((x) => /session_token=/.test(x))!;
      expect(session).toMatch(/^__Secure-/);
      expect(session).toMatch(/;\s*Secure/i);
      expect(session).toMatch(/;\s*HttpOnly/i);
      expect(session).toMatch(/;\s*SameSite=Lax/i);
    } finally {
      await c.stop();
    }
  }, 90_000);
});
