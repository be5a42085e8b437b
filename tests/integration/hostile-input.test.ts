import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { actionManifest, callAction, formOf } from "../helpers/actions";
import { sql } from "../helpers/db";
import { BASE_URL, request, signIn, type Client } from "../helpers/http";
import { solidPng } from "../helpers/png";
import { ACTIONS, makeFixtures, ROUTES, type Fx } from "../helpers/surface";

/**
 * Generated hostile input against every API route and server action, signed in as the owner
 * (so the input, not the permission, is what is judged): wrong types, missing and extra
 * fields, huge and negative numbers, NaN and Infinity spelled as strings, deep nesting, very
 * long strings, unicode, prototype-pollution keys. Zero 5xx; every 4xx is a JSON error, and a
 * 422 about the input (`invalid_input`) names the fields. A 422 about the record's state
 * (`invalid_transition`: revising a quote that is not accepted) has no field to name; its
 * message says what is wrong.
 */
const RUNS = Number(process.env.HOSTILE_RUNS ?? 12);
let owner: Client;
let fx: Fx;
beforeAll(async () => {
  owner = await signIn("owner@demo.fuelwright.test");
  const [tuner, counter] = await Promise.all([
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
  ]);
  fx = await makeFixtures({ tuner, counter });
});
afterAll(async () => {
  await sql.end();
});

const nasty = fc.oneof(
  fc.constantFrom(
    "NaN",
    "Infinity",
    "-Infinity",
    "1e309",
    "-0",
    "0x10",
    "1_000",
    "",
    " ",
    "null",
    "undefined",
    "true",
    "[]",
    "{}",
    "<script>alert(1)</script>",
    "' or 1=1 --",
    "../../etc/passwd",
    "\u0000",
    "💥🔥",
    "Ω≈ç√∫",
    "\u202eevil",
  ),
  fc.constantFrom(
    1e308,
    -1e308,
    Number.MAX_SAFE_INTEGER,
    -Number.MAX_SAFE_INTEGER,
    -1,
    0,
    2 ** 31,
    1e-320,
    0.1 + 0.2,
  ),
  fc.string({ unit: "binary", maxLength: 40 }),
  fc.constant("x".repeat(100_000)),
  fc.boolean(),
  fc.constant(null),
  fc.integer(),
  fc.double(),
  fc.constant([]),
  fc.constant({}),
);
/** An array nested `depth` deep: parsers must not fall over it. */
const deepOf = (max: number) =>
  fc.integer({ min: 50, max }).map((d) => JSON.parse("[".repeat(d) + "]".repeat(d)) as unknown);
const deep = deepOf(3000);
const pollution = fc
  .constantFrom("__proto__", "constructor", "prototype")
  .chain((k) =>
    nasty.map(
      (v) => JSON.parse(`{"${k}": ${JSON.stringify(v) ?? "null"}, "isAdmin": true}`) as unknown,
    ),
  );

/** Replaces, removes or adds one field somewhere in a valid body. */
function mutate(valid: unknown): fc.Arbitrary<unknown> {
  const paths: (string | number)[][] = [];
  const walk = (v: unknown, p: (string | number)[]) => {
    paths.push(p);
    if (Array.isArray(v)) v.forEach((x, i) => walk(x, [...p, i]));
    else if (v && typeof v === "object") for (const [k, x] of Object.entries(v)) walk(x, [...p, k]);
  };
  walk(valid, []);
  return fc
    .tuple(
      fc.constantFrom(...paths),
      fc.oneof(nasty, deep, pollution),
      fc.constantFrom("replace", "remove", "extra"),
    )
    .map(([path, value, how]) => {
      const copy = structuredClone(valid) as Record<string | number, unknown>;
      if (path.length === 0) return how === "remove" ? undefined : value;
      let at = copy as Record<string | number, unknown>;
      for (const k of path.slice(0, -1)) at = at[k] as Record<string | number, unknown>;
      const last = path[path.length - 1]!;
      if (how === "remove") delete at[last];
      else if (how === "extra" && at && typeof at === "object")
        Object.assign(at, { [`extra_${String(last)}`]: value, __proto__: { polluted: true } });
      else at[last] = value;
      return copy;
    });
}
const body = (valid: unknown) =>
  fc.oneof(mutate(valid ?? {}), nasty, deep, pollution, fc.jsonValue({ maxDepth: 4 }));
