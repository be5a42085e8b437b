import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";
import { waitForMail } from "../helpers/mail";

const DEMO_SHOP = "demo-shop-ridgeback";
let owner: Client, tuner: Client, counter: Client, customer: Client, outsider: Client;
let demoCustomerId: string;

beforeAll(async () => {
  const other = await makeOtherShop();
  [owner, tuner, counter, customer, outsider] = await Promise.all([
    signIn("owner@demo.fuelwright.test"),
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
  const [row] =
    await sql`select id from customers where shop_id = ${DEMO_SHOP} order by name limit 1`;
  demoCustomerId = row!.id;
});
afterAll(async () => {
  await sql.end();
});

describe("tenancy: a member of shop B cannot see or touch shop A's customers", () => {
  it("lists only its own shop's customers", async () => {
    const r = await request(outsider, "GET", "/api/v1/customers");
    expect(r.status).toBe(200);
    expect(r.json.customers).toEqual([]);
    const mine = await request(owner, "GET", "/api/v1/customers");
    expect(mine.json.customers.length).toBeGreaterThanOrEqual(5);
  });

  it("gets 404 for another shop's customer on read, write and delete, and nothing changes", async () => {
    const before = await fingerprint(["customers"]);
    expect((await request(outsider, "GET", `/api/v1/customers/${demoCustomerId}`)).status).toBe(
      404,
    );
    expect(
      (
        await request(outsider, "PATCH", `/api/v1/customers/${demoCustomerId}`, {
          name: "Taken over",
        })
      ).status,
    ).toBe(404);
    expect((await request(outsider, "DELETE", `/api/v1/customers/${demoCustomerId}`)).status).toBe(
      404,
    );
    expect(await fingerprint(["customers"])).toBe(before);
  });

  it("PATCH changes only the fields sent; an empty string clears one; an empty body is a 422 (common practice, no source)", async () => {
    const made = await request(outsider, "POST", "/api/v1/customers", {
      name: "Partial Patch",
      email: "partial@example.test",
      phone: "201-555-0100",
    });
    const id = made.json.customer.id;
    const renamed = await request(outsider, "PATCH", `/api/v1/customers/${id}`, {
      name: "Partial Patch Renamed",
    });
    expect(renamed.status).toBe(200);
    expect(renamed.json.customer).toMatchObject({
      name: "Partial Patch Renamed",
      email: "partial@example.test",
      phone: "+12015550100",
    });
    const cleared = await request(outsider, "PATCH", `/api/v1/customers/${id}`, { phone: "" });
    expect(cleared.json.customer).toMatchObject({
      name: "Partial Patch Renamed",
      email: "partial@example.test",
      phone: null,
    });
    const empty = await request(outsider, "PATCH", `/api/v1/customers/${id}`, {});
    expect(empty.status).toBe(422);
    expect(empty.json.error.issues[0].path).toBe("(body)");
    const blankName = await request(outsider, "PATCH", `/api/v1/customers/${id}`, { name: " " });
    expect(blankName.status).toBe(422);
    expect(blankName.json.error.issues[0].path).toBe("name");
  });

  it("creates a customer in its own shop only", async () => {
    const r = await request(outsider, "POST", "/api/v1/customers", { name: "Only Mine" });
    expect(r.status).toBe(201);
    const [row] = await sql`select shop_id from customers where id = ${r.json.customer.id}`;
    expect(row!.shop_id).not.toBe(DEMO_SHOP);
  });
});

describe("roles", () => {
  it("signed out: API 401, pages redirect to sign-in", async () => {
    expect((await request(null, "GET", "/api/v1/customers")).status).toBe(401);
    const page = await request(null, "GET", "/customers");
    expect(page.status).toBe(307);
    expect(page.headers.get("location")).toContain("/sign-in");
  });

  it("a customer sees none of the staff pages or data", async () => {
    for (const path of ["/builds", "/customers", "/settings", "/parts", "/quotes", "/tools"]) {
      const r = await request(customer, "GET", path);
      expect(r.status, path).toBe(307);
      expect(r.headers.get("location"), path).toMatch(/\/my$/);
    }
    expect((await request(customer, "GET", "/api/v1/customers")).status).toBe(403);
    expect((await request(customer, "GET", "/my")).status).toBe(200);
  });

  it("staff do not get the customer portal", async () => {
    const r = await request(tuner, "GET", "/my");
    expect(r.status).toBe(307);
  });

  it("a tuner or counter cannot invite, change roles or remove members, and nothing changes", async () => {
    const [m] =
      await sql`select id from member where organization_id = ${DEMO_SHOP} and role = 'customer' limit 1`;
    const before = await fingerprint(["member", "invitation"]);
    for (const who of [tuner, counter]) {
      const invite = await request(who, "POST", "/api/auth/organization/invite-member", {
        email: "sneaky@example.test",
        role: "owner",
        organizationId: DEMO_SHOP,
      });
      expect(invite.status).toBeGreaterThanOrEqual(400);
      expect(invite.status).toBeLessThan(500);
      const role = await request(who, "POST", "/api/auth/organization/update-member-role", {
        memberId: m!.id,
        role: "owner",
        organizationId: DEMO_SHOP,
      });
      expect(role.status).toBeGreaterThanOrEqual(400);
      const remove = await request(who, "POST", "/api/auth/organization/remove-member", {
        memberIdOrEmail: m!.id,
        organizationId: DEMO_SHOP,
      });
      expect(remove.status).toBeGreaterThanOrEqual(400);
    }
    expect(await fingerprint(["member", "invitation"])).toBe(before);
  });

  it("an owner's invitation records the role and e-mails a link", async () => {
    const email = `new-counter-${Date.now()}@example.test`;
    const r = await request(owner, "POST", "/api/auth/organization/invite-member", {
      email,
      role: "counter",
      organizationId: DEMO_SHOP,
    });
    expect(r.status).toBe(200);
    const [inv] = await sql`select id, role, status from invitation where email = ${email}`;
    expect(inv).toMatchObject({ role: "counter", status: "pending" });
    const mail = await waitForMail(email, /invites you/);
    expect(mail.text).toContain(`/accept-invitation/${inv!.id}`);
    expect(mail.text).toMatch(/as Counter/);
  });
});

describe("customers API input", () => {
  it("rejects bad input with the field path and keeps the data", async () => {
    const before = await fingerprint(["customers"]);
    const r = await request(counter, "POST", "/api/v1/customers", {
      name: "",
      email: "not-an-email",
    });
    expect(r.status).toBe(422);
    const paths = r.json.error.issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(["name", "email"]));
    const json = { "content-type": "application/json" };
    expect((await request(counter, "POST", "/api/v1/customers", "{not json", json)).status).toBe(
      400,
    );
    // A cross-site form can only send text/plain: JSON must say it is JSON.
    const plain = { "content-type": "text/plain" };
    const asText = await request(counter, "POST", "/api/v1/customers", '{"name":"X"}', plain);
    expect(asText.status).toBe(415);
    expect((await request(counter, "GET", "/api/v1/customers/not-a-uuid")).status).toBe(404);
    expect(await fingerprint(["customers"])).toBe(before);
  });
});
