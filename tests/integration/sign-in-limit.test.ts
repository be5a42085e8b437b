import { randomUUID } from "node:crypto";

import { afterAll, describe, expect, it } from "vitest";

import { actionManifest, callAction, formOf } from "../helpers/actions";
import { makeOtherShop, sql } from "../helpers/db";
import { BASE_URL, nextIp } from "../helpers/http";

/**
 * The sign-in and sign-up limits (lib/auth/auth-hooks.ts, counters in PostgreSQL). The test
 * server trusts X-Forwarded-For as a proxy's header (scripts/test-env.vars), so each test client
 * names its own address there; tests/system/scale-out.test.ts proves that without a trusted
 * proxy the header is ignored altogether, and that the counters hold across two instances.
 */

afterAll(async () => {
  await sql.end();
});

const nobody = () => `nobody-${randomUUID().slice(0, 8)}@limits.fuelwright.test`;

async function signInAs(email: string, password: string, forwardedFor: string) {
  const res = await fetch(`${BASE_URL}/api/auth/sign-in/email`, {
    method: "POST",
    headers: {
      "content-type": "application/json",
      origin: BASE_URL,
      "x-forwarded-for": forwardedFor,
    },
    body: JSON.stringify({ email, password }),
  });
  return res.status;
}

describe("sign-in rate limit", () => {
  it("refuses the fourth sign-in from one address within ten seconds", async () => {
    const ip = nextIp();
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) statuses.push(await signInAs(nobody(), "wrong-password-123", ip));
    expect(statuses.slice(0, 3), statuses.join()).toEqual([401, 401, 401]);
    expect(statuses[3]).toBe(429);
  });

  it("a new X-Forwarded-For value buys no attempts on an account: the sixth failure within a minute is refused from any address", async () => {
    const email = nobody();
    const statuses: number[] = [];
    for (let i = 0; i < 7; i++)
      statuses.push(await signInAs(email, "wrong-password-123", nextIp()));
    expect(statuses, statuses.join()).toEqual([401, 401, 401, 401, 401, 429, 429]);
    const [row] =
      await sql`select count, resets_at > now() as open from rate_limits where key = ${`account:${email}|/sign-in/email`}`;
    expect(row).toMatchObject({ count: 7, open: true });
  });

  it("addresses a client writes before the proxy's own are not believed", async () => {
    const proxied = nextIp();
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++)
      statuses.push(await signInAs(nobody(), "wrong-password-123", `${nextIp()}, ${proxied}`));
    expect(statuses, statuses.join()).toEqual([401, 401, 401, 429]);
  });

  it("only failures count against an account: its owner signs in after failures, until the failures reach the limit", async () => {
    const u = await makeOtherShop();
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++)
      statuses.push(await signInAs(u.email, "wrong-password-123", nextIp()));
    for (let i = 0; i < 3; i++) statuses.push(await signInAs(u.email, u.password, nextIp()));
    statuses.push(await signInAs(u.email, "wrong-password-123", nextIp()));
    statuses.push(await signInAs(u.email, u.password, nextIp()));
    expect(statuses, statuses.join()).toEqual([401, 401, 401, 401, 200, 200, 200, 401, 429]);
  });
});

describe("sign-up rate limit", () => {
  it("the sign-up page's server action counts against the same limit as the HTTP endpoint", async () => {
    const ref = actionManifest().find(
      (r) => r.file === "app/(auth)/actions.ts" && r.name === "signUpAction",
    );
    expect(ref, "signUpAction is in the build's manifest").toBeTruthy();
    const ip = nextIp();
    const emails = [nobody(), nobody(), nobody(), nobody()];
    const http = (email: string) =>
      fetch(`${BASE_URL}/api/auth/sign-up/email`, {
        method: "POST",
        headers: { "content-type": "application/json", origin: BASE_URL, "x-forwarded-for": ip },
        body: JSON.stringify({ name: "Limit Test", email, password: "a-long-password-1" }),
      });
    const viaAction = (email: string) =>
      callAction({ cookie: "", ip }, { ...ref!, page: "/sign-up" }, [
        { ok: false },
        formOf({
          name: "Limit Test",
          shopName: "Limit Shop",
          email,
          password: "a-long-password-1",
        }),
      ]);
    expect((await http(emails[0]!)).status).toBe(200);
    expect((await http(emails[1]!)).status).toBe(200);
    const third = await viaAction(emails[2]!);
    expect(third.redirect, JSON.stringify(third)).toContain("/check-email");
    const fourth = await viaAction(emails[3]!);
    expect(fourth.http).toBeLessThan(500);
    expect(fourth.state).toMatchObject({ ok: false, status: 429 });
    const made = await sql`select email from "user" where email in ${sql(emails)} order by email`;
    expect(made.map((r) => r.email).sort()).toEqual(emails.slice(0, 3).sort());
    // Another address is not held back.
    const elsewhere = nobody();
    const other = await callAction({ cookie: "", ip: nextIp() }, { ...ref!, page: "/sign-up" }, [
      { ok: false },
      formOf({
        name: "Limit Test",
        shopName: "Limit Shop",
        email: elsewhere,
        password: "a-long-password-1",
      }),
    ]);
    expect(other.redirect).toContain("/check-email");
  });
});