const query = fc.dictionary(
  fc.constantFrom(
    "q",
    "status",
    "limit",
    "cursor",
    "sort",
    "tuner",
    "category",
    "session",
    "version",
    "dryRun",
    "__proto__",
    "x",
  ),
  fc.oneof(
    fc.string({ maxLength: 30 }),
    nasty.map((v) => String(v).slice(0, 4000)),
  ),
  { maxKeys: 4 },
);

/** Failure reports without printing the (deep, huge) counterexample itself: the error names the case. */
function briefReport<T>(out: fc.RunDetails<T>) {
  if (out.failed)
    throw new Error(
      `hostile input failed (seed ${out.seed}, after ${out.numRuns} runs): ${out.errorInstance instanceof Error ? out.errorInstance.message.slice(0, 800) : String(out.errorInstance).slice(0, 800)}`,
    );
}

function judgeResponse(label: string, status: number, contentType: string | null, json: unknown) {
  expect(status, `${label}: never a 5xx`).toBeLessThan(500);
  if (status >= 400) {
    expect(contentType ?? "", `${label}: a JSON error`).toMatch(/application\/json/);
    const err = (
      json as {
        error?: {
          code?: unknown;
          message?: unknown;
          issues?: { path: unknown; message: unknown }[];
        };
      }
    )?.error;
    expect(typeof err?.message, `${label}: the error says what is wrong`).toBe("string");
    if (status === 422 && err?.code === "invalid_input")
      expect(err.issues?.length, `${label}: names the field`).toBeGreaterThan(0);
    if (status === 422 && err?.issues) {
      for (const i of err.issues)
        expect(
          typeof i.path === "string" && i.path.length > 0 && typeof i.message === "string",
          `${label}: ${JSON.stringify(i)}`,
        ).toBe(true);
    }
  }
}

