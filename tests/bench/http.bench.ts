/**
 * HTTP benchmark (npm run bench:http): autocannon against the production server on 100 000
 * builds — the sizing API, the builds search, a build page and a spec-sheet PDF — at 1, 16 and
 * 64 connections; the same sizing served by a bare node:http server as the floor. With --soak:
 * moderate load for SOAK_SECONDS while the server's memory is sampled. Figures only, no pass/fail.
 */
import { execFileSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { createServer } from "node:http";

import autocannon from "autocannon";
import postgres from "postgres";

import { FuelSystemInputSchema, sizingAnswer } from "../../lib/calc";

const BASE = process.env.BENCH_BASE_URL ?? "http://127.0.0.1:3300";
// The bare node:http floor listens 90 ports above the bench server (3390 with no offset).
const BARE_PORT = Number(new URL(BASE).port) + 90;
const SECONDS = Number(process.env.BENCH_SECONDS ?? 20);
const soak = process.argv.includes("--soak");
const sql = postgres(process.env.DATABASE_URL!, { max: 2, onnotice: () => {} });

async function signIn(email: string) {
  const res = await fetch(`${BASE}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: BASE },
    body: JSON.stringify({ email, password: "fuelwright-demo" }),
  });
  if (!res.ok) throw new Error(`sign-in failed: ${res.status}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
}

const [tpl] =
  await sql`select id, inputs from builds where shop_id = 'demo-shop-ridgeback' and id = '10000000-0000-4000-8000-000000000002'`;
const sizingBody = JSON.stringify(tpl!.inputs);
const cookie = await signIn("tuner@demo.fuelwright.test");
const auth = { cookie, origin: BASE, "content-type": "application/json" };

interface Case {
  name: string;
  url: string;
  method?: "GET" | "POST";
  body?: string;
  headers?: Record<string, string>;
  /** A different path for each request (the cold spec-sheet case: a new build, so a new render). */
  nextPath?: () => string;
}
// 2 000 other builds with a saved revision: each spec sheet asked for once is a render, not a cache hit.
const coldIds = (
  await sql`select b.id from builds b join build_revisions r on r.build_id = b.id and r.version = 1 where b.shop_id = 'demo-shop-ridgeback' and b.title like '% build %' order by b.id limit 2000`
).map((r) => r.id as string);
let cold = 0;
const CASES: Case[] = [
  {
    name: "POST /api/v1/calc/size",
    url: `${BASE}/api/v1/calc/size`,
    method: "POST",
    body: sizingBody,
    headers: auth,
  },
  {
    // The yardstick: the same sizing in a bare route handler of the same framework, no session.
    name: "POST /api/bench/size (bare route, no auth)",
    url: `${BASE}/api/bench/size`,
    method: "POST",
    body: sizingBody,
    headers: { "content-type": "application/json" },
  },
  {
    name: "GET /api/v1/builds?q=orca v8",
    url: `${BASE}/api/v1/builds?q=orca%20v8&limit=25`,
    headers: auth,
  },
  { name: "GET /builds/:id (page)", url: `${BASE}/builds/${tpl!.id}`, headers: auth },
  {
    name: "GET spec-sheet PDF (same revision)",
    url: `${BASE}/api/v1/builds/${tpl!.id}/spec-sheet`,
    headers: auth,
  },
  {
    name: "GET spec-sheet PDF (cold: a new build each time)",
    url: `${BASE}/api/v1/builds/${tpl!.id}/spec-sheet`,
    headers: auth,
    nextPath: () => `/api/v1/builds/${coldIds[cold++ % coldIds.length]}/spec-sheet`,
  },
  { name: "GET /api/health (framework + one query)", url: `${BASE}/api/health` },
];

function run(c: Case, connections: number, duration = SECONDS) {
  return new Promise<autocannon.Result>((resolve, reject) => {
    const requests = c.nextPath
      ? [{ setupRequest: (r: autocannon.Request) => ({ ...r, path: c.nextPath!() }) }]
      : undefined;
    autocannon(
      {
        url: c.url,
        method: c.method ?? "GET",
        body: c.body,
        headers: c.headers,
        connections,
        duration,
        timeout: 10,
        requests,
      },
      (err, res) => (err ? reject(err) : resolve(res)),
    );
  });
}
const row = (name: string, connections: number, r: autocannon.Result) => ({
  case: name,
  conns: connections,
  "req/s": Math.round(r.requests.average),
  "p50 ms": r.latency.p50,
  "p99 ms": r.latency.p99,
  timeouts: r.timeouts,
  "non-2xx": r.non2xx,
  errors: r.errors + r.timeouts + r.non2xx,
});

/** The floor: the same validation, sizing and chart series (the route's very function) behind a bare node:http server. */
function bareServer() {
  const server = createServer((req, res) => {
    let body = "";
    req.on("data", (d) => (body += d));
    req.on("end", () => {
      const parsed = FuelSystemInputSchema.safeParse(JSON.parse(body));
      res.writeHead(parsed.success ? 200 : 422, { "content-type": "application/json" });
      res.end(
        JSON.stringify(parsed.success ? sizingAnswer(parsed.data) : { error: parsed.error.issues }),
      );
    });
  });
  return new Promise<{ url: string; close: () => void }>((resolve) =>
    server.listen(BARE_PORT, "127.0.0.1", () =>
      resolve({ url: `http://127.0.0.1:${BARE_PORT}/`, close: () => server.close() }),
    ),
  );
}

/** Resident memory (MiB) of the server process and its children. */
function serverRssMiB(): number {
  const pids = execFileSync(
    "pgrep",
    ["-f", `next start -H 127.0.0.1 -p ${new URL(BASE).port}|next-server`],
    {
      encoding: "utf8",
    },
  )
    .trim()
    .split("\n")
    .filter(Boolean);
  let kb = 0;
  for (const pid of pids) {
    try {
      kb += Number(/VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${pid}/status`, "utf8"))?.[1] ?? 0);
    } catch {
      /* gone */
    }
  }
  return kb / 1024;
}

if (soak) {
  const total = Number(process.env.SOAK_SECONDS ?? 600);
  const samples: { s: number; rss: number }[] = [{ s: 0, rss: serverRssMiB() }];
  const t0 = Date.now();
  const timer = setInterval(
    () => samples.push({ s: Math.round((Date.now() - t0) / 1000), rss: serverRssMiB() }),
    10_000,
  );
  // Moderate load: the four everyday cases at once, 4 connections each (1 for the PDF); the cold
  // PDFs are left out, they would only show the sheet cache filling to its bound.
  const mix = CASES.slice(0, 4);
  const results = await Promise.all(mix.map((c) => run(c, c.name.includes("PDF") ? 1 : 4, total)));
  clearInterval(timer);
  samples.push({ s: total, rss: serverRssMiB() });
  console.table(mix.map((c, i) => row(c.name, c.name.includes("PDF") ? 1 : 4, results[i]!)));
  const third = Math.max(1, Math.floor(samples.length / 3));
  const early = samples.slice(1, 1 + third).reduce((t, x) => t + x.rss, 0) / third;
  const late = samples.slice(-third).reduce((t, x) => t + x.rss, 0) / third;
  console.table(
    samples
      .filter((_, i) => i % 6 === 0 || i === samples.length - 1)
      .map((x) => ({ "t s": x.s, "RSS MiB": +x.rss.toFixed(1) })),
  );
  console.log(
    `soak ${total} s: server RSS ${samples[0]!.rss.toFixed(0)} MiB at start, ${early.toFixed(0)} MiB over the first third, ${late.toFixed(0)} MiB over the last third (${(((late - early) / early) * 100).toFixed(1)} % growth after warm-up)`,
  );
} else {
  const rows = [];
  // Warm-up: every route compiled, caches and pools filled, and each route's code run long
  // enough for the JIT to have compiled it (BENCH_WARMUP_S seconds a case, 2 by default): a
  // case measured on colder code than the next one would compare the JIT, not the routes.
  // BENCH_ONLY (a regular expression) runs only the cases it matches, e.g. "calc|bench".
  const only = process.env.BENCH_ONLY ? new RegExp(process.env.BENCH_ONLY) : null;
  const cases = CASES.filter((c) => !only || only.test(c.name));
  const warmup = Number(process.env.BENCH_WARMUP_S ?? 2);
  for (const c of cases) await run(c, 4, warmup);
  for (const c of cases) for (const n of [1, 16, 64]) rows.push(row(c.name, n, await run(c, n)));
  const bare = await bareServer();
  const bareRows = [];
  for (const n of [1, 16, 64])
    bareRows.push(
      row(
        "bare node:http sizing",
        n,
        await run(
          {
            name: "bare",
            url: bare.url,
            method: "POST",
            body: sizingBody,
            headers: { "content-type": "application/json" },
          },
          n,
        ),
      ),
    );
  bare.close();
  console.table([...rows, ...bareRows]);
  const bareRoute = "POST /api/bench/size (bare route, no auth)";
  for (const n of [1, 16, 64]) {
    const app = rows.find((r) => r.case === CASES[0]!.name && r.conns === n)!;
    const route = rows.find((r) => r.case === bareRoute && r.conns === n)!;
    if (!app || !route) continue;
    const floor = bareRows.find((r) => r.conns === n)!;
    console.log(
      `calc API at ${n} connection(s): ${app["req/s"]} req/s = ${(app["req/s"] / route["req/s"]).toFixed(2)}× the bare route (${route["req/s"]} req/s; goal ≥ 0.8×), ${((100 * app["req/s"]) / floor["req/s"]).toFixed(0)} % of bare node:http (${floor["req/s"]} req/s); errors ${app.errors}`,
    );
  }
}
await sql.end();
