import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { actionManifest, callAction, type ActionRef } from "../helpers/actions";
import { appTables, changedTables, makeOtherShop, sql, tableHashes } from "../helpers/db";
import { BASE_URL, signIn, type Client } from "../helpers/http";
import { solidPng } from "../helpers/png";
import { ACTIONS, makeFixtures, ROUTES, type Fx } from "../helpers/surface";

/**
 * Cross-site requests (a form or script on another site riding the signed-in person's cookie):
 * every unsafe /api/v1 route and every server action, posted with a foreign Origin, with none,
 * with `Origin: null`, with `Sec-Fetch-Site: cross-site` and no Origin — 403; and from our own
 * origin with the content types a plain HTML form can send without asking (text/plain,
 * urlencoded, multipart) to a JSON route — 415. Each refusal changes no row of any table.
 * Uploads that take other types (catalog CSV, datalog, logo bytes) keep working from our origin.
 */
const FOREIGN = "https://evil.example";
let owner: Client;
let otherOwner: Client;
let fx: Fx;
let tables: string[];

beforeAll(async () => {
  owner = await signIn("owner@demo.fuelwright.test");
  const other = await makeOtherShop();
  const [tuner, counter, o] = await Promise.all([
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
  otherOwner = o;
  fx = await makeFixtures({ tuner, counter });
  tables = await appTables();
}, 120_000);

afterAll(async () => {
  await sql.end();
});

/** The origin headers of each cross-site variant (null: header left out). */
const CROSS_SITE: [string, Record<string, string | null>][] = [
  ["a foreign Origin", { origin: FOREIGN, "sec-fetch-site": "cross-site" }],
  ["a foreign Origin (no Sec-Fetch-Site)", { origin: FOREIGN }],
  ["no Origin", { origin: null }],
  ["Origin: null", { origin: "null" }],
  ["Sec-Fetch-Site: cross-site, no Origin", { origin: null, "sec-fetch-site": "cross-site" }],
  ["our Origin marked cross-site", { origin: BASE_URL, "sec-fetch-site": "cross-site" }],
  ["a sibling port", { origin: BASE_URL.replace(/:(\d+)$/, (_, p) => `:${Number(p) + 1}`) }],
];
/** What a plain HTML form can send without a preflight, each with a JSON-looking body. */
const FORM_TYPES: [string, (json: string) => { type: string; body: BodyInit }][] = [
  ["text/plain", (json) => ({ type: "text/plain;charset=UTF-8", body: json })],
  [
    "application/x-www-form-urlencoded",
    (json) => ({ type: "application/x-www-form-urlencoded", body: `${json}=` }),
  ],
  [
    "multipart/form-data",
    (json) => ({
      type: "multipart/form-data; boundary=fwxsite",
      body: `--fwxsite\r\nContent-Disposition: form-data; name="${json.replace(/"/g, "'")}"\r\n\r\nx\r\n--fwxsite--\r\n`,
    }),
  ],
];
const UPLOAD_TYPES: Record<string, string[]> = {
  "POST /api/v1/parts/import": ["text/csv", "text/plain"],
  "POST /api/v1/builds/[id]/datalogs": ["text/csv", "text/plain"],
  "POST /api/v1/builds/[id]/tune/pulls": ["text/csv", "text/plain"],
  "PUT /api/v1/shop/logo": ["image/png"],
};

async function send(
  client: Client,
  method: string,
  path: string,
  headers: Record<string, string | null>,
  body?: BodyInit,
) {
  const h: Record<string, string> = {
    cookie: client.cookie,
    "x-forwarded-for": client.ip,
    origin: BASE_URL,
  };
  for (const [k, v] of Object.entries(headers)) {
    if (v === null) delete h[k];
    else h[k] = v;
  }
  const res = await fetch(`${BASE_URL}${path}`, { method, headers: h, body, redirect: "manual" });
  const text = await res.text();
  let json: any;
  try {
    json = JSON.parse(text);
  } catch {
    json = undefined;
  }
  return { status: res.status, text, json };
}

const unsafeRoutes = () =>
  Object.entries(ROUTES).filter(
    ([k]) => /^(POST|PUT|PATCH|DELETE) \/api\/v1\//.test(k) && !k.startsWith("GET"),
  );

/** The request's valid body and type (JSON unless the route takes an upload). */
function validBody(key: string): { path: string; type?: string; body?: BodyInit } {
  const { path, body, raw } = ROUTES[key]!.call(fx);
  if (raw) return { path, type: raw.type, body: raw.body };
  if (body === undefined) return { path };
  return { path, type: "application/json", body: JSON.stringify(body) };
}

describe("cross-site writes to the API", () => {
  it("every unsafe /api/v1 route refuses each cross-site variant with 403 and changes nothing", async () => {
    const problems: string[] = [];
    for (const [key] of unsafeRoutes()) {
      const [method] = key.split(" ") as [string];
      const { path, type, body } = validBody(key);
      for (const [variant, headers] of CROSS_SITE) {
        const before = await tableHashes(tables);
        const res = await send(
          owner,
          method,
          path,
          { ...headers, ...(type ? { "content-type": type } : {}) },
          body,
        );
        const changed = changedTables(before, await tableHashes(tables));
        if (res.status !== 403 || res.json?.error?.code !== "cross_site")
          problems.push(`${key} with ${variant}: ${res.status} ${res.text.slice(0, 120)}`);
        if (changed.length) problems.push(`${key} with ${variant}: changed ${changed.join(", ")}`);
      }
    }
    expect(problems).toEqual([]);
  });

  it("from our origin, a JSON route refuses a form's content types with 415 and changes nothing", async () => {
    const problems: string[] = [];
    for (const [key] of unsafeRoutes()) {
      const [method] = key.split(" ") as [string];
      const { path, body } = validBody(key);
      const json = typeof body === "string" ? body : "{}";
      for (const [name, make] of FORM_TYPES) {
        if (UPLOAD_TYPES[key]?.includes(name)) continue; // that upload takes it (below)
        const { type, body: formBody } = make(json);
        const before = await tableHashes(tables);
        const res = await send(owner, method, path, { "content-type": type }, formBody);
        const changed = changedTables(before, await tableHashes(tables));
        if (res.status !== 415 || typeof res.json?.error?.message !== "string")
          problems.push(`${key} as ${name}: ${res.status} ${res.text.slice(0, 120)}`);
        if (changed.length) problems.push(`${key} as ${name}: changed ${changed.join(", ")}`);
      }
      // A body naming no type at all is no JSON either.
      const before = await tableHashes(tables);
      const res = await send(owner, method, path, {}, new Blob([json]));
      if (!UPLOAD_TYPES[key] && res.status !== 415)
        problems.push(`${key} with an untyped body: ${res.status} ${res.text.slice(0, 120)}`);
      if (!UPLOAD_TYPES[key] && changedTables(before, await tableHashes(tables)).length)
        problems.push(`${key} with an untyped body: changed rows`);
    }
    expect(problems).toEqual([]);
  });

  it("a DELETE with no body is a legitimate write; one with a body that is not JSON is 415", async () => {
    const before = await tableHashes(tables);
    const withText = await send(
      owner,
      "DELETE",
      `/api/v1/share-links/${fx.share}`,
      { "content-type": "text/plain" },
      "x",
    );
    expect(withText.status).toBe(415);
    expect(changedTables(before, await tableHashes(tables))).toEqual([]);
    const plain = await send(owner, "DELETE", `/api/v1/share-links/${fx.share}`, {});
    expect(plain.status).toBe(204);
    const [link] = await sql`select revoked_at from share_links where id = ${fx.share}`;
    expect(link!.revoked_at).not.toBeNull();
  });

  it("uploads keep taking their own types from our origin, and refuse them from another site", async () => {
    const csv = "sku,category,brand,name,price,stock\nXS-1,fitting,Crossware,Cross part,1.00,1\n";
    for (const type of UPLOAD_TYPES["POST /api/v1/parts/import"]!) {
      const ok = await send(
        owner,
        "POST",
        "/api/v1/parts/import?dryRun=1",
        { "content-type": type },
        csv,
      );
      expect(ok.status, `catalog CSV as ${type}`).toBe(200);
    }
    const log = "rpm,duty\n3000,40\n3100,41\n";
    for (const type of UPLOAD_TYPES["POST /api/v1/builds/[id]/datalogs"]!) {
      const ok = await send(
        owner,
        "POST",
        `/api/v1/builds/${fx.build}/datalogs`,
        { "content-type": type, "x-file-name": "cross.csv" },
        log,
      );
      expect(ok.status, `datalog as ${type}`).toBe(201);
    }
    const pulls = `/api/v1/builds/${fx.build}/tune/pulls?ethanolPct=85&powerMeasuredAt=crank`;
    for (const type of UPLOAD_TYPES["POST /api/v1/builds/[id]/tune/pulls"]!) {
      const ok = await send(owner, "POST", pulls, { "content-type": type }, log);
      expect(ok.status, `tune pull as ${type}`).toBe(201);
    }
    // The logo of another shop (its owner's), so the demo shop's stays as it is.
    const png = new Uint8Array(solidPng(32, 32, [20, 120, 200]));
    const put = await send(
      otherOwner,
      "PUT",
      "/api/v1/shop/logo",
      { "content-type": "image/png" },
      png,
    );
    expect(put.status).toBe(200);
    // The same four from another site: refused, nothing stored.
    const before = await tableHashes(tables);
    for (const [path, method, type, body] of [
      ["/api/v1/parts/import", "POST", "text/plain", csv],
      [`/api/v1/builds/${fx.build}/datalogs`, "POST", "text/plain", log],
      [pulls, "POST", "text/plain", log],
      ["/api/v1/shop/logo", "PUT", "image/png", png],
    ] as const) {
      const res = await send(owner, method, path, { origin: FOREIGN, "content-type": type }, body);
      expect(res.status, `${method} ${path} from another site`).toBe(403);
    }
    expect(changedTables(before, await tableHashes(tables))).toEqual([]);
  });
});

describe("cross-site server actions", () => {
  let refs: [string, ActionRef, unknown[]][];
  beforeAll(() => {
    const manifest = actionManifest();
    refs = Object.entries(ACTIONS).map(([key, cell]) => {
      const [file, name] = key.split("#") as [string, string];
      const found = manifest.find((m) => m.file === file && m.name === name);
      expect(found, `${key} is in the build's action manifest`).toBeTruthy();
      return [key, { ...found!, page: cell.page(fx) }, cell.args(fx)];
    });
  });

  it("every server action refuses each cross-site variant with 403 before it runs, changing nothing", async () => {
    const problems: string[] = [];
    for (const [key, ref, args] of refs) {
      for (const [variant, headers] of CROSS_SITE) {
        const before = await tableHashes(tables);
        const r = await callAction(owner, ref, args, { headers });
        const changed = changedTables(before, await tableHashes(tables));
        if (r.http === 0) continue;
        if (r.http !== 403 || !/"cross_site"/.test(r.text))
          problems.push(`${key} with ${variant}: ${r.http} ${r.text.slice(0, 120)}`);
        if (changed.length) problems.push(`${key} with ${variant}: changed ${changed.join(", ")}`);
      }
    }
    expect(problems).toEqual([]);
  });

  it("a server action sent as another content type (JSON, urlencoded) is 415, changing nothing", async () => {
    const problems: string[] = [];
    for (const [key, ref, args] of refs) {
      for (const type of ["application/json", "application/x-www-form-urlencoded"]) {
        const before = await tableHashes(tables);
        const r = await callAction(owner, ref, args, {
          headers: { "content-type": type },
          body: JSON.stringify(args.map((a) => (a instanceof FormData ? {} : a))),
        });
        if (r.http !== 415) problems.push(`${key} as ${type}: ${r.http} ${r.text.slice(0, 120)}`);
        if (changedTables(before, await tableHashes(tables)).length)
          problems.push(`${key} as ${type}: changed rows`);
      }
    }
    expect(problems).toEqual([]);
  });

  it("a form posted without scripts from another site (multipart, the action's id in a field) is 403", async () => {
    const [, ref] = refs.find(([k]) => k.endsWith("#createCustomerAction"))!;
    const form = new FormData();
    form.set(`$ACTION_ID_${ref.id}`, "");
    form.set("name", "Cross-site customer");
    for (const [variant, headers] of CROSS_SITE) {
      const before = await tableHashes(tables);
      const h: Record<string, string> = { cookie: owner.cookie, "x-forwarded-for": owner.ip };
      for (const [k, v] of Object.entries(headers)) if (v !== null) h[k] = v;
      const res = await fetch(`${BASE_URL}${ref.page}`, {
        method: "POST",
        headers: h,
        body: form,
        redirect: "manual",
      });
      expect(res.status, variant).toBe(403);
      expect(changedTables(before, await tableHashes(tables)), variant).toEqual([]);
    }
    const [made] =
      await sql`select count(*)::int as n from customers where name = 'Cross-site customer'`;
    expect(made!.n).toBe(0);
  });
});
