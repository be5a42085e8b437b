import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { makeOtherShop, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";

let counter: Client, customer: Client, outsider: Client;
const demo: Record<string, string> = {};

beforeAll(async () => {
  const other = await makeOtherShop();
  [counter, customer, outsider] = await Promise.all([
    signIn("counter@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
  for (const table of ["builds", "customers", "parts", "quotes"] as const) {
    const [row] =
      await sql`select id from ${sql(table)} where shop_id = 'demo-shop-ridgeback' limit 1`;
    demo[table] = row!.id;
  }
});
afterAll(async () => {
  await sql.end();
});

// Next 16 renders a page's notFound() in the browser from the RSC payload inlined in the HTML
// (the HTML itself is an empty error shell with the 404), so the texts are looked for there.
// What a person may type into the address bar: not a UUID at all, the nil UUID (well-formed,
// no such row) and 36 hex digits without dashes (the old pattern let these reach PostgreSQL).
const TYPED = ["zzz", "00000000-0000-0000-0000-000000000000", "f".repeat(36)];

const RESOURCES = [
  { path: "/builds/:id", text: "Build not found", back: "Back to the builds", table: "builds" },
  { path: "/builds/:id/kit", text: "Build not found", back: "Back to the builds", table: "builds" },
  {
    path: "/builds/:id/dyno",
    text: "Build not found",
    back: "Back to the builds",
    table: "builds",
  },
  {
    path: "/builds/:id/compare",
    text: "Build not found",
    back: "Back to the builds",
    table: "builds",
  },
  {
    path: "/builds/:id/revisions/1",
    text: "Revision not found",
    back: "Back to the builds",
    table: "builds",
  },
  {
    path: "/customers/:id",
    text: "Customer not found",
    back: "Back to the customers",
    table: "customers",
  },
  { path: "/parts/:id", text: "Part not found", back: "Back to the catalog", table: "parts" },
  { path: "/quotes/:id", text: "Quote not found", back: "Back to the quotes", table: "quotes" },
] as const;

describe("typed-in ids that name nothing", () => {
  for (const r of RESOURCES) {
    it(`${r.path}: each bad id is the resource's not-found page with a 404`, async () => {
      for (const id of TYPED) {
        const res = await request(counter, "GET", r.path.replace(":id", id));
        expect(res.status, `${r.path} with ${id}`).toBe(404);
        expect(res.text).toContain(r.text);
        expect(res.text).toContain(r.back);
        expect(res.text).not.toMatch(/invalid input syntax|PostgresError|at async /);
      }
    });
  }

  it("another shop's real records read as not found too", async () => {
    for (const r of RESOURCES) {
      const res = await request(outsider, "GET", r.path.replace(":id", demo[r.table]!));
      expect(res.status, r.path).toBe(404);
      expect(res.text).toContain(r.text);
    }
  });

  it("a revision number the build does not have is the revision's not-found page", async () => {
    for (const v of ["0", "abc", "99999"]) {
      const res = await request(counter, "GET", `/builds/${demo.builds}/revisions/${v}`);
      expect(res.status).toBe(404);
      expect(res.text).toContain("Revision not found");
    }
  });

  it("a customer's portal quote: a bad id is the portal's quote not-found page", async () => {
    for (const id of TYPED) {
      const res = await request(customer, "GET", `/my/quotes/${id}`);
      expect(res.status).toBe(404);
      expect(res.text).toContain("Quote not found");
      expect(res.text).toContain("Back to my builds and quotes");
    }
  });

  it("a share link that was never made is the share route's not-found page", async () => {
    for (const token of ["zzz", "f".repeat(36), `${"a".repeat(43)}.${"b".repeat(22)}`]) {
      const res = await request(null, "GET", `/share/${token}`);
      expect(res.status).toBe(404);
      expect(res.text).toContain("Share link not found");
      expect(res.text).toContain("This link is not valid");
    }
  });
});
