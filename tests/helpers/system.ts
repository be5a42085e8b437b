import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { once } from "node:events";
import { existsSync } from "node:fs";
import { request as httpRequest } from "node:http";

import postgres from "postgres";

/**
 * For the system suites (tests/system): app instances of the production build started and
 * killed by the test, on their own database in the test cluster, and that cluster stopped and
 * started under them. `npm test` runs these after every other suite, alone.
 */
export const PG_PORT = Number(
  new URL(process.env.DATABASE_URL ?? "postgres://x@127.0.0.1:54339/x").port || 54339,
);
export const SYSTEM_DB = "fuelwright_system";
export const SYSTEM_DB_URL = `postgres://fuelwright@127.0.0.1:${PG_PORT}/${SYSTEM_DB}`;
const DIST = process.env.NEXT_DIST_DIR || ".next-test";

function run(cmd: string, args: string[], env: Record<string, string> = {}) {
  const r = spawnSync(cmd, args, { env: { ...process.env, ...env }, encoding: "utf8" });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(" ")} failed: ${r.stderr || r.stdout}`);
  return r.stdout;
}

/** A fresh database with the migrations and the demo shop. */
export function freshDatabase(name = SYSTEM_DB): string {
  const url = `postgres://fuelwright@127.0.0.1:${PG_PORT}/${name}`;
  const admin = `postgres://fuelwright@127.0.0.1:${PG_PORT}/postgres`;
  run("psql", [admin, "-qtAc", `drop database if exists ${name} with (force)`]);
  run("psql", [admin, "-qtAc", `create database ${name}`]);
  run("node_modules/.bin/tsx", ["db/migrate.ts"], { DATABASE_URL: url });
  run("node_modules/.bin/tsx", ["db/seed.ts"], { DATABASE_URL: url });
  return url;
}

export function sqlFor(url: string) {
  return postgres(url, { max: 2, onnotice: () => {} });
}

/** Stops or starts the test cluster itself (scripts/pgctl.sh knows where it lives). */
export function postgresCtl(cmd: "stop" | "start") {
  run("bash", ["scripts/pgctl.sh", cmd, "test", String(PG_PORT)]);
}

export interface App {
  port: number;
  url: string;
  proc: ChildProcess;
  log: string[];
  stop: () => Promise<void>;
  kill9: () => Promise<void>;
}

/** Starts `next start` on the production build; resolves when /api/health answers. */
export async function startApp(port: number, env: Record<string, string> = {}): Promise<App> {
  if (!existsSync(`${DIST}/BUILD_ID`))
    throw new Error(`no production build in ${DIST}: run npm test, or npm run test:env -- --prod`);
  const log: string[] = [];
  const proc = spawn(
    process.execPath,
    ["node_modules/next/dist/bin/next", "start", "-H", "127.0.0.1", "-p", String(port)],
    {
      env: {
        ...process.env,
        NODE_ENV: "production",
        NEXT_DIST_DIR: DIST,
        DATABASE_URL: SYSTEM_DB_URL,
        APP_URL: `http://127.0.0.1:${port}`,
        AUTH_RATE_LIMIT: "off",
        ...env,
      },
      stdio: ["ignore", "pipe", "pipe"],
    },
  );
  proc.stdout!.on("data", (d) => log.push(String(d)));
  proc.stderr!.on("data", (d) => log.push(String(d)));
  const url = `http://127.0.0.1:${port}`;
  const end = Date.now() + 60_000;
  for (;;) {
    if (proc.exitCode !== null)
      throw new Error(`app on ${port} exited: ${log.join("").slice(-2000)}`);
    try {
      if ((await fetch(`${url}/api/health`)).ok) break;
    } catch {
      /* not up yet */
    }
    if (Date.now() > end)
      throw new Error(`app on ${port} did not come up: ${log.join("").slice(-2000)}`);
    await new Promise((r) => setTimeout(r, 200));
  }
  const exited = () =>
    proc.exitCode !== null || proc.signalCode !== null
      ? Promise.resolve()
      : once(proc, "exit").then(() => undefined);
  return {
    port,
    url,
    proc,
    log,
    stop: async () => {
      proc.kill("SIGTERM");
      await exited();
    },
    kill9: async () => {
      proc.kill("SIGKILL");
      await exited();
    },
  };
}

/** Signs in against one instance; the cookie works on any instance sharing the database. */
export async function signInAt(
  url: string,
  email: string,
  password = "fuelwright-demo",
  origin = url,
) {
  const res = await fetch(`${url}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin },
    body: JSON.stringify({ email, password }),
  });
  if (!res.ok) throw new Error(`sign-in at ${url} failed: ${res.status} ${await res.text()}`);
  return {
    cookie: res.headers
      .getSetCookie()
      .map((c) => c.split(";")[0]!)
      .join("; "),
    setCookie: res.headers.getSetCookie(),
  };
}

/**
 * A sign-in attempt sent from a chosen loopback address (any of 127.0.0.0/8 is this machine),
 * so the app sees that address on the socket: the way to be several clients without any header.
 */
export function signInFrom(
  url: string,
  from: string,
  email: string,
  password: string,
  headers: Record<string, string> = {},
): Promise<number> {
  const target = new URL("/api/auth/sign-in/email", url);
  const body = JSON.stringify({ email, password });
  return new Promise((resolve, reject) => {
    const req = httpRequest(
      {
        host: target.hostname,
        port: target.port,
        path: target.pathname,
        method: "POST",
        localAddress: from,
        headers: {
          "content-type": "application/json",
          "content-length": Buffer.byteLength(body),
          origin: url,
          ...headers,
        },
      },
      (res) => {
        res.resume();
        res.on("end", () => resolve(res.statusCode ?? 0));
      },
    );
    req.on("error", reject);
    req.end(body);
  });
}

export async function call(
  url: string,
  cookie: string,
  method: string,
  path: string,
  body?: unknown,
  origin = url,
) {
  const res = await fetch(`${url}${path}`, {
    method,
    redirect: "manual",
    headers: {
      cookie,
      origin,
      ...(body === undefined ? {} : { "content-type": "application/json" }),
    },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await res.text();
  let json: any;
  try {
    json = JSON.parse(text);
  } catch {
    json = undefined;
  }
  return { status: res.status, headers: res.headers, text, json };
}
