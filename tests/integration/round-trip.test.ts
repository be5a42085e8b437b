import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { initialActionState } from "@/lib/actions/state";
import { DEFAULT_TUNE_LIMITS, type TuneLimits } from "@/lib/calc/tune";
import { formatPhone } from "@/lib/format/phone";
import { limitsFromText, limitsText } from "@/lib/tune/limits-form";
import { pullFromText, pullText, type PullFields } from "@/lib/tune/pull-form";
import { flatOf } from "@/lib/validations/parts";

import { actionManifest, callAction, formOf, type ActionRef } from "../helpers/actions";
import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { BASE_URL, getBytes, request, signIn, type Client } from "../helpers/http";
import { solidPng } from "../helpers/png";
import { THREE_PULLS } from "../helpers/pulls";
import { SEED_SETTINGS_FORM } from "../helpers/surface";

/**
 * Nothing lost, nothing changed: for every edit form (through its server action) and every
 * PATCH route, loading a record and saving it unchanged leaves the stored row byte for byte the
 * same (every column as PostgreSQL prints it, jsonb included) and makes no new version or
 * revision; a stale form is a 409 that overwrites nothing; the catalog's CSV export → import →
 * export is identical.
 */
const SHOP = "demo-shop-ridgeback";
const tag = `RT${Date.now().toString(36).toUpperCase()}`;
let owner: Client, tuner: Client, counter: Client, other: Client;
let otherShop: Awaited<ReturnType<typeof makeOtherShop>>;
let demoInputs: unknown;
let customerId: string;

interface State {
  ok: boolean;
  status?: number;
  code?: string;
  message?: string;
  fieldErrors?: Record<string, string[]>;
  data?: Record<string, unknown>;
  current?: Record<string, unknown> & { version: number };
}
let manifest: ActionRef[];
function ref(file: string, name: string, page: string): ActionRef {
  const found = manifest.find((r) => r.file === file && r.name === name);
  expect(found, `${file}#${name} in the build's action manifest`).toBeTruthy();
  return { ...found!, page };
}
async function act(client: Client, r: ActionRef, input: unknown): Promise<State> {
  const res = await callAction(client, r, [initialActionState, input]);
  expect(res.http, `${r.name} answered`).toBeLessThan(500);
  expect(res.state, `${r.name} answered with a state`).toBeTruthy();
  return res.state as State;
}

/** Every column of one row as PostgreSQL prints it. */
async function rowText(table: string, id: string, key = "id"): Promise<string> {
  const [row] = await sql.unsafe(`select t::text as t from "${table}" t where "${key}" = $1`, [id]);
  expect(row, `${table} ${id} exists`).toBeTruthy();
  return row!.t as string;
}
/** A build's row and its revisions (how many, and the newest). */
async function buildState(id: string) {
  const [rev] =
    await sql`select count(*)::int as n, max(version) as v from build_revisions where build_id = ${id}`;
  return {
    row: await rowText("builds", id),
    revisions: rev!.n as number,
    newest: rev!.v as number,
  };
}
/** A quote's row and its lines (ids included), in order. */
async function quoteState(id: string) {
  const lines =
    await sql`select l::text as t from quote_lines l where quote_id = ${id} order by position`;
  return { row: await rowText("quotes", id), lines: lines.map((l) => l.t as string) };
}

const decode = (s: string) =>
  s
    .replaceAll("&quot;", '"')
    .replaceAll("&#x27;", "'")
    .replaceAll("&lt;", "<")
    .replaceAll("&gt;", ">")
    .replaceAll("&amp;", "&");
/** The values a server-rendered form shows for these field names (inputs and selects). */
function formValuesIn(html: string, names: string[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const tag of html.match(/<input\b[^>]*>/g) ?? []) {
    const name = /\sname="([^"]*)"/.exec(tag)?.[1];
    if (name && names.includes(name)) out[name] = decode(/\svalue="([^"]*)"/.exec(tag)?.[1] ?? "");
  }
  for (const m of html.matchAll(/<select\b[^>]*\sname="([^"]*)"[^>]*>([\s\S]*?)<\/select>/g)) {
    const chosen = [...m[2]!.matchAll(/<option\b([^>]*)>/g)].find((o) =>
      /\sselected(="")?/.test(o[1]!),
    );
    if (names.includes(m[1]!) && chosen)
      out[m[1]!] = decode(/\svalue="([^"]*)"/.exec(chosen[1]!)?.[1] ?? "");
  }
  return out;
}

beforeAll(async () => {
  otherShop = await makeOtherShop();
  [owner, tuner, counter, other] = await Promise.all([
    signIn("owner@demo.fuelwright.test"),
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
    signIn(otherShop.email, otherShop.password),
  ]);
  manifest = actionManifest();
  const [demo] =
    await sql`select customer_id, inputs from builds where id = '10000000-0000-4000-8000-000000000002'`;
  demoInputs = demo!.inputs;
  customerId = demo!.customer_id as string;
});
afterAll(async () => {
  await sql.end();
});