describe("hostile input", () => {
  it("every API route: generated bodies and query strings never cause a 5xx; errors are JSON naming the field", async () => {
    for (const [key, cell] of Object.entries(ROUTES)) {
      const method = key.split(" ")[0]!;
      if (key.includes("/api/auth/")) continue; // better-auth's own endpoints: the sign-in limit and reset tests cover them
      const base = cell.call(fx);
      const arb =
        method === "GET" || method === "DELETE"
          ? query.map((q) => ({ q, b: undefined as unknown }))
          : fc.tuple(query, body(base.body)).map(([q, b]) => ({ q, b }));
      await fc.assert(
        fc.asyncProperty(arb, async ({ q, b }) => {
          const u = new URL(base.path, BASE_URL);
          for (const [k, v] of Object.entries(q)) u.searchParams.set(k, v);
          const raw = b === undefined ? undefined : (JSON.stringify(b) ?? "null");
          const res = await request(
            owner,
            method,
            u.pathname + u.search,
            raw,
            raw === undefined ? {} : { "content-type": base.raw?.type ?? "application/json" },
          );
          judgeResponse(
            `${key} ${u.search.slice(0, 120)} ${String(raw).slice(0, 120)}`,
            res.status,
            res.headers.get("content-type"),
            res.json,
          );
        }),
        {
          numRuns: RUNS,
          seed: Number(process.env.HOSTILE_SEED ?? Date.now() % 2 ** 31),
          reporter: briefReport,
        },
      );
    }
  });

  it("every server action: generated form data and arguments never crash it; a refusal names the fields", async () => {
    const manifest = actionManifest();
    for (const [key, cell] of Object.entries(ACTIONS)) {
      const [file, name] = key.split("#") as [string, string];
      const ref = {
        ...manifest.find((r) => r.file === file && r.name === name)!,
        page: cell.page(fx),
      };
      expect(ref.id, key).toBeTruthy();
      const valid = cell.args(fx);
      const isForm = valid[1] instanceof FormData;
      const arb = isForm
        ? fc
            .dictionary(
              fc.oneof(
                fc.constantFrom(
                  "id",
                  "name",
                  "email",
                  "units",
                  "role",
                  "memberId",
                  "customerId",
                  "title",
                  "shopName",
                  "taxRatePct",
                  "__proto__",
                  "constructor",
                ),
                fc.string({ maxLength: 20 }),
              ),
              nasty.map((v) => (typeof v === "string" ? v : (JSON.stringify(v) ?? ""))),
              { maxKeys: 6 },
            )
            .map((d) => [valid[0], formOf(d)])
        : fc.array(fc.oneof(nasty, deepOf(120), pollution, mutate(valid[valid.length - 1])), {
            minLength: 0,
            maxLength: 3,
          });
      await fc.assert(
        fc.asyncProperty(arb, async (args) => {
          const r = await callAction(owner, ref, args as unknown[]);
          if (r.http === 0) return; // not sendable: React's encoder refuses it in the browser too
          const label = `${key} ${JSON.stringify(args).slice(0, 120)}`;
          expect(r.http, `${label}: never a 5xx`).toBeLessThan(500);
          const state = r.state as {
            ok: boolean;
            status?: number;
            code?: string;
            fieldErrors?: Record<string, unknown>;
          } | null;
          if (state && !state.ok && state.status === 422 && state.code === "invalid_input") {
            const fe = state.fieldErrors;
            expect(fe && Object.keys(fe).length > 0, `${label}: names the fields`).toBe(true);
          }
        }),
        { numRuns: RUNS, reporter: briefReport },
      );
    }
  });

  it("uploads of the wrong type, empty, oversized or truncated get a clear 4xx", async () => {
    const png = solidPng(64, 64, [200, 80, 20]);
    const cases: [string, string, BodyInit, string][] = [
      ["PUT", "/api/v1/shop/logo", new Uint8Array(png.subarray(0, png.length / 2)), "image/png"],
      ["PUT", "/api/v1/shop/logo", new Uint8Array(0), "image/png"],
      ["PUT", "/api/v1/shop/logo", "GIF89a not really", "image/gif"],
      ["PUT", "/api/v1/shop/logo", new Uint8Array(1_100_000), "image/png"],
      [
        "POST",
        "/api/v1/parts/import",
        "sku,category,brand,name,price\nTR-1,injector,Trunc",
        "text/csv",
      ],
      ["POST", "/api/v1/parts/import", new Uint8Array([0xff, 0xd8, 0xff, 0x00, 0x10]), "text/csv"],
      ["POST", "/api/v1/parts/import", "", "text/csv"],
      ["POST", `/api/v1/builds/${fx.build}/datalogs`, "RPM,Duty\n3000,4", "application/json"],
      ["POST", `/api/v1/builds/${fx.build}/datalogs`, "RPM,Duty\n3000", "text/csv"],
      [
        "POST",
        `/api/v1/builds/${fx.build}/datalogs`,
        new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0, 0, 0]),
        "text/csv",
      ],
    ];
    for (const [method, path, b, type] of cases) {
      const res = await fetch(`${BASE_URL}${path}`, {
        method,
        body: b,
        headers: {
          cookie: owner.cookie,
          "x-forwarded-for": owner.ip,
          origin: BASE_URL,
          "content-type": type,
        },
      });
      const text = await res.text();
      const label = `${method} ${path} (${type})`;
      expect(res.status, `${label}: ${text.slice(0, 200)}`).toBeGreaterThanOrEqual(400);
      expect(res.status, label).toBeLessThan(500);
      expect(
        (JSON.parse(text) as { error: { message: string } }).error.message.length,
        label,
      ).toBeGreaterThan(5);
    }
  });
});
