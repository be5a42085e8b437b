import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { initialActionState } from "@/lib/actions/state";
import { flatOf } from "@/lib/validations/parts";

import { actionManifest, callAction, formOf, type ActionRef } from "../helpers/actions";
import { fingerprint, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";

/**
 * The writes on customers and catalog parts: updates change only what they are sent (through
 * the form's server action and through the API alike), and clashes are 409s, never 500s.
 */
const SHOP = "demo-shop-ridgeback";
const tag = `W${Date.now().toString(36).toUpperCase()}`;
let counter: Client;
let tuner: Client;
let updatePartRef: ActionRef;
let createPartRef: ActionRef;
let updateCustomerRef: (id: string) => ActionRef;
let deleteCustomerRef: (id: string) => ActionRef;

// Invented specs (inputs, not check values): a dead-time table and two pump curves.
const deadTime = {
  voltages: [10, 12, 14],
  pressuresKpa: [300, 500],
  deadTimeMs: [
    [1.4, 1.6],
    [1.0, 1.15],
    [0.78, 0.9],
  ],
};
const injectorSpecs = {
  ratedFlowCcPerMin: 1000,
  ratedPressureKpa: 300,
  minPulseWidthMs: 1.05,
  impedance: "high",
  connector: "EV6",
  ethanolOk: true,
  deadTime,
};
const pumpSpecs = {
  curves: [
    {
      voltage: 13.5,
      points: [
        { pressureKpa: 300, flowLPerH: 340 },
        { pressureKpa: 500, flowLPerH: 289 },
        { pressureKpa: 700, flowLPerH: 231.5 },
      ],
    },
    {
      voltage: 12,
      points: [
        { pressureKpa: 300, flowLPerH: 292 },
        { pressureKpa: 500, flowLPerH: 249 },
      ],
    },
  ],
  currentA: 14,
  mounting: "in-tank",
  ethanolOk: true,
};

async function insertPart(sku: string, category: string, specs: object) {
  const [row] =
    await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, cost_minor, stock, reorder_level, specs)
      values (${SHOP}, ${sku}, ${category}, 'Testbrand', ${`Round trip ${category}`}, 10950, 6790, 12, 3, ${sql.json(specs as never)})
      returning id`;
  return row!.id as string;
}
/** The stored row, every column (jsonb included) as PostgreSQL prints it. */
const rowText = async (id: string) =>
  ((await sql`select p::text as t from parts p where id = ${id}`)[0]?.t as string) ?? null;
const specsOf = async (id: string) =>
  (await sql`select specs from parts where id = ${id}`)[0]!.specs as Record<string, unknown>;
/** The part as the edit page loads it (GET) and the form's payload for it, nothing changed. */
async function formPayload(id: string) {
  const part = (await request(counter, "GET", `/api/v1/parts/${id}`)).json.part;
  return { ...flatOf(part), category: part.category, id };
}
type State = {
  ok: boolean;
  status?: number;
  code?: string;
  message?: string;
  fieldErrors?: Record<string, string[]>;
};
const act = async (client: Client, ref: ActionRef, input: unknown) =>
  (await callAction(client, ref, [initialActionState, input])).state as State | null;

beforeAll(async () => {
  [counter, tuner] = await Promise.all([
    signIn("counter@demo.fuelwright.test"),
    signIn("tuner@demo.fuelwright.test"),
  ]);
  const manifest = actionManifest();
  const find = (file: string, name: string) => {
    const ref = manifest.find((r) => r.file === file && r.name === name);
    expect(ref, `${file}#${name} in the build's action manifest`).toBeTruthy();
    return ref!;
  };
  updatePartRef = { ...find("lib/parts/part-actions.ts", "updatePartAction"), page: "/parts/new" };
  createPartRef = { ...find("lib/parts/part-actions.ts", "createPartAction"), page: "/parts/new" };
  const upd = find("app/(shop)/customers/actions.ts", "updateCustomerAction");
  const del = find("app/(shop)/customers/actions.ts", "deleteCustomerAction");
  updateCustomerRef = (id) => ({ ...upd, page: `/customers/${id}` });
  deleteCustomerRef = (id) => ({ ...del, page: `/customers/${id}` });
});
afterAll(async () => {
  await sql.end();
});