describe("load → save unchanged → the stored row is byte for byte the same", () => {
  it("builds, through the editor's action and PATCH: no new version, no revision", async () => {
    for (const vehicle of ["Round-trip coupe", undefined]) {
      const made = await request(tuner, "POST", "/api/v1/builds", {
        customerId,
        title: `${tag} build`,
        ...(vehicle ? { vehicle } : {}),
        inputs: demoInputs,
      });
      expect(made.status).toBe(201);
      const id = made.json.build.id as string;
      const before = await buildState(id);
      const b = (await request(tuner, "GET", `/api/v1/builds/${id}`)).json.build;
      const save = {
        version: b.version,
        title: b.title,
        vehicle: b.vehicle ?? "",
        status: b.status,
        inputs: b.inputs,
      };
      const patched = await request(tuner, "PATCH", `/api/v1/builds/${id}`, save);
      expect(patched.status).toBe(200);
      expect(patched.json.build).toMatchObject({ id, version: b.version, title: b.title });
      expect(await buildState(id)).toEqual(before);
      const saveRef = ref("lib/builds/build-actions.ts", "saveBuildAction", `/builds/${id}`);
      const state = await act(tuner, saveRef, { id, ...save });
      expect(state).toMatchObject({ ok: true, data: { build: { id, version: b.version } } });
      expect(await buildState(id)).toEqual(before);
      // A real change still saves: a new version and its revision.
      const renamed = await act(tuner, saveRef, {
        id,
        version: b.version,
        title: `${tag} renamed`,
      });
      expect(renamed).toMatchObject({ ok: true, data: { build: { version: b.version + 1 } } });
      expect((await buildState(id)).revisions).toBe(before.revisions + 1);
    }
  });

  it("the seeded build saved with the editor's default drive type filled in: nothing written", async () => {
    // Build 0002 names no drive type; the editor's select shows the default (manual) and sends it.
    const id = "10000000-0000-4000-8000-000000000002";
    const before = await buildState(id);
    const b = (await request(tuner, "GET", `/api/v1/builds/${id}`)).json.build;
    expect(b.inputs.target.driveType).toBeUndefined();
    const save = {
      version: b.version,
      title: b.title,
      status: b.status,
      inputs: { ...b.inputs, target: { ...b.inputs.target, driveType: "manual" } },
    };
    const patched = await request(tuner, "PATCH", `/api/v1/builds/${id}`, save);
    expect(patched.status).toBe(200);
    expect(patched.json.build.version).toBe(b.version);
    expect(await buildState(id)).toEqual(before);
    const saveRef = ref("lib/builds/build-actions.ts", "saveBuildAction", `/builds/${id}`);
    const state = await act(tuner, saveRef, { id, ...save });
    expect(state).toMatchObject({ ok: true, data: { build: { id, version: b.version } } });
    expect(await buildState(id)).toEqual(before);
  });

  it("builds: choosing the kit the build already has makes no new revision", async () => {
    const made = await request(tuner, "POST", "/api/v1/builds", {
      customerId,
      title: `${tag} kit`,
      inputs: demoInputs,
    });
    const id = made.json.build.id as string;
    const [filter] =
      await sql`select id from parts where shop_id = ${SHOP} and category = 'filter' order by sku limit 1`;
    const parts = [{ role: "filter", partId: filter!.id, quantity: 1 }];
    const first = await request(tuner, "POST", `/api/v1/builds/${id}/kit`, { version: 1, parts });
    expect(first.status).toBe(200);
    const version = first.json.build.version as number;
    expect(version).toBe(2);
    const before = await buildState(id);
    const again = await request(tuner, "POST", `/api/v1/builds/${id}/kit`, { version, parts });
    expect(again.status).toBe(200);
    expect(again.json.build.version).toBe(version);
    const kitRef = ref("lib/builds/build-actions.ts", "chooseKitAction", `/builds/${id}/kit`);
    expect(await act(tuner, kitRef, { id, version, parts })).toMatchObject({ ok: true });
    expect(await buildState(id)).toEqual(before);
  });

  it("customers, through the edit form's action and PATCH (a full record and a sparse one)", async () => {
    const full = await request(counter, "POST", "/api/v1/customers", {
      name: `${tag} Full Customer`,
      email: `${tag.toLowerCase()}@example.test`,
      phone: "(201) 555-0142",
      notes: "Line one\nline two — ünïcode",
      addressLine1: "88 Kestrel Row",
      city: "Millbrook",
      region: "NJ",
      postcode: "07999",
      country: "GB",
      taxId: "GB 123 4567 89",
      vehicles: [
        {
          year: 1989,
          make: "Harlan",
          model: "Vesta",
          engine: "2.0 NA four",
          vin: "1M8GDM9AXKP042788",
        },
        { year: 1972, make: "Brennan", model: "Stag", notes: "Before VINs were 17 characters" },
      ],
    });
    const sparse = await request(counter, "POST", "/api/v1/customers", {
      name: `${tag} Sparse Customer`,
    });
    for (const made of [full, sparse]) {
      expect(made.status).toBe(201);
      const id = made.json.customer.id as string;
      const before = await rowText("customers", id);
      const c = (await request(counter, "GET", `/api/v1/customers/${id}`)).json.customer;
      // What the edit form holds and posts (components: blanks for what is not there).
      const form = {
        id,
        version: String(c.version),
        name: c.name,
        email: c.email ?? "",
        // The form shows the number as people read it; saved back, it is the same number.
        phone: formatPhone(c.phone, "US"),
        notes: c.notes ?? "",
        addressLine1: c.addressLine1 ?? "",
        addressLine2: c.addressLine2 ?? "",
        city: c.city ?? "",
        region: c.region ?? "",
        postcode: c.postcode ?? "",
        country: c.country ?? "",
        taxId: c.taxId ?? "",
      };
      const updRef = ref(
        "app/(shop)/customers/actions.ts",
        "updateCustomerAction",
        `/customers/${id}`,
      );
      const state = await act(counter, updRef, formOf(form));
      expect(state).toMatchObject({ ok: true, data: { customer: { id, version: c.version } } });
      expect(await rowText("customers", id)).toBe(before);
      const { id: _id, ...body } = form;
      const patched = await request(counter, "PATCH", `/api/v1/customers/${id}`, {
        ...body,
        version: c.version,
      });
      expect(patched.status).toBe(200);
      expect(patched.json.customer).toMatchObject({ id, version: c.version, name: c.name });
      expect(await rowText("customers", id)).toBe(before);
      // Without a version (older API clients) an unchanged save changes nothing either.
      expect(
        (await request(counter, "PATCH", `/api/v1/customers/${id}`, { name: c.name })).status,
      ).toBe(200);
      expect(await rowText("customers", id)).toBe(before);
    }
  });

  it("vehicles, through their edit form's action and the customer PATCH's list", async () => {
    const made = await request(counter, "POST", "/api/v1/customers", {
      name: `${tag} Vehicle Owner`,
      vehicles: [
        {
          year: 1989,
          make: "Harlan",
          model: "Vesta",
          engine: "2.0 NA four",
          vin: "1M8GDM9AXKP042788",
          notes: "Line one\nline two",
        },
        { year: 2019, make: "Corvane", model: "RX6" },
      ],
    });
    expect(made.status).toBe(201);
    const id = made.json.customer.id as string;
    const c = (await request(counter, "GET", `/api/v1/customers/${id}`)).json.customer;
    expect(c.vehicles).toHaveLength(2);
    const rows = async () =>
      (await sql`select t::text as t from vehicles t where customer_id = ${id} order by id`).map(
        (r) => r.t as string,
      );
    const before = await rows();
    const customerBefore = await rowText("customers", id);
    const updRef = ref(
      "app/(shop)/customers/actions.ts",
      "updateVehicleAction",
      `/customers/${id}`,
    );
    for (const v of c.vehicles as Record<string, unknown>[]) {
      // What the vehicle's edit form holds and posts (blanks for what is not there).
      const form = Object.fromEntries(
        ["id", "year", "make", "model", "engine", "vin", "notes"].map((k) => [
          k,
          v[k] === null ? "" : String(v[k]),
        ]),
      );
      expect(await act(counter, updRef, formOf(form))).toMatchObject({ ok: true });
    }
    expect(await rows()).toEqual(before);
    // The API's list as it was read, sent back: nothing written, nothing removed.
    const patched = await request(counter, "PATCH", `/api/v1/customers/${id}`, {
      vehicles: c.vehicles,
    });
    expect(patched.status).toBe(200);
    expect(patched.json.customer.vehicles).toHaveLength(2);
    expect(await rows()).toEqual(before);
    expect(await rowText("customers", id)).toBe(customerBefore);
  });

  it("parts, through the part form's action and PATCH (dead-time table, pump curves)", async () => {
    const [injector, pump] = await sql`select id from parts where shop_id = ${SHOP} and (
        (category = 'injector' and specs ? 'deadTime') or (category = 'pump' and specs ? 'curves'))
      order by category, sku`;
    const ids = [injector!.id as string, pump!.id as string];
    // An expected restock day and a lead time are fields of the form too.
    await sql`update parts set restock_on = '2031-03-01', lead_time_days = 12 where id = ${ids[1]!}`;
    const updRef = ref("lib/parts/part-actions.ts", "updatePartAction", "/parts/new");
    for (const id of ids) {
      const before = await rowText("parts", id);
      const p = (await request(counter, "GET", `/api/v1/parts/${id}`)).json.part;
      const form = { ...flatOf(p), category: p.category, id, version: p.version };
      expect(form.dead_time_ms || form.pump_curve, "the form carries the table").toBeTruthy();
      if (id === ids[1])
        expect([form.lead_time_days, form.restock_on]).toEqual(["12", "2031-03-01"]);
      expect(await act(counter, updRef, form)).toMatchObject({ ok: true });
      expect(await rowText("parts", id)).toBe(before);
      const { id: _id, ...body } = form;
      const patched = await request(counter, "PATCH", `/api/v1/parts/${id}`, body);
      expect(patched.status).toBe(200);
      expect(patched.json.part).toMatchObject({ id, version: p.version, specs: p.specs });
      expect(await rowText("parts", id)).toBe(before);
    }
  });

  it("draft quotes, through the editor's action and PATCH: the lines keep their ids", async () => {
    const build = await request(tuner, "POST", "/api/v1/builds", {
      customerId,
      title: `${tag} quoted`,
      inputs: demoInputs,
    });
    const fromBuild = await request(counter, "POST", "/api/v1/quotes", {
      buildId: build.json.build.id,
    });
    const empty = await request(counter, "POST", "/api/v1/quotes", { customerId });
    expect([fromBuild.status, empty.status]).toEqual([201, 201]);
    const editRef = (id: string) =>
      ref("lib/quotes/quote-actions.ts", "editQuoteAction", `/quotes/${id}`);
    for (const id of [fromBuild.json.quote.id as string, empty.json.quote.id as string]) {
      const before = await quoteState(id);
      const q = (await request(counter, "GET", `/api/v1/quotes/${id}`)).json;
      // What the quote editor sends for a quote nobody touched.
      const edit = {
        version: q.quote.version,
        validUntil: q.quote.validUntil,
        notes: q.quote.notes ?? "",
        lines: q.lines.map((l: Record<string, unknown>) => ({
          kind: l.kind,
          partId: l.partId,
          sku: l.sku,
          description: l.description,
          quantityMilli: l.quantityMilli,
          unitPriceMinor: l.unitPriceMinor,
          discountBp: l.discountBp,
        })),
      };
      const patched = await request(counter, "PATCH", `/api/v1/quotes/${id}`, edit);
      expect(patched.status).toBe(200);
      expect(patched.json.quote).toMatchObject({ id, version: q.quote.version });
      expect(await quoteState(id)).toEqual(before);
      expect(await act(counter, editRef(id), { id, ...edit })).toMatchObject({ ok: true });
      expect(await quoteState(id)).toEqual(before);
    }
  });

  it("suppliers and draft invoices, through PATCH: the same again writes nothing", async () => {
    const [part] = await sql`select id from parts where shop_id = ${SHOP} order by sku limit 1`;
    const made = await request(counter, "POST", "/api/v1/suppliers", {
      name: `Round trip supply ${tag}`,
      email: `rt-${tag.toLowerCase()}@supplier.example.test`,
      leadTimeDays: 4,
      parts: [{ partId: part!.id, supplierSku: "RT-1", costMinor: 1234 }],
    });
    expect(made.status).toBe(201);
    const id = made.json.supplier.id as string;
    const before = await rowText("suppliers", id);
    const s = (await request(counter, "GET", `/api/v1/suppliers/${id}`)).json.supplier;
    const patched = await request(counter, "PATCH", `/api/v1/suppliers/${id}`, {
      version: s.version,
      name: s.name,
      email: s.email,
      leadTimeDays: s.leadTimeDays,
      parts: s.parts.map((p: { partId: string; supplierSku: string; costMinor: number }) => ({
        partId: p.partId,
        supplierSku: p.supplierSku,
        costMinor: p.costMinor,
      })),
    });
    expect(patched.status).toBe(200);
    expect(await rowText("suppliers", id)).toBe(before);

    // A draft invoice: its lines and notes sent back as loaded.
    const [q] =
      await sql`insert into quotes (shop_id, number, customer_id, status, currency, tax_rate_bp, valid_until, accepted_at)
      values (${SHOP}, 900000 + floor(random() * 90000)::int, ${customerId}, 'deposit_paid', 'USD', 825, '2099-01-01', now()) returning id`;
    await sql`insert into quote_lines (shop_id, quote_id, position, kind, description, quantity_milli, unit_price_minor)
      values (${SHOP}, ${q!.id}, 1, 'labour', 'Round trip labour', 1500, 12000)`;
    const job = await request(counter, "POST", "/api/v1/jobs", { quoteId: q!.id });
    await request(tuner, "POST", `/api/v1/jobs/${job.json.job.id}/fit`, {
      version: job.json.job.version,
      parts: [],
      labourMilli: 1500,
    });
    const inv = (await request(counter, "POST", "/api/v1/invoices", { jobId: job.json.job.id }))
      .json.invoice;
    const invBefore = await rowText("invoices", inv.id);
    const again = await request(counter, "PATCH", `/api/v1/invoices/${inv.id}`, {
      version: inv.version,
      notes: inv.notes ?? "",
      lines: inv.lines.map(
        (l: {
          kind: string;
          partId: string | null;
          sku: string | null;
          description: string;
          quantityMilli: number;
          unitPriceMinor: number;
          discountBp: number;
        }) => ({
          kind: l.kind,
          partId: l.partId,
          sku: l.sku,
          description: l.description,
          quantityMilli: l.quantityMilli,
          unitPriceMinor: l.unitPriceMinor,
          discountBp: l.discountBp,
        }),
      ),
    });
    expect(again.status).toBe(200);
    expect(await rowText("invoices", inv.id)).toBe(invBefore);
  });

  it("the supplier form and the draft invoice editor, through their actions as the screens fill them: the same again writes nothing", async () => {
    const [part] = await sql`select id from parts where shop_id = ${SHOP} order by sku limit 1`;
    // A supplier with every field the form shows left blank but the name, and one with all set.
    for (const fields of [
      { name: `Round trip form supply ${tag}` },
      {
        name: `Round trip full supply ${tag}`,
        contactName: "Dana Okafor",
        email: `rt-form-${tag.toLowerCase()}@supplier.example.test`,
        phone: "+1 201 555 0199",
        leadTimeDays: 0,
        notes: "Ships Tuesdays\nCall first",
        parts: [{ partId: part!.id, supplierSku: "RT-F1", costMinor: 1999 }],
      },
    ]) {
      const made = await request(counter, "POST", "/api/v1/suppliers", fields);
      expect(made.status).toBe(201);
      const id = made.json.supplier.id as string;
      const before = await rowText("suppliers", id);
      const partsBefore =
        await sql`select p::text as t from supplier_parts p where supplier_id = ${id} order by part_id`;
      const s = (await request(counter, "GET", `/api/v1/suppliers/${id}`)).json.supplier;
      // What components/operations/supplier-editor.tsx sends for a form left as loaded.
      const state = await act(
        counter,
        ref(
          "lib/purchasing/purchasing-actions.ts",
          "updateSupplierAction",
          `/purchasing/suppliers/${id}`,
        ),
        {
          id,
          version: s.version,
          name: s.name,
          contactName: s.contactName ?? "",
          email: s.email ?? "",
          phone: s.phone ?? "",
          leadTimeDays: s.leadTimeDays,
          notes: s.notes ?? "",
          parts: s.parts.map(
            (p: { partId: string; supplierSku: string; costMinor: number | null }) => ({
              partId: p.partId,
              supplierSku: p.supplierSku,
              costMinor: p.costMinor,
            }),
          ),
        },
      );
      expect(state, JSON.stringify(state)).toMatchObject({ ok: true });
      expect(await rowText("suppliers", id)).toBe(before);
      expect(
        await sql`select p::text as t from supplier_parts p where supplier_id = ${id} order by part_id`,
      ).toEqual(partsBefore);
    }

    // A draft invoice with a part line, a discounted labour line and a note, saved as loaded.
    const [q] =
      await sql`insert into quotes (shop_id, number, customer_id, status, currency, tax_rate_bp, valid_until, accepted_at)
      values (${SHOP}, 900000 + floor(random() * 90000)::int, ${customerId}, 'deposit_paid', 'USD', 825, '2099-01-01', now()) returning id`;
    await sql`insert into quote_lines (shop_id, quote_id, position, kind, description, quantity_milli, unit_price_minor, discount_bp)
      values (${SHOP}, ${q!.id}, 1, 'labour', 'Round trip labour', 1250, 12000, 750)`;
    // One unit on the shelf for the fitting to issue.
    await sql`update parts set stock = stock + 1 where id = ${part!.id}`;
    const job = await request(counter, "POST", "/api/v1/jobs", { quoteId: q!.id });
    await request(tuner, "POST", `/api/v1/jobs/${job.json.job.id}/fit`, {
      version: job.json.job.version,
      parts: [{ partId: part!.id, quantity: 1 }],
      labourMilli: 1250,
    });
    const raised = await request(counter, "POST", "/api/v1/invoices", { jobId: job.json.job.id });
    expect(raised.status, JSON.stringify(raised.json)).toBe(201);
    const invId = raised.json.invoice.id as string;
    const noted = await request(counter, "PATCH", `/api/v1/invoices/${invId}`, {
      version: raised.json.invoice.version,
      notes: "Leak-checked\nTorqued to spec",
    });
    expect(noted.status).toBe(200);
    const inv = noted.json.invoice;
    const invBefore = await rowText("invoices", invId);
    const linesBefore =
      await sql`select l::text as t from invoice_lines l where invoice_id = ${invId} order by position`;
    // What components/operations/invoice-editor.tsx sends for a draft left as loaded.
    const saved = await act(
      counter,
      ref("lib/invoices/invoice-actions.ts", "editInvoiceAction", `/invoices/${invId}`),
      {
        id: invId,
        version: inv.version,
        notes: inv.notes,
        lines: inv.lines.map(
          (l: {
            kind: string;
            partId: string | null;
            sku: string | null;
            description: string;
            quantityMilli: number;
            unitPriceMinor: number;
            discountBp: number;
          }) => ({
            kind: l.kind,
            partId: l.partId,
            sku: l.sku,
            description: l.description.trim(),
            quantityMilli: l.quantityMilli,
            unitPriceMinor: l.unitPriceMinor,
            discountBp: l.discountBp,
          }),
        ),
      },
    );
    expect(saved, JSON.stringify(saved)).toMatchObject({
      ok: true,
      data: { version: inv.version },
    });
    expect(await rowText("invoices", invId)).toBe(invBefore);
    expect(
      await sql`select l::text as t from invoice_lines l where invoice_id = ${invId} order by position`,
    ).toEqual(linesBefore);
  });

  it("shop settings, through the settings form as the page fills it, in both unit systems", async () => {
    const names = [
      ...Object.keys(SEED_SETTINGS_FORM),
      "shownUnits",
      "gasolineDensityKgPerL",
      "ethanolDensityKgPerL",
    ];
    const settingsRow = () => rowText("shop_settings", otherShop.shopId, "shop_id");
    const orgRow = () => rowText("organization", otherShop.shopId);
    // Figures with more digits than the form shows (the page once rounded a BSFC, so an unchanged
    // save changed it; a unit round trip could drift any of them).
    await sql`update shop_settings set bsfc_e85_na = 426.5, max_line_drop_kpa = 12.34,
      gasoline_density_kg_per_l = 0.7437 where shop_id = ${otherShop.shopId}`;
    for (const units of ["metric", "imperial"] as const) {
      await sql`update "user" set unit_system = ${units} where id = ${otherShop.userId}`;
      const page = await request(other, "GET", "/settings");
      expect(page.status).toBe(200);
      const saveRef = ref("app/(shop)/settings/actions.ts", "updateSettingsAction", "/settings");
      const filled = formValuesIn(page.text, names);
      expect(Object.keys(filled).sort()).toEqual([...names].sort());
      expect(filled.shownUnits).toBe(units);
      // Shown at the registry's precision in the viewer's units: 426.5 g/kWh = 0.701 lb/hp/h,
      // 12.34 kPa = 1.79 psi, 0.7437 kg/L = 6.21 lb/gal (NIST SP 811 B.8 factors).
      expect([filled.bsfcE85Na, filled.maxLineDropKpa, filled.gasolineDensityKgPerL]).toEqual(
        units === "metric" ? ["427", "12.3", "0.744"] : ["0.701", "1.79", "6.21"],
      );
      const before = [await settingsRow(), await orgRow()];
      expect(await act(other, saveRef, formOf(filled))).toMatchObject({ ok: true });
      expect([await settingsRow(), await orgRow()], units).toEqual(before);
    }
    await sql`update "user" set unit_system = null where id = ${otherShop.userId}`;
  });

  it("tune pulls and tune limits, through their editors' fields in both unit systems and PATCH", async () => {
    const made = await request(tuner, "POST", "/api/v1/builds", {
      customerId,
      title: `${tag} tune round trip`,
      inputs: demoInputs,
    });
    expect(made.status).toBe(201);
    const buildId = made.json.build.id as string;
    const spec = THREE_PULLS[2];
    const up = await fetch(
      `${BASE_URL}/api/v1/builds/${buildId}/tune/pulls?ethanolPct=85&boostTargetKpa=61.37&powerMeasuredAt=hub&notes=${encodeURIComponent("Second gear, E85")}`,
      {
        method: "POST",
        body: spec.csv,
        headers: {
          cookie: tuner.cookie,
          "x-forwarded-for": tuner.ip,
          origin: BASE_URL,
          "content-type": "text/csv",
        },
      },
    );
    expect(up.status, await up.clone().text()).toBe(201);
    const pullId = ((await up.json()) as { pull: { id: string } }).pull.id;
    // The build's own limits with more digits than the editor shows (a unit round trip could
    // drift them: 60 kPa once came back as 59.98 from psi).
    await sql`insert into tune_sessions (shop_id, build_id, limits) values (${SHOP}, ${buildId},
      ${sql.json({
        lambdaTargets: [
          { boostKpa: 0, lambda: 0.905 },
          { boostKpa: 61.37, lambda: 0.8612 },
        ],
        maxEgtC: 937.4,
      })})`;
    const pullRef = ref(
      "lib/tune/tune-actions.ts",
      "updateTunePullAction",
      `/builds/${buildId}/dyno`,
    );
    const limitsRef = ref(
      "lib/tune/tune-actions.ts",
      "saveTuneLimitsAction",
      `/builds/${buildId}/dyno`,
    );
    const pullRow = () => rowText("tune_pulls", pullId);
    const sessionRow = () => rowText("tune_sessions", buildId, "build_id");
    const shopRow = () => rowText("shop_settings", otherShop.shopId, "shop_id");
    for (const units of ["metric", "imperial"] as const) {
      const s = (await request(tuner, "GET", `/api/v1/builds/${buildId}/tune`)).json as {
        limits: TuneLimits;
        pulls: PullFields[];
      };
      const p = s.pulls[0]!;
      // The pull editor as the screen fills it and saves it untouched.
      const before = await pullRow();
      const shown = pullText(p, units);
      expect(shown.boostTarget).toBe(units === "metric" ? "61" : "8.9");
      expect(
        await act(tuner, pullRef, { id: pullId, ...pullFromText(shown, units, p) }),
      ).toMatchObject({ ok: true });
      expect(await pullRow(), units).toBe(before);
      // The limits editor: the build's own fields and the shop's, untouched.
      const sessionBefore = await sessionRow();
      const text = limitsText(s.limits, units);
      expect(
        await act(tuner, limitsRef, {
          buildId,
          scope: "build",
          limits: limitsFromText(text, units, s.limits),
        }),
      ).toMatchObject({ ok: true });
      expect(await sessionRow(), units).toBe(sessionBefore);
      // Settings, the owner of a shop with no limits of its own: the library's saved as shown
      // stay the library's (nothing written); then with the shop's own, unchanged again.
      for (const stored of [null, { ...DEFAULT_TUNE_LIMITS, maxEgtSpreadC: 77.7 }]) {
        await sql`update shop_settings set tune_limits = ${stored === null ? null : sql.json(stored)} where shop_id = ${otherShop.shopId}`;
        const shopBefore = await shopRow();
        const inForce = stored ?? DEFAULT_TUNE_LIMITS;
        expect(
          await act(other, limitsRef, {
            scope: "shop",
            limits: limitsFromText(limitsText(inForce, units), units, inForce),
          }),
        ).toMatchObject({ ok: true });
        expect(await shopRow(), units).toBe(shopBefore);
      }
    }
    // PATCH with the same fields writes nothing either.
    const p = (await request(tuner, "GET", `/api/v1/builds/${buildId}/tune`)).json.pulls[0];
    const before = [await pullRow(), await sessionRow()];
    expect(
      (
        await request(tuner, "PATCH", `/api/v1/tune-pulls/${pullId}`, {
          ethanolPct: p.ethanolPct,
          boostTargetKpa: p.boostTargetKpa,
          notes: p.notes,
          powerMeasuredAt: p.powerMeasuredAt,
        })
      ).status,
    ).toBe(200);
    const limits = (await request(tuner, "GET", `/api/v1/builds/${buildId}/tune`)).json.limits;
    expect(
      (await request(tuner, "PATCH", `/api/v1/builds/${buildId}/tune`, { limits })).status,
    ).toBe(200);
    expect([await pullRow(), await sessionRow()]).toEqual(before);
    const shopBefore = await shopRow();
    const shopLimits = (await request(other, "GET", "/api/v1/shop/settings")).json.settings
      .tuneLimits;
    expect(
      (await request(other, "PATCH", "/api/v1/shop/settings", { tuneLimits: shopLimits })).status,
    ).toBe(200);
    expect(await shopRow()).toBe(shopBefore);
    await sql`update shop_settings set tune_limits = null where shop_id = ${otherShop.shopId}`;
  });

  it("a member's role, a person's units and the shop's logo: the same again writes nothing", async () => {
    const [m] =
      await sql`select m.id, m.role from member m join "user" u on u.id = m.user_id where m.organization_id = ${SHOP} and u.email = 'tuner@demo.fuelwright.test'`;
    const before = await rowText("member", m!.id);
    const roleRef = ref("app/(shop)/settings/actions.ts", "changeRoleAction", "/settings");
    expect(await act(owner, roleRef, formOf({ memberId: m!.id, role: m!.role }))).toMatchObject({
      ok: true,
    });
    expect(await rowText("member", m!.id)).toBe(before);

    const unitsRef = ref("lib/preferences/preference-actions.ts", "setUnitsAction", "/builds");
    expect(await act(other, unitsRef, formOf({ units: "metric" }))).toMatchObject({ ok: true });
    const user = await rowText("user", otherShop.userId);
    expect(await act(other, unitsRef, formOf({ units: "metric" }))).toMatchObject({ ok: true });
    expect(await rowText("user", otherShop.userId)).toBe(user);

    const png = solidPng(40, 20);
    const put = () =>
      fetch(`${BASE_URL}/api/v1/shop/logo`, {
        method: "PUT",
        body: new Uint8Array(png),
        headers: {
          cookie: other.cookie,
          "x-forwarded-for": other.ip,
          origin: BASE_URL,
          "content-type": "image/png",
        },
      });
    expect((await put()).status).toBeLessThan(300);
    const logo = await rowText("shop_logos", otherShop.shopId, "shop_id");
    const again = await put();
    expect(again.status).toBeLessThan(300);
    expect(await rowText("shop_logos", otherShop.shopId, "shop_id")).toBe(logo);
  });
});

