import { existsSync, readFileSync } from "node:fs";
import { createRequire } from "node:module";

import { BASE_URL, type Client } from "./http";

const require = createRequire(import.meta.url);
// React's own encoder for server-action arguments (what the browser sends).
const { encodeReply } = require("next/dist/compiled/react-server-dom-webpack/client.edge") as {
  encodeReply: (v: unknown) => Promise<string | FormData>;
};

export interface ActionRef {
  id: string;
  file: string;
  name: string;
  /** A page that uses it (the action is posted to that page). */
  page: string;
}

/** The server actions the running app knows, from its build's manifest (production or dev). */
export function actionManifest(): ActionRef[] {
  // npm test and `npm run test:env -- --prod` serve .next-test; plain `next dev` keeps only what it compiled.
  const dist = process.env.NEXT_DIST_DIR || ".next-test";
  const file = [
    `${dist}/server/server-reference-manifest.json`,
    `${dist}/dev/server/server-reference-manifest.json`,
  ].find(existsSync);
  if (!file) return [];
  const m = JSON.parse(readFileSync(file, "utf8")) as {
    node: Record<
      string,
      { filename?: string; exportedName?: string; workers: Record<string, unknown> }
    >;
  };
  return Object.entries(m.node).map(([id, v]) => ({
    id,
    file: v.filename ?? "",
    name: v.exportedName ?? "",
    page: pagePath(Object.keys(v.workers)[0] ?? ""),
  }));
}

/** "app/(shop)/customers/[id]/page" → "/customers/x" with a placeholder for each segment parameter. */
function pagePath(worker: string): string {
  const p = worker
    .replace(/^app/, "")
    .replace(/\/page$/, "")
    .replace(/\/\([^)]+\)/g, "")
    .replace(/\[[^\]]+\]/g, "00000000-0000-4000-8000-000000000001");
  return p || "/";
}

/** The state an action returned, read from the flight response (the line carrying `"ok":`). */
export interface ActionResult {
  /** 0 when React's encoder itself refused the arguments (a browser could not send them either). */
  http: number;
  state: { ok: boolean; status?: number; message?: string } | null;
  /** The action ended in a redirect (a success for create-and-go actions). */
  redirect: string | null;
  /** The response's body as sent (a flight stream, or the edge's JSON refusal). */
  text: string;
}

/** Headers to change on the call (null leaves one out) and a body to send instead of the encoded arguments. */
export interface CallOptions {
  headers?: Record<string, string | null>;
  body?: BodyInit;
}

/** Calls a server action over HTTP the way the browser does. */
export async function callAction(
  client: Client | null,
  ref: ActionRef,
  args: unknown[],
  options: CallOptions = {},
): Promise<ActionResult> {
  let body: BodyInit;
  try {
    body = options.body ?? (await encodeReply(args));
  } catch {
    return { http: 0, state: null, redirect: null, text: "" };
  }
  const headers: Record<string, string> = {
    accept: "text/x-component",
    "next-action": ref.id,
    origin: BASE_URL,
    ...(typeof body === "string" ? { "content-type": "text/plain;charset=UTF-8" } : {}),
    ...(client ? { cookie: client.cookie, "x-forwarded-for": client.ip } : {}),
  };
  for (const [k, v] of Object.entries(options.headers ?? {})) {
    if (v === null) delete headers[k];
    else headers[k] = v;
  }
  const res = await fetch(`${BASE_URL}${ref.page}`, {
    method: "POST",
    redirect: "manual",
    headers,
    body,
  });
  const text = await res.text();
  const line = text
    .split("\n")
    .map((l) => l.replace(/^[0-9a-f]+:/, ""))
    .find((l) => l.startsWith("{") && l.includes('"ok":'));
  let state: ActionResult["state"] = null;
  try {
    state = line ? JSON.parse(line) : null;
  } catch {
    state = null;
  }
  return {
    http: res.status,
    text,
    state,
    redirect:
      res.headers.get("x-action-redirect") ??
      (res.status >= 300 && res.status < 400 ? res.headers.get("location") : null),
  };
}

export function formOf(values: Record<string, string>): FormData {
  const f = new FormData();
  for (const [k, v] of Object.entries(values)) f.set(k, v);
  return f;
}