describe("saving a part keeps what the form does not show", () => {
  it("an unchanged save through the part form's action leaves the row byte for byte the same (dead-time table, pump curves)", async () => {
    for (const [sku, category, specs] of [
      [`${tag}-INJ`, "injector", injectorSpecs],
      [`${tag}-PMP`, "pump", pumpSpecs],
    ] as const) {
      const id = await insertPart(sku, category, specs);
      const before = await rowText(id);
      const state = await act(counter, updatePartRef, await formPayload(id));
      expect(state, `${category}: the action answered`).toMatchObject({ ok: true });
      expect(await rowText(id), `${category}: the stored row`).toBe(before);
    }
  });

  it("an unchanged save through PATCH leaves the row byte for byte the same", async () => {
    const id = await insertPart(`${tag}-INJ2`, "injector", injectorSpecs);
    const pumpId = await insertPart(`${tag}-PMP2`, "pump", pumpSpecs);
    for (const pid of [id, pumpId]) {
      const before = await rowText(pid);
      const { id: _id, ...body } = await formPayload(pid);
      const r = await request(counter, "PATCH", `/api/v1/parts/${pid}`, body);
      expect(r.status).toBe(200);
      expect(await rowText(pid)).toBe(before);
    }
  });

  it("a real change through the form or PATCH changes that field only; the dead-time table stays", async () => {
    const id = await insertPart(`${tag}-INJ3`, "injector", injectorSpecs);
    const viaForm = await act(counter, updatePartRef, {
      ...(await formPayload(id)),
      name: "Renamed in the form",
      flow_cc_min: "1050",
      connector: "",
    });
    expect(viaForm).toMatchObject({ ok: true });
    const { connector: _c, ...rest } = injectorSpecs;
    expect(await specsOf(id)).toEqual({ ...rest, ratedFlowCcPerMin: 1050 });
    const viaApi = await request(counter, "PATCH", `/api/v1/parts/${id}`, { stock: "40" });
    expect(viaApi.status).toBe(200);
    expect(viaApi.json.part).toMatchObject({
      name: "Renamed in the form",
      stock: 40,
      priceMinor: 10950,
      costMinor: 6790,
      reorderLevel: 3,
      specs: { ...rest, ratedFlowCcPerMin: 1050 },
    });
  });

  it("a change that breaks the merged specs is a 422 naming the column; nothing is written", async () => {
    const id = await insertPart(`${tag}-INJ4`, "injector", injectorSpecs);
    const before = await rowText(id);
    const r = await request(counter, "PATCH", `/api/v1/parts/${id}`, { flow_cc_min: "5" });
    expect(r.status).toBe(422);
    expect(r.json.error.issues.map((i: { path: string }) => i.path)).toEqual(["flow_cc_min"]);
    const s = await act(counter, updatePartRef, { id, flow_cc_min: "5" });
    expect(s).toMatchObject({ ok: false, status: 422 });
    expect(Object.keys(s!.fieldErrors ?? {})).toEqual(["flow_cc_min"]);
    expect(await rowText(id)).toBe(before);
  });

  it("the tuner may not change a part through either door", async () => {
    const id = await insertPart(`${tag}-INJ5`, "injector", injectorSpecs);
    const before = await rowText(id);
    expect((await request(tuner, "PATCH", `/api/v1/parts/${id}`, { name: "x" })).status).toBe(403);
    expect(await act(tuner, updatePartRef, { id, name: "x" })).toMatchObject({ status: 403 });
    expect(await rowText(id)).toBe(before);
  });
});

describe("a taken SKU", () => {
  it("editing a part to a SKU the shop has is 409 duplicate_sku on the field sku, through PATCH and the form", async () => {
    const a = await insertPart(`${tag}-DUP-A`, "injector", injectorSpecs);
    await insertPart(`${tag}-DUP-B`, "injector", injectorSpecs);
    const before = await fingerprint(["parts"]);
    const r = await request(counter, "PATCH", `/api/v1/parts/${a}`, { sku: `${tag}-DUP-B` });
    expect(r.status).toBe(409);
    expect(r.json.error).toMatchObject({
      code: "duplicate_sku",
      issues: [{ path: "sku", message: `SKU ${tag}-DUP-B is already in the catalog` }],
    });
    const s = await act(counter, updatePartRef, {
      ...(await formPayload(a)),
      sku: `${tag}-DUP-B`,
    });
    expect(s).toMatchObject({ ok: false, status: 409, code: "duplicate_sku" });
    expect(s!.fieldErrors?.sku).toEqual([`SKU ${tag}-DUP-B is already in the catalog`]);
    expect(await fingerprint(["parts"])).toBe(before);
  });

  it("adding a part with a taken SKU is the same 409, by the API and by the form", async () => {
    const body = {
      sku: `${tag}-DUP-A`,
      category: "other",
      brand: "Testbrand",
      name: "Clash",
      price: "1.00",
      stock: "1",
    };
    await insertPart(`${tag}-DUP-A`, "injector", injectorSpecs).catch(() => null);
    const r = await request(counter, "POST", "/api/v1/parts", body);
    expect(r.status).toBe(409);
    expect(r.json.error.issues[0].path).toBe("sku");
    const s = await act(counter, createPartRef, body);
    expect(s).toMatchObject({ ok: false, status: 409, code: "duplicate_sku" });
  });
});