describe("stale edit forms: a second tab's save is a 409 and overwrites nothing", () => {
  it("customers: the form and PATCH with the version they loaded; PATCH without one still saves", async () => {
    const made = await request(counter, "POST", "/api/v1/customers", { name: `${tag} Two Tabs` });
    const id = made.json.customer.id as string;
    const v = made.json.customer.version as number;
    const updRef = ref(
      "app/(shop)/customers/actions.ts",
      "updateCustomerAction",
      `/customers/${id}`,
    );
    // Tab one saves a change: the next version.
    const first = await act(
      counter,
      updRef,
      formOf({ id, version: String(v), name: `${tag} Tab One` }),
    );
    expect(first).toMatchObject({ ok: true, data: { customer: { version: v + 1 } } });
    const saved = await rowText("customers", id);
    // Tab two, still at the version it loaded: refused with the customer as it is now.
    const stale = await act(
      counter,
      updRef,
      formOf({ id, version: String(v), name: `${tag} Tab Two` }),
    );
    expect(stale).toMatchObject({ ok: false, status: 409, code: "conflict" });
    expect(stale.current).toMatchObject({ id, version: v + 1, name: `${tag} Tab One` });
    const api = await request(counter, "PATCH", `/api/v1/customers/${id}`, {
      version: v,
      phone: "201-555-0000",
    });
    expect(api.status).toBe(409);
    expect(api.json.current).toMatchObject({ version: v + 1, name: `${tag} Tab One` });
    expect(await rowText("customers", id)).toBe(saved);
    // "Save mine over theirs": from the version now stored.
    expect(
      await act(counter, updRef, formOf({ id, version: String(v + 1), name: `${tag} Tab Two` })),
    ).toMatchObject({ ok: true, data: { customer: { version: v + 2, name: `${tag} Tab Two` } } });
    // An API client that names no version: the last write wins.
    const blind = await request(counter, "PATCH", `/api/v1/customers/${id}`, {
      phone: "201-555-0001",
    });
    expect(blind.json.customer).toMatchObject({ version: v + 3, phone: "+12015550001" });
  });

  it("parts: the form and PATCH with the version they loaded", async () => {
    const sku = `${tag}-TABS`;
    const made = await request(counter, "POST", "/api/v1/parts", {
      sku,
      category: "fitting",
      brand: "Testbrand",
      name: "Two tabs fitting",
      price: "4.50",
      stock: "3",
    });
    expect(made.status).toBe(201);
    const id = made.json.part.id as string;
    const v = made.json.part.version as number;
    const updRef = ref("lib/parts/part-actions.ts", "updatePartAction", "/parts/new");
    expect(await act(counter, updRef, { id, version: v, name: "Tab one" })).toMatchObject({
      ok: true,
    });
    const saved = await rowText("parts", id);
    const stale = await act(counter, updRef, { id, version: v, name: "Tab two" });
    expect(stale).toMatchObject({ ok: false, status: 409, code: "conflict" });
    expect(stale.current).toMatchObject({ id, version: v + 1, name: "Tab one" });
    const api = await request(counter, "PATCH", `/api/v1/parts/${id}`, { version: v, stock: "9" });
    expect(api.status).toBe(409);
    expect(api.json.current).toMatchObject({ version: v + 1, stock: 3 });
    expect(await rowText("parts", id)).toBe(saved);
  });
});

