import { readdirSync, readFileSync, statSync } from "node:fs";
import { join } from "node:path";

import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { actionManifest, callAction, type ActionRef } from "../helpers/actions";
import { fingerprint, makeOtherShop, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";
import { ACTIONS, makeFixtures, ROUTES, WHO, type Fx, type Who } from "../helpers/surface";

/**
 * Every route handler and every server action of the app, found in the file tree, against
 * each kind of caller. A cell is the expected outcome:
 *   ok    the caller gets through (anything but 401/403, and not 404 unless the row says the
 *         target may already be gone), never a 5xx;
 *   401 / 403 / 404   refused with that status, and nothing in the database changes;
 *   422   another shop's record named in the body is "unknown" to this one (a field error).
 * Columns: signed out, owner, tuner, counter, customer (portal), owner of another shop.
 */

// ── What exists: route handlers and their methods; server actions and their names ──────────
function walk(dir: string, out: string[] = []): string[] {
  for (const f of readdirSync(dir)) {
    const p = join(dir, f);
    if (statSync(p).isDirectory()) walk(p, out);
    else out.push(p);
  }
  return out;
}
// Shared server actions live in lib/<feature>/<feature>-actions.ts; they are found there too.
const files = [...walk("app"), ...walk("lib")];
const routeKeys = files
  .filter((f) => f.endsWith("/route.ts"))
  .flatMap((f) => {
    const src = readFileSync(f, "utf8");
    const path = f
      .replace(/^app/, "")
      .replace(/\/route\.ts$/, "")
      .replace(/\/\([^)]+\)/g, "");
    const methods = new Set(
      [...src.matchAll(/export (?:const|async function) (GET|POST|PUT|PATCH|DELETE)\b/g)].map(
        (m) => m[1]!,
      ),
    );
    for (const m of src.matchAll(/export const \{([^}]+)\}/g))
      for (const x of m[1]!.split(","))
        if (/^(GET|POST|PUT|PATCH|DELETE)$/.test(x.trim())) methods.add(x.trim());
    return [...methods].map((m) => `${m} ${path}`);
  });
