import { readdirSync, readFileSync, statSync } from "node:fs";
import { join } from "node:path";

import { describe, expect, it } from "vitest";

import { navFor } from "@/components/shell/nav-items";
import { can, PERMISSIONS } from "@/lib/auth/permissions";
import { ROLES } from "@/lib/domain/roles";

describe("permissions table", () => {
  it("only the owner changes settings and members", () => {
    for (const r of ROLES) {
      expect(can(r, "settings:update")).toBe(r === "owner");
      expect(can(r, "members:manage")).toBe(r === "owner");
    }
  });
  it("customers get the portal and no staff pages", () => {
    expect(can("customer", "portal:view")).toBe(true);
    expect(can("customer", "staff:view")).toBe(false);
    expect(can("customer", "customers:read")).toBe(false);
    expect(navFor("customer").map((i) => i.href)).toEqual(["/my"]);
  });
  it("better-auth's organization endpoints are for staff: customers are not shop members there", () => {
    for (const r of ROLES) expect(can(r, "organization:use")).toBe(r !== "customer");
  });
  it("suppliers and purchase orders are staff only; customers read their own jobs and invoices and pay them", () => {
    for (const r of ROLES) {
      expect(can(r, "purchasing:read")).toBe(r !== "customer");
      expect(can(r, "purchasing:write")).toBe(r === "owner" || r === "counter");
      expect(can(r, "jobs:view")).toBe(true);
      expect(can(r, "invoices:view")).toBe(true);
      expect(can(r, "invoices:write")).toBe(r === "owner" || r === "counter");
      expect(can(r, "invoices:pay")).toBe(r === "customer");
    }
  });
  it("every role named in the table is a known role", () => {
    for (const roles of Object.values(PERMISSIONS))
      for (const r of roles) expect(ROLES).toContain(r);
  });
});

/** Every server action and route handler of the app goes through the one authorization module. */
describe("authorization coverage", () => {
  const files: string[] = [];
  const walk = (dir: string) => {
    for (const f of readdirSync(dir)) {
      const p = join(dir, f);
      if (statSync(p).isDirectory()) walk(p);
      else if (/^(actions|route)\.ts$/.test(f)) files.push(p);
    }
  };
  walk("app");
  // Sign-in and friends are for signed-out visitors; health has no data; share links are
  // opened without an account, the signed token being the key (tests/integration/share-links);
  // the payment webhook is authenticated by its signature (tests/integration/payments); the
  // benchmark's bare sizing route holds no data and answers 404 unless the benchmark's server
  // turned it on (BENCH_ROUTES=on; tests/integration/access-matrix finds it not found); an /api
  // address no route answers holds no data and is a 404 for everyone (integration/unknown-api).
  const guarded = files.filter(
    (f) =>
      !f.includes("api/auth") &&
      !f.includes("api/health") &&
      !f.includes("(auth)") &&
      !f.startsWith("app/share/") &&
      f !== "app/api/webhooks/payments/route.ts" &&
      f !== "app/api/bench/size/route.ts" &&
      f !== "app/api/[...unknown]/route.ts",
  );
  it("finds the app's actions and routes", () => expect(guarded.length).toBeGreaterThan(5));
  it.each(guarded)("%s: every export checks the member's permission", (f) => {
    const src = readFileSync(f, "utf8");
    // Names imported from command modules: commands check the permission themselves.
    const commands = [...src.matchAll(/import\s*\{([^}]*)\}\s*from\s*"[^"]*-commands"/g)]
      .flatMap((m) => m[1]!.split(","))
      .map((n) => n.replace(/^\s*type\s+/, "").trim())
      .filter(Boolean);
    const starts = [...src.matchAll(/^export (?:const|async function) (\w+)/gm)];
    expect(starts.length).toBeGreaterThan(0);
    starts.forEach((m, i) => {
      const body = src.slice(m.index, starts[i + 1]?.index ?? src.length);
      const checked =
        /require(?:Sizing)?Member\(\s*"[a-z]+:[a-z]+"/.test(body) ||
        commands.some((c) => new RegExp(`\\b${c}\\(`).test(body));
      expect(checked, `${m[1]} in ${f}`).toBe(true);
    });
  });
});