describe("CSV: the catalog export → import → export is identical; downloads are safe in a spreadsheet", () => {
  const exportCsv = async (c: Client) => {
    const r = await request(c, "GET", "/api/v1/parts/export");
    expect(r.status).toBe(200);
    return r.text;
  };
  const importCsv = (c: Client, csv: string) =>
    request(c, "POST", "/api/v1/parts/import", csv, { "content-type": "text/csv" });

  it("the demo catalog (dead-time tables and pump curves): identical, and the import writes nothing", async () => {
    const first = await exportCsv(counter);
    expect(first.split("\r\n")[0]).toContain("dead_time_ms");
    expect(first).toMatch(/,10V 300:1\.4 500:1\.6 \| 12V /);
    expect(first).toMatch(/,13\.5V 300:\d+ 500:\d+ 700:\d+ \| 12V /);
    const before = await fingerprint(["parts"]);
    const r = await importCsv(counter, first);
    expect(r.status).toBe(200);
    expect(r.json).toMatchObject({ added: 0, updated: 0 });
    expect(r.json.unchanged).toBeGreaterThan(10);
    expect(await fingerprint(["parts"])).toBe(before);
    expect(await exportCsv(counter)).toBe(first);
  });

  it("formula-like text is neutralised on the way out and given back on the way in", async () => {
    const shop = otherShop.shopId;
    const deadTime = {
      voltages: [11, 13.5],
      pressuresKpa: [250, 400],
      deadTimeMs: [
        [1.25, 1.375],
        [0.8, 0.91],
      ],
    };
    const curves = [
      {
        voltage: 13.5,
        points: [
          { pressureKpa: 300, flowLPerH: 255.5 },
          { pressureKpa: 600, flowLPerH: 180 },
        ],
      },
    ];
    await sql`insert into parts (shop_id, sku, category, brand, name, price_minor, cost_minor, stock, reorder_level, lead_time_days, restock_on, specs) values
      (${shop}, 'X-INJ', 'injector', '@Brand', '=HYPERLINK("http://evil.example","Click")', 12345, 6000, 4, 1, null, null,
        ${sql.json({ ratedFlowCcPerMin: 1200, ratedPressureKpa: 300, impedance: "high", connector: "-EV14", ethanolOk: true, deadTime })}),
      (${shop}, 'X-PMP', 'pump', 'Plain', '+1 pump', 20000, 0, 2, 0, 21, '2031-02-28',
        ${sql.json({ curves, currentA: 12.5, mounting: "inline", ethanolOk: false })})`;
    const first = await exportCsv(other);
    expect(first).toContain(`'=HYPERLINK(""http://evil.example"",""Click"")`);
    expect(first).toContain("'@Brand");
    expect(first).toContain("'-EV14");
    expect(first).toContain("'+1 pump");
    expect(first).toContain("11V 250:1.25 400:1.375 | 13.5V 250:0.8 400:0.91");
    expect(first).toContain("13.5V 300:255.5 600:180");
    // Lead time and expected restock travel with the part (blank: not known).
    expect(first).toMatch(/\nX-PMP,pump,Plain,'\+1 pump,200\.00,0\.00,2,0,21,2031-02-28,/);
    expect(first).toMatch(/\nX-INJ,injector,'@Brand,.*,123\.45,60\.00,4,1,,,/);
    const rows = () =>
      sql`select p::text as t from parts p where shop_id = ${shop} order by sku`.then((r) =>
        r.map((x) => x.t as string),
      );
    const before = await rows();
    const r = await importCsv(other, first);
    expect(r.status).toBe(200);
    expect(r.json).toMatchObject({ added: 0, updated: 0, unchanged: 2 });
    expect(await rows()).toEqual(before);
    expect(await exportCsv(other)).toBe(first);
    const [stored] =
      await sql`select name, brand from parts where shop_id = ${shop} and sku = 'X-INJ'`;
    expect(stored).toEqual({ name: '=HYPERLINK("http://evil.example","Click")', brand: "@Brand" });

    // A file without dead_time_ms and pump_curve changes a known SKU only in its own columns.
    const slim =
      "sku,category,brand,name,price,stock,flow_cc_min\nX-INJ,injector,@Brand,Renamed,123.45,4,1200\n";
    expect((await importCsv(other, slim)).json).toMatchObject({ updated: 1 });
    const [kept] =
      await sql`select name, specs, version from parts where shop_id = ${shop} and sku = 'X-INJ'`;
    expect(kept!.name).toBe("Renamed");
    expect(kept!.specs.deadTime).toEqual(deadTime);
    expect(kept!.version).toBe(2);

    // A bad table cell is an error with its line and column; nothing is written.
    const was = await rows();
    const bad =
      "sku,category,brand,name,price,stock,flow_cc_min,dead_time_ms\nX-INJ,injector,B,N,1,1,1200,12V 300:0.9 | 14V 500:0.7\n";
    const refused = await importCsv(other, bad);
    expect(refused.status).toBe(422);
    expect(refused.json.error.rows).toEqual([
      { line: 2, field: "dead_time_ms", message: expect.stringMatching(/kPa:ms/) },
    ]);
    expect(await rows()).toEqual(was);
  });

  it("a datalog download neutralises formula cells and keeps every other byte; analysing it again writes nothing", async () => {
    const made = await request(tuner, "POST", "/api/v1/builds", {
      customerId,
      title: `${tag} dyno`,
      inputs: demoInputs,
    });
    const csv =
      "RPM,Duty,Note\r\nrpm,%,\r\n3000,41.5,=cmd|' /C calc'!A0\r\n3100,-2,\"@SUM(1)\"\r\n";
    const up = await request(tuner, "POST", `/api/v1/builds/${made.json.build.id}/datalogs`, csv, {
      "content-type": "text/csv",
      "x-file-name": "formula.csv",
    });
    expect(up.status).toBe(201);
    const id = up.json.datalog.id as string;
    // Analysing again with the same mapping writes nothing (the log, the remembered mapping).
    const mapping = { rpm: "RPM", duty: { column: "Duty", kind: "duty_pct" } };
    const analyse = () => request(tuner, "POST", `/api/v1/datalogs/${id}/analysis`, { mapping });
    expect((await analyse()).status).toBe(200);
    const analysed = [await rowText("datalogs", id), await fingerprint(["datalog_mappings"])];
    expect((await analyse()).status).toBe(200);
    expect([await rowText("datalogs", id), await fingerprint(["datalog_mappings"])]).toEqual(
      analysed,
    );
    const file = await getBytes(tuner, `/api/v1/datalogs/${id}/file`);
    expect(file.status).toBe(200);
    expect(file.bytes.toString("utf8")).toBe(
      "RPM,Duty,Note\r\nrpm,%,\r\n3000,41.5,'=cmd|' /C calc'!A0\r\n3100,-2,\"'@SUM(1)\"\r\n",
    );
  });
});
