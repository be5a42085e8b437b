import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { makeOtherShop, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";

let tuner: Client, customer: Client, outsider: Client;
beforeAll(async () => {
  const other = await makeOtherShop();
  [tuner, customer, outsider] = await Promise.all([
    signIn("tuner@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
});
afterAll(async () => {
  await sql.end();
});

describe("spec sheet route", () => {
  it("serves a PDF of the latest or a named revision; a customer gets only their own; another shop nothing", async () => {
    const [own] =
      await sql`select b.id, b.title from builds b join customers c on c.id = b.customer_id where c.user_id = 'demo-user-customer' order by b.created_at limit 1`;
    const [notOwn] =
      await sql`select b.id from builds b join customers c on c.id = b.customer_id where c.user_id is null and b.shop_id = 'demo-shop-ridgeback' limit 1`;
    expect(own && notOwn).toBeTruthy();
    const staff = await request(tuner, "GET", `/api/v1/builds/${own!.id}/spec-sheet?version=1`);
    expect(staff.status).toBe(200);
    expect(staff.headers.get("content-type")).toBe("application/pdf");
    expect(staff.text.startsWith("%PDF-")).toBe(true);
    expect((await request(customer, "GET", `/api/v1/builds/${own!.id}/spec-sheet`)).status).toBe(
      200,
    );
    expect((await request(customer, "GET", `/api/v1/builds/${notOwn!.id}/spec-sheet`)).status).toBe(
      404,
    );
    expect((await request(outsider, "GET", `/api/v1/builds/${own!.id}/spec-sheet`)).status).toBe(
      404,
    );
    expect((await request(null, "GET", `/api/v1/builds/${own!.id}/spec-sheet`)).status).toBe(401);
    expect(
      (await request(tuner, "GET", `/api/v1/builds/${own!.id}/spec-sheet?version=999`)).status,
    ).toBe(404);
    const bad = await request(tuner, "GET", `/api/v1/builds/${own!.id}/spec-sheet?version=abc`);
    expect(bad.status).toBe(422);
    expect(bad.json.error.issues[0].path).toBe("version");
  });
});
