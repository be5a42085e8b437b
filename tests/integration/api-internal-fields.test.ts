import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";

/**
 * Columns that are the server's own business: the search column the triggers keep, the kit's
 * basis, where a dyno file is stored, share-link and payment secrets. No API answer carries them,
 * to staff or to the customer.
 */
const INTERNAL = [
  "searchText",
  "search_text",
  "kitBasis",
  "kit_basis",
  "objectKey",
  "tokenHash",
  "checkoutSessionId",
  "paidEventId",
  "passwordHash",
];

/** Every key anywhere in a JSON answer, with where it was found. */
function keysOf(v: unknown, at = "$"): string[] {
  if (Array.isArray(v)) return v.flatMap((x, i) => keysOf(x, `${at}[${i}]`));
  if (v && typeof v === "object")
    return Object.entries(v).flatMap(([k, x]) => [`${at}.${k}`, ...keysOf(x, `${at}.${k}`)]);
  return [];
}
const internalIn = (json: unknown) =>
  keysOf(json).filter((p) => INTERNAL.includes(p.split(".").pop()!));

let owner: Client, customer: Client;
const BUILD = "10000000-0000-4000-8000-000000000002"; // demo turbo six (db/seed.ts)
const CUSTOMER = "00000000-0000-4000-8000-000000000001"; // the portal customer (db/seed.ts)

beforeAll(async () => {
  [owner, customer] = await Promise.all([
    signIn("owner@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
  ]);
});
afterAll(async () => {
  await sql.end();
});

describe("API answers carry no internal column", () => {
  it("the builds a customer reads (list and each build) have no searchText", async () => {
    const list = await request(customer, "GET", "/api/v1/builds");
    expect(list.status).toBe(200);
    expect(internalIn(list.json)).toEqual([]);
    const ids = (list.json.builds as { id: string }[]).map((b) => b.id);
    expect(ids.length).toBeGreaterThan(0);
    for (const id of ids) {
      const one = await request(customer, "GET", `/api/v1/builds/${id}`);
      expect(one.status).toBe(200);
      expect(one.json.build.title).toBeTruthy(); // not vacuous: the build is there
      expect(internalIn(one.json), id).toEqual([]);
    }
  });

  it("staff answers: reads and writes of builds, quotes, customers, parts and the shop", async () => {
    const gets = [
      "/api/v1/builds",
      `/api/v1/builds/${BUILD}`,
      `/api/v1/builds/${BUILD}/kit`,
      `/api/v1/builds/${BUILD}/revisions`,
      `/api/v1/builds/${BUILD}/share-links`,
      `/api/v1/builds/${BUILD}/datalogs`,
      "/api/v1/quotes",
      "/api/v1/customers",
      `/api/v1/customers/${CUSTOMER}`,
      "/api/v1/parts",
      "/api/v1/shop/settings",
    ];
    for (const path of gets) {
      const r = await request(owner, "GET", path);
      expect(r.status, path).toBe(200);
      expect(internalIn(r.json), path).toEqual([]);
    }
    const quotes = (await request(owner, "GET", "/api/v1/quotes")).json.quotes as { id: string }[];
    const quote = await request(owner, "GET", `/api/v1/quotes/${quotes[0]!.id}`);
    expect(internalIn(quote.json)).toEqual([]);

    // Writes answer with the record: a new build, its save and a share link.
    const made = await request(owner, "POST", "/api/v1/builds", {
      customerId: CUSTOMER,
      title: `Internal fields ${Date.now()}`,
    });
    expect(made.status).toBe(201);
    expect(made.json.build.id).toBeTruthy();
    expect(internalIn(made.json)).toEqual([]);
    const id = made.json.build.id as string;
    // The column is there in the database: what the API leaves out.
    const [row] = await sql`select search_text from builds where id = ${id}`;
    expect(row!.search_text).toContain("internal fields");
    const savedBuild = await request(owner, "PATCH", `/api/v1/builds/${id}`, {
      version: made.json.build.version,
      title: `Internal fields renamed ${Date.now()}`,
    });
    expect(savedBuild.status).toBe(200);
    expect(internalIn(savedBuild.json)).toEqual([]);
    const link = await request(owner, "POST", `/api/v1/builds/${id}/share-links`, { days: 1 });
    expect(link.status).toBe(201);
    expect(internalIn(link.json)).toEqual([]);
  });
});