// Server actions live beside their route (app/) or, when shared components call them, in lib/.
const actionKeys = [...files, ...walk("lib")]
  .filter(
    (f) => f.endsWith(".ts") && /^["']use server["']/.test(readFileSync(f, "utf8").trimStart()),
  )
  .flatMap((f) =>
    [...readFileSync(f, "utf8").matchAll(/export (?:const|async function) (\w+Action)\b/g)].map(
      (m) => `${f}#${m[1]}`,
    ),
  );

let fx: Fx;
const WALK_TIMEOUT_MS = 240_000;

const clients = {} as Record<Who, Client | null>;

// Everything but sessions and rate-limit counters, which sign-ins and reads touch by design.
const TABLES = [
  "account",
  "credit_notes",
  "invoice_lines",
  "invoices",
  "job_lines",
  "jobs",
  "mail_log",
  "purchase_order_lines",
  "purchase_orders",
  "shop_notice_subscribers",
  "supplier_parts",
  "suppliers",
  "build_revisions",
  "builds",
  "customers",
  "datalog_mappings",
  "datalogs",
  "invitation",
  "member",
  "organization",
  "parts",
  "payment_events",
  "payments",
  "quote_lines",
  "quote_messages",
  "quotes",
  "share_links",
  "shop_counters",
  "shop_logos",
  "shop_settings",
  "tune_pulls",
  "tune_sessions",
  "user",
  "vehicles",
];

beforeAll(async () => {
  const other = await makeOtherShop();
  const [owner, tuner, counter, customer, outsider] = await Promise.all([
    signIn("owner@demo.fuelwright.test"),
    signIn("tuner@demo.fuelwright.test"),
    signIn("counter@demo.fuelwright.test"),
    signIn("customer@demo.fuelwright.test"),
    signIn(other.email, other.password),
  ]);
  Object.assign(clients, { anon: null, owner, tuner, counter, customer, outsider });
  fx = await makeFixtures({ tuner, counter });
});

afterAll(async () => {
  await sql.end();
});

function judge(key: string, who: Who, expected: string, got: number, mayVanish: boolean) {
  const label = `${key} as ${who}`;
  expect(got, `${label}: never a 5xx`).toBeLessThan(500);
  if (expected === "ok") {
    expect([401, 403], `${label}: expected to get through, got ${got}`).not.toContain(got);
    if (!mayVanish) expect(got, `${label}: expected to get through`).not.toBe(404);
  } else {
    expect(got, label).toBe(Number(expected));
  }
}

describe("access matrix", () => {
  it("lists every route handler and every server action (a new one without a row fails here)", () => {
    expect(routeKeys.length).toBeGreaterThan(40);
    expect(actionKeys.length).toBeGreaterThan(10);
    expect(
      routeKeys.filter((k) => !(k in ROUTES)),
      "routes without a matrix row",
    ).toEqual([]);
    expect(
      Object.keys(ROUTES).filter((k) => !routeKeys.includes(k)),
      "matrix rows for routes that no longer exist",
    ).toEqual([]);
    expect(
      actionKeys.filter((k) => !(k in ACTIONS)),
      "actions without a matrix row",
    ).toEqual([]);
    expect(
      Object.keys(ACTIONS).filter((k) => !actionKeys.includes(k)),
      "matrix rows for actions that no longer exist",
    ).toEqual([]);
  });

  // A walk of the whole surface: ~20 s on an idle CI machine, several times that on a busy one.
  it(
    "route handlers: each caller gets the expected outcome; every refusal changes nothing",
    async () => {
      for (const [key, cell] of Object.entries(ROUTES)) {
        const method = key.split(" ")[0]!;
        const expected = cell.expect.split(" ");
        expect(expected, key).toHaveLength(WHO.length);
        for (const [i, who] of WHO.entries()) {
          const { path, body, raw } = cell.call(fx);
          const denied = expected[i] !== "ok";
          const before = denied ? await fingerprint(TABLES) : "";
          const res = raw
            ? await request(clients[who], method, path, raw.body as string, {
                "content-type": raw.type,
              })
            : await request(clients[who], method, path, body);
          judge(key, who, expected[i]!, res.status, Boolean(cell.mayVanish));
          if (denied) {
            expect(res.headers.get("content-type"), `${key} as ${who}: a JSON refusal`).toMatch(
              /application\/json/,
            );
            expect(
              await fingerprint(TABLES),
              `${key} as ${who}: a refusal changed the database`,
            ).toBe(before);
          }
        }
      }
    },
    WALK_TIMEOUT_MS,
  );

  it(
    "server actions: each caller gets the expected outcome; every refusal changes nothing",
    async () => {
      const manifest = actionManifest();
      for (const [key, cell] of Object.entries(ACTIONS)) {
        const [file, name] = key.split("#") as [string, string];
        const found = manifest.find((r) => r.file === file && r.name === name);
        expect(found, `${key} is in the build's action manifest`).toBeTruthy();
        const ref: ActionRef = { ...found!, page: cell.page(fx) };
        const expected = cell.expect.split(" ");
        for (const [i, who] of WHO.entries()) {
          const denied = expected[i] !== "ok";
          const before = denied ? await fingerprint(TABLES) : "";
          const r = await callAction(clients[who], ref, cell.args(fx));
          expect(r.http, `${key} as ${who}: the action answered`).toBeLessThan(500);
          // A redirect is success; otherwise the state's status says how it ended.
          // The proxy sends a caller with no session to sign-in before any action runs.
          const status = r.redirect
            ? /\/sign-in\b/.test(r.redirect)
              ? 401
              : 200
            : (r.state?.status ?? 200);
          judge(key, who, expected[i]!, status, Boolean(cell.mayVanish));
          if (denied)
            expect(
              await fingerprint(TABLES),
              `${key} as ${who}: a refusal changed the database`,
            ).toBe(before);
        }
      }
    },
    WALK_TIMEOUT_MS,
  );
});
