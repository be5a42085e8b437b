import "server-only";

import { pingDatabase } from "@/db/queries/health";

const TTL_MS = 1000;
/** While the database is away, ask again sooner, so pages come back as soon as it does. */
const DOWN_TTL_MS = 250;
let last: { at: number; ok: boolean; pending?: Promise<boolean> } = { at: 0, ok: true };

/**
 * Does the database answer? Asked at most once a second (pages share the answer), and never
 * waits longer than two seconds, so an outage turns into a quick 503 rather than a hung page.
 */
export async function databaseAnswering(): Promise<boolean> {
  const now = Date.now();
  if (now - last.at < (last.ok ? TTL_MS : DOWN_TTL_MS)) return last.ok;
  if (last.pending) return last.pending;
  const probe = Promise.race([
    pingDatabase().then(
      () => true,
      () => false,
    ),
    new Promise<boolean>((resolve) => setTimeout(() => resolve(false), 2000).unref?.()),
  ]);
  last.pending = probe;
  const ok = await probe;
  last = { at: Date.now(), ok };
  return ok;
}

/** The page a browser gets while the database is away: plain, no scripts, retried by itself. */
export const UNAVAILABLE_HTML = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><meta http-equiv="refresh" content="10"><title>Back in a moment · Fuelwright</title></head><body style="font-family: system-ui, sans-serif; max-width: 36rem; margin: 4rem auto; padding: 0 1rem; color: #1f2933"><h1>Back in a moment</h1><p>Fuelwright cannot reach its database just now. Nothing you saved is lost; this page tries again by itself every few seconds.</p></body></html>`;
