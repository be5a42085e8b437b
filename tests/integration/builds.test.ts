import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { boostedSix } from "../calc/fixtures";
import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";

let tuner: Client, counter: Client, customer: Client, outsider: Client;
let customerId: string;

beforeAll(async () => {
  const other = await makeOtherShop();
  [tuner, counter, customer, outsider] = await Promise.all([
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
  const [c] = await sql`select id from customers where shop_id = 'demo-shop-ridgeback' order by name limit 1`;
  customerId = c!.id;
});
afterAll(async () => {
  await sql.end();
});

async function newBuild(title = `Build ${Date.now()}`) {
  const r = await request(tuner, "POST", "/api/v1/builds", { customerId, title, inputs: boostedSix });
  expect(r.status).toBe(201);
  return r.json.build as { id: string; version: number };
}

describe("builds API", () => {
  it("creating a build sizes it on the server and records revision 1", async () => {
    const b = await newBuild();
    const got = await request(tuner, "GET", `/api/v1/builds/${b.id}`);
    expect(got.json.build.result.injector.dutyPct).toBeGreaterThan(0);
    const revs = await request(tuner, "GET", `/api/v1/builds/${b.id}/revisions`);
    expect(revs.json.revisions.map((r: { version: number }) => r.version)).toEqual([1]);
  });

  it("each save is a revision; a second save from the same version gets a conflict and the first survives", async () => {
    const b = await newBuild();
    const first = { ...boostedSix, target: { ...boostedSix.target, powerKw: 500 } };
    const second = { ...boostedSix, target: { ...boostedSix.target, powerKw: 300 } };
    const a = await request(tuner, "PATCH", `/api/v1/builds/${b.id}`, { version: 1, inputs: first, note: "more power" });
    expect(a.status).toBe(200);
    expect(a.json.build.version).toBe(2);
    const stale = await request(tuner, "PATCH", `/api/v1/builds/${b.id}`, { version: 1, inputs: second });
    expect(stale.status).toBe(409);
    expect(stale.json.current.version).toBe(2);
    const [row] = await sql`select version, inputs->'target'->>'powerKw' as kw from builds where id = ${b.id}`;
    expect(row).toMatchObject({ version: 2, kw: "500" });
    const [{ n }] = (await sql`select count(*)::int as n from build_revisions where build_id = ${b.id}`) as unknown as [{ n: number }];
    expect(n).toBe(2);
  });

  it("moves status only along the workflow", async () => {
    const b = await newBuild();
    const skip = await request(tuner, "PATCH", `/api/v1/builds/${b.id}`, { version: 1, inputs: boostedSix, status: "verified" });
    expect(skip.status).toBe(422);
    const ok = await request(tuner, "PATCH", `/api/v1/builds/${b.id}`, { version: 1, inputs: boostedSix, status: "sized" });
    expect(ok.status).toBe(200);
    expect(ok.json.build.status).toBe("sized");
  });

  it("bad input gets field errors and writes nothing", async () => {
    const b = await newBuild();
    const before = await fingerprint(["builds", "build_revisions"]);
    const r = await request(tuner, "PATCH", `/api/v1/builds/${b.id}`, { version: 1, inputs: { ...boostedSix, injectors: { ...boostedSix.injectors, count: 0 } } });
    expect(r.status).toBe(422);
    expect(r.json.error.issues.map((i: { path: string }) => i.path)).toContain("inputs.injectors.count");
    expect((await request(tuner, "POST", "/api/v1/builds", { customerId: "not-a-uuid", title: "" })).status).toBe(422);
    expect(await fingerprint(["builds", "build_revisions"])).toBe(before);
  });

  it("the counter reads but cannot write; a customer and another shop get nothing", async () => {
    const b = await newBuild();
    const before = await fingerprint(["builds", "build_revisions"]);
    expect((await request(counter, "GET", `/api/v1/builds/${b.id}`)).status).toBe(200);
    expect((await request(counter, "PATCH", `/api/v1/builds/${b.id}`, { version: 1, inputs: boostedSix })).status).toBe(403);
    expect((await request(customer, "GET", "/api/v1/builds")).status).toBe(403);
    expect((await request(outsider, "GET", `/api/v1/builds/${b.id}`)).status).toBe(404);
    expect((await request(outsider, "PATCH", `/api/v1/builds/${b.id}`, { version: 1, inputs: boostedSix })).status).toBe(404);
    expect((await request(outsider, "POST", "/api/v1/builds", { customerId, title: "Not yours" })).status).toBe(422);
    const list = await request(outsider, "GET", "/api/v1/builds");
    expect(list.json.builds).toEqual([]);
    expect(await fingerprint(["builds", "build_revisions"])).toBe(before);
  });

  it("searches and pages with a cursor", async () => {
    const tag = `Pager${Date.now()}`;
    for (let i = 0; i < 3; i++) await newBuild(`${tag} ${i}`);
    const p1 = await request(tuner, "GET", `/api/v1/builds?q=${tag}&limit=2`);
    expect(p1.json.builds).toHaveLength(2);
    expect(p1.json.nextCursor).toBeTruthy();
    const p2 = await request(tuner, "GET", `/api/v1/builds?q=${tag}&limit=2&cursor=${encodeURIComponent(p1.json.nextCursor)}`);
    expect(p2.json.builds).toHaveLength(1);
    expect(p2.json.nextCursor).toBeNull();
    const ids = [...p1.json.builds, ...p2.json.builds].map((b: { id: string }) => b.id);
    expect(new Set(ids).size).toBe(3);
    expect((await request(tuner, "GET", "/api/v1/builds?status=flying")).status).toBe(422);
  });
});
