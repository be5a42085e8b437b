import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { call, freshDatabase, signInAt, sqlFor, startApp, type App } from "../helpers/system";

/**
 * docs/architecture.md's claim, tested: app instances are stateless — sessions live in the
 * database — so a load balancer may send any request to any instance.
 */
let a: App, b: App;
let sql: ReturnType<typeof sqlFor>;
beforeAll(async () => {
  const url = freshDatabase();
  sql = sqlFor(url);
  // Both instances answer for one public address, as they would behind a load balancer.
  [a, b] = await Promise.all([
    startApp(3201, { APP_URL: "http://127.0.0.1:3201" }),
    startApp(3202, { APP_URL: "http://127.0.0.1:3201" }),
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
    // Signing out on B ends the session everywhere.
    expect((await call(b.url, cookie, "POST", "/api/auth/sign-out", {}, origin)).status).toBe(200);
    expect((await call(a.url, cookie, "GET", "/api/v1/builds", undefined, origin)).status).toBe(
      401,
    );
  });

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
