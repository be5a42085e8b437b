import { execFileSync } from "node:child_process";
import { existsSync } from "node:fs";
import path from "node:path";

import { describe, expect, it } from "vitest";

// The production build `npm test` makes (scripts/test.sh); `npm run test:env -- --prod` makes it too.
const distDir = process.env.NEXT_DIST_DIR || ".next-test";

interface Report {
  pages: { route: string; gzipBytes: number; files: string[] }[];
  drizzle: { chunk: string; markers: string[]; pages: string[] }[];
}

let cached: Report | undefined;
function report(): Report {
  if (cached) return cached;
  if (!existsSync(path.join(distDir, "BUILD_ID")))
    throw new Error(`no production build in ${distDir}: run \`npm run test:env -- --prod\` first`);
  const out = execFileSync(process.execPath, ["scripts/bundle-check.mjs", "--json"], {
    env: { ...process.env, NEXT_DIST_DIR: distDir },
    encoding: "utf8",
    maxBuffer: 64 * 1024 * 1024,
  });
  return (cached = JSON.parse(out) as Report);
}

describe("client bundle", () => {
  it("finds the first-load scripts of every page", () => {
    const r = report();
    const routes = r.pages.map((p) => p.route);
    for (const route of ["/builds", "/builds/[id]", "/quotes/[id]", "/my", "/sign-in"])
      expect(routes).toContain(route);
    for (const p of r.pages) expect(p.gzipBytes).toBeGreaterThan(50 * 1024);
  });

  it("ships no database code (drizzle) to the browser", () => {
    const found = report().drizzle.map((d) => `${d.chunk} (loaded by ${d.pages.join(", ")})`);
    expect(found, "client chunks with drizzle code").toEqual([]);
  });
});
