import { execFileSync } from "node:child_process";
import {
  chmodSync,
  copyFileSync,
  mkdirSync,
  mkdtempSync,
  readFileSync,
  writeFileSync,
} from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

import { describe, expect, it } from "vitest";

/**
 * The HTTP and UI benchmarks' set-up (scripts/bench-http.sh, bench-ui.sh on scripts/lib.sh),
 * played with stand-ins: every service step of lib.sh and `node` only say what they were asked
 * and with which of the app's variables, so the test sees the order of the set-up and the
 * environment each program gets, without a database, a build or a server.
 */
const VARS = [
  "DATABASE_URL",
  "BETTER_AUTH_SECRET",
  "STRIPE_WEBHOOK_SECRET",
  "APP_URL",
  "AUTH_RATE_LIMIT",
  "SMTP_URL",
  "S3_ENDPOINT",
  "BENCH_ROUTES",
  "BENCH_SEED_ONLY",
  "NEXT_DIST_DIR",
  "NODE_ENV",
];

const STUBS = `
log() { printf '%s\\n' "$*" >> "$TRACE"; }
ensure_node_modules() { log ensure_node_modules; }
ensure_postgres() { log ensure_postgres; }
ensure_chromium() { log ensure_chromium; }
pg_start() { log pg_start "$@"; }
pg_ensure_db() { log pg_ensure_db "$@"; }
ensure_secret() { log ensure_secret "$@"; printf -v "$1" '%s' "secret-$2"; export "$1"; }
migrate_and_seed() { log migrate_and_seed "DATABASE_URL=$DATABASE_URL"; }
port_busy() { log port_busy "$@"; return 1; }
wait_http() { wait "\${FW_PIDS[@]}"; log wait_http "$@"; }
stop_all() { log stop_all; }
say() { log say "$*"; }
`;

function play(script: string, args: string[] = [], extra: Record<string, string> = {}): string[] {
  const dir = mkdtempSync(join(tmpdir(), "fw-bench-"));
  mkdirSync(join(dir, "scripts"));
  mkdirSync(join(dir, "bin"));
  mkdirSync(join(dir, ".data"));
  copyFileSync(`scripts/${script}`, join(dir, "scripts", script));
  writeFileSync(join(dir, "scripts/lib.sh"), readFileSync("scripts/lib.sh", "utf8") + STUBS);
  const node = join(dir, "bin/node");
  writeFileSync(
    node,
    `#!/usr/bin/env bash\nline="node $*"\nfor v in ${VARS.join(" ")}; do [ -n "\${!v:-}" ] && line="$line $v=\${!v}"; done\nprintf '%s\\n' "$line" >> "$TRACE"\n`,
  );
  chmodSync(node, 0o755);
  const trace = join(dir, "trace");
  writeFileSync(trace, "");
  // A bare environment: only what the stand-ins need (no variable of this process leaks in).
  const env = {
    PATH: `${join(dir, "bin")}:/usr/bin:/bin`,
    TRACE: trace,
    ...extra,
  } as unknown as NodeJS.ProcessEnv;
  execFileSync("bash", [join(dir, "scripts", script), ...args], { env, cwd: dir });
  return readFileSync(trace, "utf8")
    .trim()
    .split("\n")
    .map((l) => l.replaceAll(dir, "<root>"));
}

const server = [
  "say building for the benchmark (.next-bench)…",
  "node node_modules/next/dist/bin/next build",
  "port_busy 3300",
  "node node_modules/next/dist/bin/next start -H 127.0.0.1 -p 3300",
  "wait_http http://127.0.0.1:3300/api/health 60",
];
const env = (db: string, more = "") =>
  `DATABASE_URL=${db} BETTER_AUTH_SECRET=secret-bench-auth-secret STRIPE_WEBHOOK_SECRET=secret-bench-payments-webhook-secret APP_URL=http://127.0.0.1:3300 AUTH_RATE_LIMIT=off SMTP_URL=smtp://127.0.0.1:2599 S3_ENDPOINT=http://127.0.0.1:4599${more}`;

describe("the benchmarks' shared set-up", () => {
  it("bench-http: its cluster and database, the app's variables, the builds seeded, the server, then the load", () => {
    const db = "postgres://fuelwright@127.0.0.1:54397/fuelwright_bench";
    const e = env(db, " BENCH_ROUTES=on");
    expect(play("bench-http.sh", ["--soak"])).toEqual([
      "ensure_node_modules",
      "ensure_postgres",
      "pg_start bench 54397",
      "pg_ensure_db 54397 fuelwright_bench",
      "ensure_secret BETTER_AUTH_SECRET bench-auth-secret",
      "ensure_secret STRIPE_WEBHOOK_SECRET bench-payments-webhook-secret whsec_",
      `migrate_and_seed DATABASE_URL=${db}`,
      `node node_modules/.bin/tsx tests/bench/builds.bench.ts ${e} BENCH_SEED_ONLY=1`,
      ...server.map((l) =>
        l.startsWith("node ")
          ? `${l} ${e} NEXT_DIST_DIR=.next-bench${l.includes(" start ") ? " NODE_ENV=production" : ""}`
          : l,
      ),
      `node node_modules/.bin/tsx tests/bench/http.bench.ts --soak ${e} NEXT_DIST_DIR=.next-bench`,
      "stop_all",
    ]);
  });

  it("bench-ui: Chromium, its own cluster and database, the app's variables, the server, then the typing", () => {
    const db = "postgres://fuelwright@127.0.0.1:54398/fuelwright_bench";
    const e = env(db);
    expect(play("bench-ui.sh")).toEqual([
      "ensure_node_modules",
      "ensure_postgres",
      "ensure_chromium",
      "pg_start bench-ui 54398",
      "pg_ensure_db 54398 fuelwright_bench",
      "ensure_secret BETTER_AUTH_SECRET bench-auth-secret",
      "ensure_secret STRIPE_WEBHOOK_SECRET bench-payments-webhook-secret whsec_",
      `migrate_and_seed DATABASE_URL=${db}`,
      ...server.map((l) =>
        l.startsWith("node ")
          ? `${l} ${e} NEXT_DIST_DIR=.next-bench${l.includes(" start ") ? " NODE_ENV=production" : ""}`
          : l,
      ),
      `node node_modules/.bin/tsx tests/bench/ui.bench.ts ${e} NEXT_DIST_DIR=.next-bench`,
      "stop_all",
    ]);
  });

  it("with FW_PORT_OFFSET, the cluster and the server move by it (two checkouts bench at once)", () => {
    const trace = play("bench-ui.sh", [], { FW_PORT_OFFSET: "40" });
    expect(trace).toContain("pg_start bench-ui 54438");
    expect(trace).toContain("port_busy 3340");
    expect(trace).toContain("wait_http http://127.0.0.1:3340/api/health 60");
    expect(trace.at(-2)).toMatch(/^node node_modules\/.bin\/tsx tests\/bench\/ui.bench.ts /);
    expect(trace.at(-2)).toContain("APP_URL=http://127.0.0.1:3340 ");
    expect(trace.at(-2)).toContain("127.0.0.1:54438/fuelwright_bench");
  });
});
