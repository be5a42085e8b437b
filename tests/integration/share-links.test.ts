import { afterAll, beforeAll, describe, expect, it } from "vitest";

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
      expect(r.status).toBe(404);
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
