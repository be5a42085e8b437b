import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { normaliseStoredPhones } from "@/db/normalise-phones";
import { initialActionState } from "@/lib/actions/state";

import { actionManifest, callAction, formOf, type ActionRef } from "../helpers/actions";
import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";

/**
 * Customers with vehicles and phone numbers found however typed; the counter's draft build from
 * a caller's goal and the tuners' sizing queue. Everything through HTTP, as the app is used.
 */
const SHOP = "demo-shop-ridgeback";
const tag = `CV${Date.now().toString(36).toUpperCase()}`;
let owner: Client;
let counter: Client;
let tuner: Client;
let customer: Client;
let outsider: Client;
const refs = {} as Record<"add" | "update" | "remove", ActionRef>;

type State = { ok: boolean; status?: number; fieldErrors?: Record<string, string[]> };
const act = async (client: Client, ref: ActionRef, input: unknown) =>
  (await callAction(client, ref, [initialActionState, input])).state as State | null;

beforeAll(async () => {
  const other = await makeOtherShop(tag.toLowerCase());
  [owner, counter, tuner, customer, outsider] = await Promise.all([
    signIn("owner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
    signIn("tuner@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
  const manifest = actionManifest();
  const find = (name: string) => {
    const ref = manifest.find(
      (r) => r.file === "app/(shop)/customers/actions.ts" && r.name === name,
    );
    expect(ref, `${name} in the build's action manifest`).toBeTruthy();
    return { ...ref!, page: "/customers" };
  };
  refs.add = find("addVehicleAction");
  refs.update = find("updateVehicleAction");
  refs.remove = find("deleteVehicleAction");
});
afterAll(async () => {
  await sql.end();
});

const newCustomer = async (client: Client, body: Record<string, unknown>) => {
  const r = await request(client, "POST", "/api/v1/customers", body);
  expect(r.status, JSON.stringify(r.json)).toBe(201);
  return r.json.customer as { id: string; phone: string | null; vehicles: { id: string }[] };
};
const search = async (client: Client, q: string) =>
  (
    (await request(client, "GET", `/api/v1/customers?q=${encodeURIComponent(q)}`)).json
      .customers as { id: string }[]
  ).map((c) => c.id);

describe("phone numbers", () => {
  it("are stored as E.164 and found in five spellings, in the API and the list page", async () => {
    // 201-555-01XX: a New Jersey area code and the exchange kept for fiction (from memory).
    const c = await newCustomer(counter, { name: `${tag} Phone Caller`, phone: "201-555-0163" });
    expect(c.phone).toBe("+12015550163");
    const [row] = await sql`select phone from customers where id = ${c.id}`;
    expect(row!.phone).toBe("+12015550163");
    for (const typed of ["5550163", "555-0163", "(555) 0163", "+1 555 0163", "(201) 555-0163"]) {
      expect(await search(counter, typed), typed).toContain(c.id);
      const page = await request(counter, "GET", `/customers?q=${encodeURIComponent(typed)}`);
      expect(page.status).toBe(200);
      expect(page.text, typed).toContain(`${tag} Phone Caller`);
      // Shown as people read it.
      expect(page.text).toContain("(201) 555-0163");
    }
    expect(await search(counter, "555-0164")).not.toContain(c.id);
  });

  it("a number without its area code is a field error, and nothing is written", async () => {
    const before = await fingerprint(["customers"]);
    const r = await request(counter, "POST", "/api/v1/customers", {
      name: "No Area",
      phone: "555-0163",
    });
    expect(r.status).toBe(422);
    expect(r.json.error.issues[0].path).toBe("phone");
    expect(r.json.error.message).toMatch(/area code/);
    expect(await fingerprint(["customers"])).toBe(before);
  });

  it("stored spellings are migrated to E.164 where they read as numbers, else kept", async () => {
    const [a] =
      await sql`insert into customers (shop_id, name, phone) values (${SHOP}, ${`${tag} Old A`}, '201.555.0171') returning id`;
    const [b] =
      await sql`insert into customers (shop_id, name, phone) values (${SHOP}, ${`${tag} Old B`}, '555-0172') returning id`;
    expect(await normaliseStoredPhones(sql)).toBeGreaterThanOrEqual(1);
    const rows =
      await sql`select id, phone, version from customers where id in (${a!.id}, ${b!.id})`;
    const byId = new Map(rows.map((r) => [r.id, r]));
    expect(byId.get(a!.id)).toMatchObject({ phone: "+12015550171", version: 1 });
    expect(byId.get(b!.id)).toMatchObject({ phone: "555-0172" });
    // Run again: nothing left to change.
    expect(await normaliseStoredPhones(sql)).toBe(0);
  });
});

describe("vehicles", () => {
  it("come with the customer through POST, GET and the list, and are searched by make, model, VIN and year", async () => {
    const c = await newCustomer(counter, {
      name: `${tag} Vehicle Owner`,
      addressLine1: "9 Sluice Lane",
      city: "Alder Falls",
      region: "NJ",
      postcode: "07998",
      vehicles: [
        { year: 1989, make: "Quillon", model: `Rapier ${tag}`, vin: "1m8gdm9axkp042788" },
        { year: 2011, make: "Harlan", model: "Vesta", engine: "2.0 NA four" },
      ],
    });
    expect(c.vehicles).toHaveLength(2);
    const got = (await request(counter, "GET", `/api/v1/customers/${c.id}`)).json.customer;
    expect(got).toMatchObject({ addressLine1: "9 Sluice Lane", city: "Alder Falls" });
    expect(got.vehicles.map((v: { vin: string | null }) => v.vin)).toContain("1M8GDM9AXKP042788");
    for (const q of [
      `Rapier ${tag}`,
      `quillon rapier ${tag.toLowerCase()}`,
      "1M8GDM9AXKP042788",
      `1989 ${tag}`,
    ])
      expect(await search(counter, q), q).toContain(c.id);
    const list = (await request(counter, "GET", `/api/v1/customers?q=${tag}%20Vehicle`)).json
      .customers;
    expect(list[0].vehicles).toHaveLength(2);
  });

  it("a VIN with a wrong check digit is refused on its field", async () => {
    const r = await request(counter, "POST", "/api/v1/customers", {
      name: "Bad Vin",
      vehicles: [{ year: 2015, make: "Harlan", model: "Vesta", vin: "1M8GDM9A1KP042788" }],
    });
    expect(r.status).toBe(422);
    expect(r.json.error.issues[0].path).toBe("vehicles.0.vin");
  });

  it("PATCH's list adds, changes and removes; the page's actions add, edit and remove", async () => {
    const c = await newCustomer(counter, {
      name: `${tag} Fleet`,
      vehicles: [
        { year: 2001, make: "Brennan", model: "Stag" },
        { year: 2005, make: "Corvane", model: "RX4" },
      ],
    });
    const [keep, drop] = c.vehicles;
    const patched = await request(counter, "PATCH", `/api/v1/customers/${c.id}`, {
      vehicles: [
        { id: keep!.id, engine: "5.0 V8" },
        { year: 2020, make: "Tamsin", model: "Coupe" },
      ],
    });
    expect(patched.status).toBe(200);
    const now = patched.json.customer.vehicles as {
      id: string;
      model: string;
      engine: string | null;
    }[];
    expect(now.map((v) => v.model).sort()).toEqual(["Coupe", "Stag"]);
    expect(now.find((v) => v.id === keep!.id)!.engine).toBe("5.0 V8");
    expect((await sql`select 1 from vehicles where id = ${drop!.id}`).length).toBe(0);

    expect(
      await act(
        counter,
        refs.add,
        formOf({ customerId: c.id, year: "1999", make: "Ostrander", model: "GT" }),
      ),
    ).toMatchObject({ ok: true });
    const [added] =
      await sql`select id from vehicles where customer_id = ${c.id} and make = 'Ostrander'`;
    expect(
      await act(
        counter,
        refs.update,
        formOf({ id: added!.id, year: "1999", make: "Ostrander", model: "GT-R" }),
      ),
    ).toMatchObject({ ok: true });
    expect((await sql`select model from vehicles where id = ${added!.id}`)[0]!.model).toBe("GT-R");
    const badYear = await act(counter, refs.update, formOf({ id: added!.id, year: "1850" }));
    expect(badYear).toMatchObject({ ok: false, status: 422 });
    expect(badYear!.fieldErrors!.year).toBeTruthy();
    expect(await act(counter, refs.remove, formOf({ id: added!.id }))).toMatchObject({ ok: true });
    expect((await sql`select 1 from vehicles where id = ${added!.id}`).length).toBe(0);
  });

  it("belong to their shop: another shop neither sees, changes nor removes them", async () => {
    const c = await newCustomer(counter, {
      name: `${tag} Private`,
      vehicles: [{ year: 2003, make: "Harlan", model: `Secret ${tag}` }],
    });
    const v = c.vehicles[0]!.id;
    const before = await fingerprint(["vehicles", "customers"]);
    expect(await search(outsider, `Secret ${tag}`)).toEqual([]);
    expect((await request(outsider, "GET", `/api/v1/customers/${c.id}`)).status).toBe(404);
    expect(await act(outsider, refs.update, formOf({ id: v, model: "Stolen" }))).toMatchObject({
      ok: false,
      status: 404,
    });
    expect(await act(outsider, refs.remove, formOf({ id: v }))).toMatchObject({
      ok: false,
      status: 404,
    });
    expect(
      await act(
        outsider,
        refs.add,
        formOf({ customerId: c.id, year: "2000", make: "X", model: "Y" }),
      ),
    ).toMatchObject({ ok: false, status: 404 });
    // Another shop's vehicle named in one's own customer's list is unknown.
    const own = await newCustomer(outsider, { name: "Outsider's customer" });
    const mid = await fingerprint(["vehicles", "customers"]);
    const r = await request(outsider, "PATCH", `/api/v1/customers/${own.id}`, {
      vehicles: [{ id: v, model: "Stolen" }],
    });
    expect(r.status).toBe(404);
    expect(await fingerprint(["vehicles", "customers"])).toBe(mid);
    // The portal customer is no staff member.
    expect(await act(customer, refs.remove, formOf({ id: v }))).toMatchObject({
      ok: false,
      status: 403,
    });
    expect((await sql`select model from vehicles where id = ${v}`)[0]!.model).toBe(`Secret ${tag}`);
    expect(before).toBeTruthy();
  });
});

describe("the counter's draft build and the tuners' queue", () => {
  const goal = {
    displacementL: 2.2,
    cylinders: 4,
    aspiration: "turbo",
    powerKw: 260,
    measuredAt: "wheel",
    fuel: "e85",
  };

  it("the counter starts one through the API with a new vehicle: needs sizing, no tuner yet", async () => {
    const c = await newCustomer(counter, { name: `${tag} Caller` });
    const r = await request(counter, "POST", "/api/v1/builds", {
      customerId: c.id,
      newVehicle: { year: 2004, make: "Tamsin", model: "Coupe", engine: "2.2 turbo four" },
      goal,
    });
    expect(r.status, JSON.stringify(r.json)).toBe(201);
    expect(r.json.build).toMatchObject({
      status: "needs_sizing",
      customerId: c.id,
      tunerId: null,
      vehicle: "2004 Tamsin Coupe (2.2 turbo four)",
    });
    expect(r.json.build.inputs.engine).toMatchObject({
      cylinders: 4,
      displacementL: 2.2,
      aspiration: "turbo",
    });
    expect(r.json.build.inputs.target).toMatchObject({ powerKw: 260, measuredAt: "wheel" });
    const [v] =
      await sql`select id, customer_id from vehicles where id = ${r.json.build.vehicleId}`;
    expect(v!.customer_id).toBe(c.id);
    const revs =
      await sql`select status, note from build_revisions where build_id = ${r.json.build.id}`;
    expect(revs).toHaveLength(1);
    expect(revs[0]!.status).toBe("needs_sizing");
  });

  it("refuses the tuner's fields, another customer's vehicle, and the wrong roles; nothing is written", async () => {
    const c = await newCustomer(counter, { name: `${tag} Caller Two` });
    const other = await newCustomer(counter, {
      name: `${tag} Someone Else`,
      vehicles: [{ year: 2010, make: "Harlan", model: "Vesta" }],
    });
    const before = await fingerprint(["builds", "build_revisions", "vehicles"]);
    const withInputs = await request(counter, "POST", "/api/v1/builds", {
      customerId: c.id,
      goal,
      inputs: {},
    });
    expect(withInputs.status).toBe(422);
    expect(withInputs.json.error.issues[0].path).toBe("inputs");
    const sheet = await request(counter, "POST", "/api/v1/builds", {
      customerId: c.id,
      title: "Sheet",
    });
    expect(sheet.status).toBe(403);
    const notTheirs = await request(counter, "POST", "/api/v1/builds", {
      customerId: c.id,
      vehicleId: other.vehicles[0]!.id,
      goal,
    });
    expect(notTheirs.status).toBe(422);
    expect(notTheirs.json.error.issues[0].path).toBe("vehicleId");
    const noGoal = await request(counter, "POST", "/api/v1/builds", {
      customerId: c.id,
      goal: { ...goal, powerKw: "lots", fuel: "diesel" },
    });
    expect(noGoal.status).toBe(422);
    expect(noGoal.json.error.issues.map((i: { path: string }) => i.path)).toEqual(
      expect.arrayContaining(["goal.powerKw", "goal.fuel"]),
    );
    expect(
      (await request(customer, "POST", "/api/v1/builds", { customerId: c.id, goal })).status,
    ).toBe(403);
    expect(
      (await request(outsider, "POST", "/api/v1/builds", { customerId: c.id, goal })).status,
    ).toBe(422);
    expect(await fingerprint(["builds", "build_revisions", "vehicles"])).toBe(before);
  });

  it("the tuner finds it in the queue, sizes it and it leaves the queue", async () => {
    const c = await newCustomer(counter, {
      name: `${tag} Queue Caller`,
      vehicles: [{ year: 2016, make: "Corvane", model: "RX6" }],
    });
    const made = await request(counter, "POST", "/api/v1/builds", {
      customerId: c.id,
      vehicleId: c.vehicles[0]!.id,
      title: `${tag} queue build`,
      goal,
    });
    expect(made.status).toBe(201);
    const id = made.json.build.id as string;
    const queue = async () =>
      (
        (await request(tuner, "GET", "/api/v1/builds?status=needs_sizing&limit=100")).json
          .builds as {
          id: string;
        }[]
      ).map((b) => b.id);
    expect(await queue()).toContain(id);
    const page = await request(tuner, "GET", "/builds");
    expect(page.text).toMatch(/builds? need(s)?(<!-- -->)? sizing/);
    // The panel lists the oldest waiting first.
    const [oldest] =
      await sql`select id from builds where shop_id = ${SHOP} and status = 'needs_sizing' order by created_at, id limit 1`;
    expect(page.text).toContain(`href="/builds/${oldest!.id}"`);
    // The counter reads the build; its sizing fields say whose they are.
    const seen = await request(counter, "GET", `/builds/${id}`);
    expect(seen.text).toContain("Needs sizing");
    expect(seen.text).toContain("are the tuner&#x27;s");
    // The counter may not size it.
    const byCounter = await request(counter, "PATCH", `/api/v1/builds/${id}`, {
      version: 1,
      status: "sized",
    });
    expect(byCounter.status).toBe(403);
    const sized = await request(tuner, "PATCH", `/api/v1/builds/${id}`, {
      version: 1,
      status: "sized",
    });
    expect(sized.status, JSON.stringify(sized.json)).toBe(200);
    expect(sized.json.build).toMatchObject({
      status: "sized",
      tunerId: "demo-user-tuner",
      version: 2,
    });
    expect(await queue()).not.toContain(id);
    // The owner sees the seeded one waiting too.
    expect(
      (
        (await request(owner, "GET", "/api/v1/builds?status=needs_sizing")).json.builds as {
          id: string;
        }[]
      ).map((b) => b.id),
    ).toContain("10000000-0000-4000-8000-000000000005");
  });
});
