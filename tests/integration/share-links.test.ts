import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { actionManifest, callAction } from "../helpers/actions";
import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";

let counter: Client, customer: Client, outsider: Client;
const BUILD = "10000000-0000-4000-8000-000000000003"; // demo twin-turbo V8 (db/seed.ts)

beforeAll(async () => {
  const other = await makeOtherShop();
  [counter, customer, outsider] = await Promise.all([
    signIn("counter@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
});
afterAll(async () => {
  await sql.end();
});

const path = (url: string) => new URL(url).pathname;

describe("share links", () => {
  it("a link opens the spec sheet without an account; only the hash is stored", async () => {
    const made = await request(counter, "POST", `/api/v1/builds/${BUILD}/share-links`, { days: 7 });
    expect(made.status).toBe(201);
    const token = path(made.json.url).split("/")[2]!;
    const [row] = await sql`select token_hash from share_links where id = ${made.json.link.id}`;
    expect(row!.token_hash).not.toContain(token.slice(0, 20));
    expect(row!.token_hash).toMatch(/^[0-9a-f]{64}$/);
    const page = await request(null, "GET", path(made.json.url));
    expect(page.status).toBe(200);
    expect(page.text).toContain("Twin-turbo V8");
    const pdf = await request(null, "GET", `${path(made.json.url)}/pdf`);
    expect(pdf.status).toBe(200);
    expect(pdf.headers.get("content-type")).toBe("application/pdf");
  });

  it("tampered, expired and revoked links are refused with a clear page and no data", async () => {
    const made = await request(counter, "POST", `/api/v1/builds/${BUILD}/share-links`, { days: 7 });
    const p = path(made.json.url);
    const token = p.split("/")[2]!;
    const tampered = `/share/${token.slice(0, -1)}${token.endsWith("A") ? "B" : "A"}`;
    for (const bad of [tampered, "/share/nonsense", `/share/${"x".repeat(200)}.y`]) {
      const r = await request(null, "GET", bad);
      expect(r.status).toBe(200);
      expect(r.text).toContain("This link is not valid");
      expect(r.text).not.toContain("Twin-turbo V8");
      expect((await request(null, "GET", `${bad}/pdf`)).status).toBe(404);
    }
    await sql`update share_links set expires_at = now() - interval '1 minute' where id = ${made.json.link.id}`;
    expect((await request(null, "GET", p)).text).toContain("This link has expired");
    expect((await request(null, "GET", `${p}/pdf`)).status).toBe(404);
    const fresh = await request(counter, "POST", `/api/v1/builds/${BUILD}/share-links`, {
      days: 1,
    });
    expect(
      (await request(counter, "DELETE", `/api/v1/share-links/${fresh.json.link.id}`)).status,
    ).toBe(204);
    const revoked = await request(null, "GET", path(fresh.json.url));
    expect(revoked.text).toContain("withdrawn by the shop");
    expect(revoked.text).not.toContain("Twin-turbo V8");
    expect((await request(null, "GET", `${path(fresh.json.url)}/pdf`)).status).toBe(404);
  });

  it("only staff of the shop make or withdraw links", async () => {
    const before = await fingerprint(["share_links"]);
    expect(
      (await request(customer, "POST", `/api/v1/builds/${BUILD}/share-links`, { days: 7 })).status,
    ).toBe(403);
    expect(
      (await request(outsider, "POST", `/api/v1/builds/${BUILD}/share-links`, { days: 7 })).status,
    ).toBe(404);
    expect(
      (await request(counter, "POST", `/api/v1/builds/${BUILD}/share-links`, { days: 365 })).status,
    ).toBe(422);
    const [any] = await sql`select id from share_links limit 1`;
    expect((await request(outsider, "DELETE", `/api/v1/share-links/${any!.id}`)).status).toBe(404);
    expect(await fingerprint(["share_links"])).toBe(before);
  });
});

describe("share links through the screen's actions", () => {
  const prev = { ok: false };
  type Made = { link: { id: string; expiresAt: string }; url: string };
  const act = async (who: Client, name: string, input: unknown) => {
    const ref = actionManifest().find(
      (r) => r.file === "lib/shares/share-actions.ts" && r.name === name,
    );
    expect(ref, `${name} is in the build's action manifest`).toBeTruthy();
    const r = await callAction(who, { ...ref!, page: `/builds/${BUILD}` }, [prev, input]);
    expect(r.http).toBeLessThan(500);
    return r.state as { ok: boolean; status?: number; data?: Made };
  };

  it("make and withdraw give the same result as the API", async () => {
    const api = await request(counter, "POST", `/api/v1/builds/${BUILD}/share-links`, { days: 7 });
    const viaAction = await act(counter, "createShareLinkAction", { buildId: BUILD, days: 7 });
    expect(api.status).toBe(201);
    expect(viaAction.ok).toBe(true);
    const made = viaAction.data!;
    // The same shape: { link: { id, expiresAt }, url }, a week ahead both.
    expect(Object.keys(made).sort()).toEqual(Object.keys(api.json).sort());
    expect(Object.keys(made.link).sort()).toEqual(Object.keys(api.json.link).sort());
    const week = Date.now() + 7 * 86_400_000;
    for (const m of [made, api.json as Made]) {
      expect(Math.abs(Date.parse(m.link.expiresAt) - week)).toBeLessThan(60_000);
      expect(path(m.url)).toMatch(/^\/share\/[\w-]+\.[\w-]+$/);
      const page = await request(null, "GET", path(m.url));
      expect(page.text).toContain("Twin-turbo V8");
    }
    const rows =
      await sql`select id, build_id, created_by is not null as by from share_links where id in ${sql([made.link.id, api.json.link.id])}`;
    expect(rows).toHaveLength(2);
    expect(rows.every((r) => r.build_id === BUILD && r.by)).toBe(true);

    // Each withdrawn the other way round.
    expect((await request(counter, "DELETE", `/api/v1/share-links/${made.link.id}`)).status).toBe(
      204,
    );
    expect(await act(counter, "revokeShareLinkAction", { id: api.json.link.id })).toMatchObject({
      ok: true,
    });
    for (const m of [made, api.json as Made])
      expect((await request(null, "GET", path(m.url))).text).toContain("withdrawn by the shop");
  });

  it("refuse the same callers the API refuses, and change nothing", async () => {
    const [any] = await sql`select id from share_links where build_id = ${BUILD} limit 1`;
    const before = await fingerprint(["share_links"]);
    for (const [who, status] of [
      [customer, 403],
      [outsider, 404],
    ] as const) {
      const api = await request(who, "POST", `/api/v1/builds/${BUILD}/share-links`, { days: 7 });
      const viaAction = await act(who, "createShareLinkAction", { buildId: BUILD, days: 7 });
      expect([api.status, viaAction.status]).toEqual([status, status]);
      const apiDel = await request(who, "DELETE", `/api/v1/share-links/${any!.id}`);
      const actDel = await act(who, "revokeShareLinkAction", { id: any!.id });
      expect([apiDel.status, actDel.status]).toEqual([status, status]);
    }
    const tooLong = await act(counter, "createShareLinkAction", { buildId: BUILD, days: 365 });
    expect(tooLong).toMatchObject({ ok: false, status: 422 });
    expect(await fingerprint(["share_links"])).toBe(before);
  });
});