describe("catalog import of a known SKU", () => {
  const csvPost = (body: string) =>
    request(counter, "POST", "/api/v1/parts/import", body, { "content-type": "text/csv" });

  it("keeps the stored dead-time table and any column the file lacks", async () => {
    const sku = `${tag}-IMP`;
    const id = await insertPart(sku, "injector", injectorSpecs);
    const r = await csvPost(
      [
        "sku,category,brand,name,price,stock,flow_cc_min,rated_kpa,min_pulse_ms,ethanol_ok",
        `${sku},injector,Testbrand,Imported again,119.00,30,1100,300,1.05,yes`,
      ].join("\n"),
    );
    expect(r.status).toBe(200);
    expect(r.json).toMatchObject({ added: 0, updated: 1 });
    const [row] = await sql`select * from parts where id = ${id}`;
    expect(row).toMatchObject({
      name: "Imported again",
      price_minor: 11900,
      stock: 30,
      cost_minor: 6790, // no cost column: kept
      reorder_level: 3, // no reorder_level column: kept
    });
    expect(row!.specs).toEqual({ ...injectorSpecs, ratedFlowCcPerMin: 1100 });
  });

  it("a column the file has but leaves blank still clears its key (the file speaks for it)", async () => {
    const sku = `${tag}-IMP2`;
    const id = await insertPart(sku, "injector", injectorSpecs);
    const r = await csvPost(
      [
        "sku,category,brand,name,price,stock,flow_cc_min,connector,ethanol_ok",
        `${sku},injector,Testbrand,Round trip injector,109.50,12,1000,,yes`,
      ].join("\n"),
    );
    expect(r.status).toBe(200);
    const { connector: _c, ...rest } = injectorSpecs;
    expect(await specsOf(id)).toEqual(rest);
  });
});

describe("customers", () => {
  const newCustomer = async (name: string) =>
    (
      await request(counter, "POST", "/api/v1/customers", {
        name,
        email: `${name.toLowerCase().replace(/\W+/g, "-")}@example.test`,
        phone: "(201) 555-0199",
        notes: "Keeps the old car",
      })
    ).json.customer as { id: string; name: string };
  const rowOf = async (id: string) =>
    (await sql`select name, email, phone, notes from customers where id = ${id}`)[0];

  it("the edit form's action and PATCH change only the fields sent, the same way", async () => {
    const a = await newCustomer(`Partial Form ${tag}`);
    const b = await newCustomer(`Partial Api ${tag}`);
    const s = await act(counter, updateCustomerRef(a.id), formOf({ id: a.id, name: "Renamed" }));
    expect(s).toMatchObject({ ok: true });
    const r = await request(counter, "PATCH", `/api/v1/customers/${b.id}`, { name: "Renamed" });
    expect(r.status).toBe(200);
    const kept = {
      name: "Renamed",
      phone: "+12015550199",
      notes: "Keeps the old car",
    };
    expect(await rowOf(a.id)).toMatchObject(kept);
    expect(await rowOf(b.id)).toMatchObject(kept);
    // An empty field sent clears it, through either door.
    await act(counter, updateCustomerRef(a.id), formOf({ id: a.id, phone: "" }));
    await request(counter, "PATCH", `/api/v1/customers/${b.id}`, { phone: "" });
    expect((await rowOf(a.id))!.phone).toBeNull();
    expect((await rowOf(b.id))!.phone).toBeNull();
    expect((await rowOf(a.id))!.email).toMatch(/^partial-form/);
    // Nothing sent is refused by both.
    const none = await act(counter, updateCustomerRef(a.id), formOf({ id: a.id }));
    expect(none).toMatchObject({ ok: false, status: 422 });
    expect(
      (await request(counter, "PATCH", `/api/v1/customers/${b.id}`, {})).json.error.issues[0].path,
    ).toBe("(body)");
  });

  it("deleting a customer who has quotes is 409 customer_in_use and deletes nothing, by the API and the form", async () => {
    const c = await newCustomer(`Quoted ${tag}`);
    const q = await request(counter, "POST", "/api/v1/quotes", { customerId: c.id });
    expect(q.status).toBe(201);
    const before = await fingerprint(["customers", "quotes"]);
    const r = await request(counter, "DELETE", `/api/v1/customers/${c.id}`);
    expect(r.status).toBe(409);
    expect(r.json.error).toMatchObject({
      code: "customer_in_use",
      message: expect.stringContaining(`Quoted ${tag} has 1 quote`),
    });
    const s = await act(counter, deleteCustomerRef(c.id), formOf({ id: c.id }));
    expect(s).toMatchObject({ ok: false, status: 409, code: "customer_in_use" });
    expect(await fingerprint(["customers", "quotes"])).toBe(before);
  });

  it("a customer with a build is kept the same way; one with neither is deleted", async () => {
    const c = await newCustomer(`Built ${tag}`);
    const [demo] =
      await sql`select inputs from builds where id = '10000000-0000-4000-8000-000000000002'`;
    const owner = await signIn("owner@demo.fuelwright.test");
    const b = await request(owner, "POST", "/api/v1/builds", {
      customerId: c.id,
      title: "Kept",
      inputs: demo!.inputs,
    });
    expect(b.status).toBe(201);
    const r = await request(counter, "DELETE", `/api/v1/customers/${c.id}`);
    expect(r.status).toBe(409);
    expect(r.json.error.message).toContain("1 build");
    expect(await rowOf(c.id)).toBeTruthy();
    const free = await newCustomer(`Free ${tag}`);
    expect((await request(counter, "DELETE", `/api/v1/customers/${free.id}`)).status).toBe(204);
    expect(await rowOf(free.id)).toBeUndefined();
  });
});
