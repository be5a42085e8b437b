#!/usr/bin/env node
// npm run bench:bundle — after a production build: the gzipped JavaScript each page loads first,
// and every client chunk that carries database code (drizzle), which must never reach a browser.
//   NEXT_DIST_DIR=.next-test npm run bench:bundle        # the build `npm test` makes
//   node scripts/bundle-check.mjs --json                  # the same figures as JSON (the tests read them)
// Prints figures and exits 0; exits 1 only when there is no build to read.
//
// Where the figures come from (Next 16, Turbopack): `build-manifest.json#rootMainFiles` are the
// scripts every page loads (framework and runtime; `polyfillFiles` are `nomodule` and left out);
// `server/app/**/page_client-reference-manifest.js` lists per page the `entryJSFiles` of each
// segment of its tree; a page loads all of them but the not-found boundaries' (checked against
// the script tags and the inlined RSC payload of served pages).
import { existsSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import vm from "node:vm";
import { gzipSync } from "node:zlib";

/** Text found in drizzle-orm's code whatever the minifier does (symbol names, entity kinds). */
export const DRIZZLE_MARKERS = [
  "drizzle-orm",
  "drizzle:entityKind",
  "drizzle:",
  '"PgTable"',
  "pgTable",
  "PgColumn",
];

// A not-found boundary loads only when it shows. Error boundaries do not count as such: they are
// client references in every page's payload, so the browser loads them while hydrating.
const ON_DEMAND = /\/(not-found|forbidden|unauthorized)$/;

/** "/(shop)/builds/[id]/page" → "/builds/[id]" */
export function routeOf(entryName) {
  const parts = entryName
    .replace(/\/page$/, "")
    .split("/")
    .filter((p) => p && !/^\(.*\)$/.test(p));
  return `/${parts.join("/")}`;
}

/** Files under `dir` whose name passes `test`, any depth. */
function findFiles(dir, test, out = []) {
  if (!existsSync(dir)) return out;
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) findFiles(p, test, out);
    else if (test(e.name)) out.push(p);
  }
  return out;
}

/** Reads the build in `distDir` and returns per page its first-load chunks and their gzipped size. */
export function analyse(distDir) {
  const buildId = path.join(distDir, "BUILD_ID");
  if (!existsSync(buildId)) throw new Error(`no production build in ${distDir} (no BUILD_ID)`);
  const buildManifest = JSON.parse(readFileSync(path.join(distDir, "build-manifest.json"), "utf8"));
  const root = buildManifest.rootMainFiles ?? [];

  const sizes = new Map();
  const gz = (file) => {
    if (!sizes.has(file)) {
      const abs = path.join(distDir, file.replace(/^\/?_next\//, ""));
      sizes.set(file, existsSync(abs) ? gzipSync(readFileSync(abs)).length : 0);
    }
    return sizes.get(file);
  };

  const pages = [];
  const manifests = findFiles(
    path.join(distDir, "server", "app"),
    (n) => n === "page_client-reference-manifest.js",
  );
  for (const file of manifests) {
    const sandbox = { globalThis: {} };
    sandbox.globalThis = sandbox;
    vm.runInNewContext(readFileSync(file, "utf8"), sandbox, { filename: file });
    for (const [entry, m] of Object.entries(sandbox.__RSC_MANIFEST ?? {})) {
      const files = new Set(root);
      for (const [segment, list] of Object.entries(m.entryJSFiles ?? {}))
        if (!ON_DEMAND.test(segment)) for (const f of list) files.add(f);
      const own = [...files].filter((f) => !root.includes(f));
      pages.push({
        route: routeOf(entry),
        entry,
        files: [...files],
        gzipBytes: [...files].reduce((n, f) => n + gz(f), 0),
        ownGzipBytes: own.reduce((n, f) => n + gz(f), 0),
      });
    }
  }
  pages.sort((a, b) => a.route.localeCompare(b.route));

  // Every client chunk, also those loaded on demand, not only the first-load ones.
  const drizzle = [];
  for (const abs of findFiles(path.join(distDir, "static"), (n) => n.endsWith(".js"))) {
    const text = readFileSync(abs, "utf8");
    const markers = DRIZZLE_MARKERS.filter((m) => text.includes(m));
    if (markers.length === 0) continue;
    const chunk = path.relative(distDir, abs).split(path.sep).join("/");
    drizzle.push({
      chunk,
      markers,
      gzipBytes: gz(chunk),
      pages: pages.filter((p) => p.files.includes(chunk)).map((p) => p.route),
    });
  }
  return { distDir, rootFiles: root, pages, drizzle };
}

const kib = (bytes) => (bytes / 1024).toFixed(1);

function main() {
  const distDir = process.env.NEXT_DIST_DIR || ".next";
  let report;
  try {
    report = analyse(distDir);
  } catch (e) {
    console.error(
      `bundle-check: ${e.message}; build first (NEXT_DIST_DIR=${distDir} npx next build)`,
    );
    process.exit(1);
  }
  if (process.argv.includes("--json")) {
    console.log(JSON.stringify(report, null, 2));
    return;
  }
  const w = Math.max(...report.pages.map((p) => p.route.length), 5);
  console.log(`First-load JavaScript per page, gzipped (build in ${distDir})`);
  console.log(`${"page".padEnd(w)}  ${"total KiB".padStart(9)}  ${"own KiB".padStart(8)}  chunks`);
  for (const p of report.pages) {
    console.log(
      `${p.route.padEnd(w)}  ${kib(p.gzipBytes).padStart(9)}  ${kib(p.ownGzipBytes).padStart(8)}  ${String(p.files.length).padStart(6)}`,
    );
  }
  console.log(
    `("own" leaves out the ${report.rootFiles.length} framework scripts every page loads)`,
  );
  console.log();
  if (report.drizzle.length === 0) {
    console.log("Database code in client chunks: none.");
  } else {
    console.log("Database code (drizzle) in client chunks:");
    for (const d of report.drizzle) {
      console.log(`  ${d.chunk} (${kib(d.gzipBytes)} KiB gzipped; ${d.markers.join(", ")})`);
      console.log(`    loaded by: ${d.pages.join(", ") || "no page up front (loaded on demand)"}`);
    }
  }
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) main();
