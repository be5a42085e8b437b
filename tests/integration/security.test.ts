import { afterAll, describe, expect, it } from "vitest";

import { makeOtherShop, sql } from "../helpers/db";
import { BASE_URL, nextIp, request, signIn } from "../helpers/http";
import { firstLink, waitForMail } from "../helpers/mail";

afterAll(async () => {
  await sql.end();
});

const directives = (csp: string) =>
  Object.fromEntries(
    csp
      .split(";")
      .map((d) => d.trim().split(/\s+/))
      .map(([k, ...v]) => [k!, v]),
  );

// The headers' meanings: CSP Level 3 (W3C), RFC 7034 (X-Frame-Options), Fetch standard (nosniff),
// Referrer Policy (W3C); the expectations are common practice, no source.
describe("security headers", () => {
  it("pages carry a nonce CSP with no inline scripts allowed, and the nonce is on the page's scripts", async () => {
    const res = await fetch(`${BASE_URL}/sign-in`);
    expect(res.status).toBe(200);
    const csp = res.headers.get("content-security-policy") ?? "";
    const d = directives(csp);
    const nonce = d["script-src"]!.find((s) => s.startsWith("'nonce-"))!.slice(7, -1);
    expect(nonce.length).toBeGreaterThanOrEqual(16);
    expect(d["script-src"]).not.toContain("'unsafe-inline'");
    expect(d["frame-ancestors"]).toEqual(["'none'"]);
    expect(d["object-src"]).toEqual(["'none'"]);
    const html = await res.text();
    const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
    expect(scripts.length).toBeGreaterThan(0);
    for (const s of scripts) expect(s).toContain(`nonce="${nonce}"`);
    // A fresh nonce per request.
    const again = (await fetch(`${BASE_URL}/sign-in`)).headers.get("content-security-policy");
    expect(again).not.toBe(csp);
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(res.headers.get("referrer-policy")).toBe("strict-origin-when-cross-origin");
    expect(res.headers.get("x-frame-options")).toBe("DENY");
  });

  it("API responses, JSON and PDF alike, are not framed, sniffed or run", async () => {
    for (const path of ["/api/health", "/api/v1/builds"]) {
      const res = await fetch(`${BASE_URL}${path}`);
      expect(res.headers.get("x-content-type-options"), path).toBe("nosniff");
      expect(res.headers.get("content-security-policy"), path).toMatch(
        /default-src 'none'.*frame-ancestors 'none'/,
      );
      expect(res.headers.get("referrer-policy"), path).toBe("strict-origin-when-cross-origin");
    }
  });
});

describe("sessions", () => {
  it("the session cookie is HttpOnly and SameSite=Lax (Secure comes with an https address: tests/system)", async () => {
    const res = await fetch(`${BASE_URL}/api/auth/sign-in/email`, {
      method: "POST",
      headers: {
        "content-type": "application/json",
        origin: BASE_URL,
        "x-forwarded-for": nextIp(),
      },
      body: JSON.stringify({ email: "counter@demo.fuelwright.test", password: "fuelwright-demo" }),
    });
    expect(res.status).toBe(200);
    const session = res.headers.getSetCookie().find((c) => /session_token=/.test(c))!;
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
    expect(session).toMatch(/;\s*Path=\//i);
  });

  it("a password-reset link works once", async () => {
    const u = await makeOtherShop();
    const ip = nextIp();
    const post = (path: string, body: unknown) =>
      fetch(`${BASE_URL}/api/auth${path}`, {
        method: "POST",
        headers: { "content-type": "application/json", origin: BASE_URL, "x-forwarded-for": ip },
        body: JSON.stringify(body),
      });
    expect(
      (await post("/request-password-reset", { email: u.email, redirectTo: "/reset-password" }))
        .status,
    ).toBe(200);
    const mail = await waitForMail(u.email, /Reset your Fuelwright password/);
    // The link goes through the auth server, which redirects to the page with ?token=.
    const hop = await fetch(firstLink(mail.text), { redirect: "manual" });
    const token = new URL(hop.headers.get("location")!, BASE_URL).searchParams.get("token")!;
    expect(token).toBeTruthy();
    expect(
      (await post("/reset-password", { token, newPassword: "a-brand-new-pass-1" })).status,
    ).toBe(200);
    expect(
      (await post("/reset-password", { token, newPassword: "another-new-pass-2" })).status,
    ).toBe(400);
    // The first new password is the one that holds.
    await expect(signIn(u.email, "a-brand-new-pass-1")).resolves.toBeTruthy();
    await expect(signIn(u.email, "another-new-pass-2")).rejects.toThrow();
  });

  it("a password reset ends every session opened before it", async () => {
    const u = await makeOtherShop();
    const [laptop, phone] = [await signIn(u.email, u.password), await signIn(u.email, u.password)];
    for (const s of [laptop, phone])
      expect((await request(s, "GET", "/api/v1/builds")).status).toBe(200);
    const ip = nextIp();
    const post = (path: string, body: unknown) =>
      fetch(`${BASE_URL}/api/auth${path}`, {
        method: "POST",
        headers: { "content-type": "application/json", origin: BASE_URL, "x-forwarded-for": ip },
        body: JSON.stringify(body),
      });
    await post("/request-password-reset", { email: u.email, redirectTo: "/reset-password" });
    const mail = await waitForMail(u.email, /Reset your Fuelwright password/);
    const hop = await fetch(firstLink(mail.text), { redirect: "manual" });
    const token = new URL(hop.headers.get("location")!, BASE_URL).searchParams.get("token")!;
    expect((await post("/reset-password", { token, newPassword: "reset-pass-333" })).status).toBe(
      200,
    );
    for (const s of [laptop, phone]) {
      expect((await request(s, "GET", "/api/v1/builds")).status).toBe(401);
      const session = await request(s, "GET", "/api/auth/get-session");
      expect(session.json).toBeNull();
    }
    expect(
      (await sql`select count(*)::int as n from session where user_id = ${u.userId}`)[0]!.n,
    ).toBe(0);
    // The new password opens a new session.
    const fresh = await signIn(u.email, "reset-pass-333");
    expect((await request(fresh, "GET", "/api/v1/builds")).status).toBe(200);
  });
});
