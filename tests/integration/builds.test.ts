import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { boostedSix } from "../calc/fixtures";
import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";

let tuner: Client, counter: Client, customer: Client, outsider: Client;
let customerId: string;
/** The demo customer record linked to customer@demo.fuelwright.test (db/seed.ts). */
const PORTAL_CUSTOMER_ID = "00000000-0000-4000-8000-000000000001";

beforeAll(async () => {
  const other = await makeOtherShop();
  [tuner, counter, customer, outsider] = await Promise.all([
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
  const [c] =
    await sql`select id from customers where shop_id = 'demo-shop-ridgeback' and user_id is null order by name limit 1`;
  customerId = c!.id;
});
afterAll(async () => {
  await sql.end();
});

async function newBuild(title = `Build ${Date.now()}`) {
  const r = await request(tuner, "POST", "/api/v1/builds", {
    customerId,
    title,
    inputs: boostedSix,
  });
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
    const a = await request(tuner, "PATCH", `/api/v1/builds/${b.id}`, {
      version: 1,
      inputs: first,
      note: "more power",
    });
    expect(a.status).toBe(200);
    expect(a.json.build.version).toBe(2);
    const stale = await request(tuner, "PATCH", `/api/v1/builds/${b.id}`, {
      version: 1,
      inputs: second,
    });
    expect(stale.status).toBe(409);
    expect(stale.json.current.version).toBe(2);
    const [row] =
      await sql`select version, inputs->'target'->>'powerKw' as kw from builds where id = ${b.id}`;
    expect(row).toMatchObject({ version: 2, kw: "500" });
    const [{ n }] =
      (await sql`select count(*)::int as n from build_revisions where build_id = ${b.id}`) as unknown as [
        { n: number },
      ];
    expect(n).toBe(2);
  });

  it("moves status only along the workflow", async () => {
    const b = await newBuild();
    const skip = await request(tuner, "PATCH", `/api/v1/builds/${b.id}`, {
      version: 1,
      inputs: boostedSix,
      status: "verified",
    });
    expect(skip.status).toBe(422);
    const ok = await request(tuner, "PATCH", `/api/v1/builds/${b.id}`, {
      version: 1,
      inputs: boostedSix,
      status: "sized",
    });
    expect(ok.status).toBe(200);
    expect(ok.json.build.status).toBe("sized");
  });

  it("bad input gets field errors and writes nothing", async () => {
    const b = await newBuild();
    const before = await fingerprint(["builds", "build_revisions"]);
    const r = await request(tuner, "PATCH", `/api/v1/builds/${b.id}`, {
      version: 1,
      inputs: { ...boostedSix, injectors: { ...boostedSix.injectors, count: 0 } },
    });
    expect(r.status).toBe(422);
    expect(r.json.error.issues.map((i: { path: string }) => i.path)).toContain(
      "inputs.injectors.count",
    );
    expect(
      (await request(tuner, "POST", "/api/v1/builds", { customerId: "not-a-uuid", title: "" }))
        .status,
    ).toBe(422);
    expect(await fingerprint(["builds", "build_revisions"])).toBe(before);
  });

  it("the counter reads but cannot write; a customer sees only their own; another shop gets nothing", async () => {
    const b = await newBuild();
    const before = await fingerprint(["builds", "build_revisions"]);
    expect((await request(counter, "GET", `/api/v1/builds/${b.id}`)).status).toBe(200);
    expect(
      (
        await request(counter, "PATCH", `/api/v1/builds/${b.id}`, {
          version: 1,
          inputs: boostedSix,
        })
      ).status,
    ).toBe(403);
    // customerId is not the portal customer's record, so this build is not theirs.
    expect((await request(customer, "GET", `/api/v1/builds/${b.id}`)).status).toBe(404);
    expect((await request(customer, "GET", `/api/v1/builds/${b.id}/revisions`)).status).toBe(404);
    expect(
      (
        await request(customer, "PATCH", `/api/v1/builds/${b.id}`, {
          version: 1,
          inputs: boostedSix,
        })
      ).status,
    ).toBe(403);
    expect((await request(outsider, "GET", `/api/v1/builds/${b.id}`)).status).toBe(404);
    expect(
      (
        await request(outsider, "PATCH", `/api/v1/builds/${b.id}`, {
          version: 1,
          inputs: boostedSix,
        })
      ).status,
    ).toBe(404);
    expect(
      (await request(outsider, "POST", "/api/v1/builds", { customerId, title: "Not yours" }))
        .status,
    ).toBe(422);
    const list = await request(outsider, "GET", "/api/v1/builds");
    expect(list.json.builds).toEqual([]);
    expect(await fingerprint(["builds", "build_revisions"])).toBe(before);
  });

  it("a customer lists and opens only the builds of their own customer record", async () => {
    const own = (
      await request(tuner, "POST", "/api/v1/builds", {
        customerId: PORTAL_CUSTOMER_ID,
        title: `Mine ${Date.now()}`,
        inputs: boostedSix,
      })
    ).json.build;
    const list = await request(customer, "GET", "/api/v1/builds?limit=100");
    expect(list.status).toBe(200);
    const ids = list.json.builds.map((b: { id: string }) => b.id);
    expect(ids).toContain(own.id);
    const [{ n }] =
      (await sql`select count(*)::int as n from builds b join customers c on c.id = b.customer_id where c.user_id = 'demo-user-customer'`) as unknown as [
        { n: number },
      ];
    expect(ids).toHaveLength(Math.min(n, 100));
    expect(
      list.json.builds.every((b: { customerId: string }) => b.customerId === PORTAL_CUSTOMER_ID),
    ).toBe(true);
    expect((await request(customer, "GET", `/api/v1/builds/${own.id}`)).status).toBe(200);
    expect((await request(customer, "GET", `/api/v1/builds/${own.id}/revisions`)).status).toBe(200);
  });

  it("search covers the customer's name and follows a rename", async () => {
    const tag = `Renamed${Date.now()}`;
    const [c] =
      await sql`insert into customers (shop_id, name) values ('demo-shop-ridgeback', ${`Before ${tag}`}) returning id`;
    const b = (
      await request(tuner, "POST", "/api/v1/builds", {
        customerId: c!.id,
        title: "Plain title",
        inputs: boostedSix,
      })
    ).json.build;
    expect(
      (
        await request(tuner, "GET", `/api/v1/builds?q=before%20${tag.toLowerCase()}`)
      ).json.builds.map((x: { id: string }) => x.id),
    ).toEqual([b.id]);
    await sql`update customers set name = ${`After ${tag}`} where id = ${c!.id}`;
    expect((await request(tuner, "GET", `/api/v1/builds?q=Before%20${tag}`)).json.builds).toEqual(
      [],
    );
    expect(
      (await request(tuner, "GET", `/api/v1/builds?q=AFTER%20${tag}`)).json.builds.map(
        (x: { id: string }) => x.id,
      ),
    ).toEqual([b.id]);
    // LIKE wildcards typed by the user are literal characters.
    expect(
      (await request(tuner, "GET", `/api/v1/builds?q=${encodeURIComponent("%_%")}`)).json.builds,
    ).toEqual([]);
  });

  it("filters by tuner and sorts by title with keyset pages", async () => {
    const tag = `Sorter${Date.now()}`;
    for (const t of ["c", "a", "b"]) await newBuild(`${tag} ${t}`);
    const p1 = await request(
      tuner,
      "GET",
      `/api/v1/builds?q=${tag}&sort=title&limit=2&tuner=demo-user-tuner`,
    );
    expect(p1.json.builds.map((b: { title: string }) => b.title)).toEqual([`${tag} a`, `${tag} b`]);
    expect(p1.json.builds[0].tunerName).toBeTruthy();
    const p2 = await request(
      tuner,
      "GET",
      `/api/v1/builds?q=${tag}&sort=title&limit=2&tuner=demo-user-tuner&cursor=${encodeURIComponent(p1.json.nextCursor)}`,
    );
    expect(p2.json.builds.map((b: { title: string }) => b.title)).toEqual([`${tag} c`]);
    expect(
      (await request(tuner, "GET", `/api/v1/builds?q=${tag}&tuner=demo-user-owner`)).json.builds,
    ).toEqual([]);
    expect((await request(tuner, "GET", `/api/v1/builds?sort=price`)).status).toBe(422);
    // A garbled cursor is ignored rather than failing.
    expect(
      (await request(tuner, "GET", `/api/v1/builds?q=${tag}&cursor=garbage`)).json.builds,
    ).toHaveLength(3);
  });

  it("searches and pages with a cursor", async () => {
    const tag = `Pager${Date.now()}`;
    for (let i = 0; i < 3; i++) await newBuild(`${tag} ${i}`);
    const p1 = await request(tuner, "GET", `/api/v1/builds?q=${tag}&limit=2`);
    expect(p1.json.builds).toHaveLength(2);
    expect(p1.json.nextCursor).toBeTruthy();
    const p2 = await request(
      tuner,
      "GET",
      `/api/v1/builds?q=${tag}&limit=2&cursor=${encodeURIComponent(p1.json.nextCursor)}`,
    );
    expect(p2.json.builds).toHaveLength(1);
    expect(p2.json.nextCursor).toBeNull();
    const ids = [...p1.json.builds, ...p2.json.builds].map((b: { id: string }) => b.id);
    expect(new Set(ids).size).toBe(3);
    expect((await request(tuner, "GET", "/api/v1/builds?status=flying")).status).toBe(422);
  });
});
