import { AsyncLocalStorage } from "node:async_hooks";

/**
 * The database round trips of one request, counted when the request runs inside `countQueries`
 * (the JSON API's handler does when DB_QUERY_COUNT=on, and answers them in a response header so
 * a test can hold the per-request cost down; see tests/integration/round-trips.test.ts).
 */
// On globalThis: the database client outlives a development server's module reloads.
const g = globalThis as unknown as {
  fuelwrightQueryCount?: AsyncLocalStorage<{ queries: number }>;
};
const store = (g.fuelwrightQueryCount ??= new AsyncLocalStorage<{ queries: number }>());

export function countQueries<T>(fn: () => Promise<T>): Promise<{ value: T; queries: number }> {
  const counter = { queries: 0 };
  return store.run(counter, async () => ({ value: await fn(), queries: counter.queries }));
}

/**
 * Called by the database client for every statement it sends; the driver's own look-up of array
 * types, made once when it opens a connection, is not the request's.
 */
export function noteQuery(_connection: number, text: string): void {
  if (text.includes("pg_catalog.pg_type")) return;
  const counter = store.getStore();
  if (counter) counter.queries += 1;
}
