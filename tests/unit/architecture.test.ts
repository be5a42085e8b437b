import { readdirSync, readFileSync, statSync } from "node:fs";
import { basename, join } from "node:path";

import { describe, expect, it } from "vitest";

/**
 * The layout a newcomer can guess, checked on the source: one command per write, layers that
 * import downwards only, the database client behind db/queries. See DEVELOPERS.md, "Layout".
 */

function walk(dir: string, out: string[] = []): string[] {
  for (const f of readdirSync(dir)) {
    const p = join(dir, f);
    if (statSync(p).isDirectory()) {
      if (f !== "migrations" && f !== "node_modules") walk(p, out);
    } else if (/\.(ts|tsx)$/.test(f)) out.push(p);
  }
  return out;
}

const SOURCES = ["app", "components", "lib", "db"].flatMap((d) => walk(d));
const read = (f: string) => readFileSync(f, "utf8");
const importsOf = (src: string) =>
  [...src.matchAll(/^\s*(?:import|export)\s[^;]*?from\s+"([^"]+)"/gm)].map((m) => m[1]!);
/** Every name a file imports from `module`. */
const namesImported = (src: string, module: string) =>
  [...src.matchAll(/import\s+(?:type\s+)?\{([^}]*)\}\s+from\s+"([^"]+)"/g)]
    .filter((m) => m[2] === module)
    .flatMap((m) => m[1]!.split(",").map((n) => n.replace(/^\s*type\s+/, "").trim()))
    .filter(Boolean);

const isCommandModule = (f: string) => /^lib\/[a-z-]+\/[a-z-]+-commands\.ts$/.test(f);
const isAdapter = (f: string) => /(^|\/)(actions|route)\.ts$/.test(f) || /-actions\.ts$/.test(f);

/** The exported functions of db/queries that write (insert, update, delete, upsert, DDL). */
function writeQueries(): Map<string, Set<string>> {
  const out = new Map<string, Set<string>>();
  for (const f of walk("db/queries")) {
    const src = read(f);
    const starts = [...src.matchAll(/^export (?:async )?(?:function|const) (\w+)/gm)];
    const names = new Set<string>();
    starts.forEach((m, i) => {
      const body = src.slice(m.index, starts[i + 1]?.index ?? src.length);
      if (
        /\.(insert|update|delete)\(|\bonConflict|\b(insert into|update \w+ set|delete from)\b/i.test(
          body,
        )
      )
        names.add(m[1]!);
    });
    out.set("@/" + f.replace(/\.ts$/, ""), names);
  }
  return out;
}

describe("one command per write", () => {
  const writes = writeQueries();
  it("finds the write queries", () =>
    expect([...writes.values()].reduce((n, s) => n + s.size, 0)).toBeGreaterThan(10));

  it("only command modules (lib/<feature>/<name>-commands.ts) import a write query", () => {
    const offenders: string[] = [];
    for (const f of SOURCES) {
      if (f.startsWith("db/") || isCommandModule(f)) continue;
      const src = read(f);
      for (const [module, names] of writes)
        for (const n of namesImported(src, module))
          if (names.has(n)) offenders.push(`${f} imports ${n} from ${module}`);
    }
    expect(offenders).toEqual([]);
  });

  it("server actions and route handlers never touch the database or its schema", () => {
    const offenders = SOURCES.filter(isAdapter).filter((f) =>
      importsOf(read(f)).some(
        (m) => m === "@/db" || m.startsWith("@/db/schema") || m === "drizzle-orm",
      ),
    );
    expect(offenders).toEqual([]);
  });

  it("server actions use the one adapter (memberAction) or a command, never their own error handling", () => {
    const offenders: string[] = [];
    for (const f of SOURCES.filter((f) => /(^|\/)[a-z-]*actions\.ts$/.test(f))) {
      const src = read(f);
      if (!src.includes('"use server"')) continue;
      if (/catch\s*\(/.test(src) && !f.startsWith("app/(auth)/")) offenders.push(f);
      if (/memberAction\(\s*"/.test(src)) offenders.push(`${f} (checks the role itself)`);
    }
    expect(offenders).toEqual([]);
  });
});

describe("layers", () => {
  it("components never import from app/", () => {
    const offenders = walk("components").filter((f) =>
      importsOf(read(f)).some((m) => m.startsWith("@/app/")),
    );
    expect(offenders).toEqual([]);
  });

  it("only db/ touches the database client", () => {
    const offenders = SOURCES.filter((f) => !f.startsWith("db/")).filter((f) =>
      importsOf(read(f)).some((m) => m === "@/db" || m === "@/db/index"),
    );
    expect(offenders).toEqual([]);
  });

  it("db/queries never imports from lib/http and throws only domain errors", () => {
    const offenders = walk("db/queries").filter((f) => {
      const src = read(f);
      return importsOf(src).some((m) => m.startsWith("@/lib/http")) || /HttpError/.test(src);
    });
    expect(offenders).toEqual([]);
  });

  it("the domain vocabulary imports no database, framework or UI code", () => {
    const offenders = walk("lib/domain").filter((f) =>
      importsOf(read(f)).some((m) => /^(@\/db|drizzle-orm|next|react)/.test(m)),
    );
    expect(offenders).toEqual([]);
  });

  it("client components import no database schema values", () => {
    const offenders = SOURCES.filter((f) => /^\s*["']use client["']/.test(read(f))).filter((f) =>
      [...read(f).matchAll(/import\s+(type\s+)?[^;]*from\s+"(@\/db[^"]*|drizzle-orm[^"]*)"/g)].some(
        (m) => !m[1],
      ),
    );
    expect(offenders).toEqual([]);
  });

  it("HTTP errors are thrown only by the HTTP layer", () => {
    const offenders = SOURCES.filter((f) => !f.startsWith("lib/http/")).filter((f) =>
      /new HttpError\(/.test(read(f)),
    );
    expect(offenders).toEqual([]);
  });

  it("no two files share a generic name", () => {
    const generic =
      /^(service|services|utils?|helpers?|common|misc|manager|errors|types|shared|core)\.tsx?$/;
    const seen = new Map<string, string[]>();
    for (const f of SOURCES) {
      const b = basename(f);
      if (generic.test(b)) seen.set(b, [...(seen.get(b) ?? []), f]);
    }
    expect([...seen.entries()].filter(([, fs]) => fs.length > 1)).toEqual([]);
    expect(seen.has("service.ts")).toBe(false);
  });
});

describe("one component per shared piece of screen", () => {
  it("the stale save's Field / Yours / Theirs (saved) table is written once (components/ui/conflict-table.tsx)", () => {
    const writers = SOURCES.filter((f) => /\.tsx$/.test(f) && read(f).includes("Theirs (saved)"));
    expect(writers).toEqual(["components/ui/conflict-table.tsx"]);
  });
});
