import { drizzle } from "drizzle-orm/postgres-js";
import postgres from "postgres";

import { serverEnv } from "@/lib/env";

import { noteQuery } from "./query-count";
import * as schema from "./schema";
import { noteStatement } from "./session-cache";

type Db = ReturnType<typeof drizzle<typeof schema>>;
const globalForDb = globalThis as unknown as { fuelwrightDb?: Db; fuelwrightSql?: postgres.Sql };

function connect(): Db {
  const sql = postgres(serverEnv().DATABASE_URL, {
    max: 10,
    idle_timeout: 20,
    connect_timeout: 5,
    onnotice: () => {},
    // Every statement, as it is sent: a write to what a session look-up reads forgets the kept
    // look-ups (db/session-cache.ts); the test servers also count them (db/query-count.ts).
    debug:
      process.env.DB_QUERY_COUNT === "on"
        ? (connection, text) => {
            noteStatement(text);
            noteQuery(connection, text);
          }
        : (_connection, text) => noteStatement(text),
  });
  globalForDb.fuelwrightSql = sql;
  return drizzle(sql, { schema });
}

/** The one database client (lazy, so that `next build` needs no database). */
export const db: Db = new Proxy({} as Db, {
  get(_t, prop) {
    globalForDb.fuelwrightDb ??= connect();
    const value = Reflect.get(globalForDb.fuelwrightDb, prop);
    // `$client` is postgres.js's own `sql` (a function with methods such as `unsafe`): as it is.
    if (prop === "$client") return value;
    return typeof value === "function" ? value.bind(globalForDb.fuelwrightDb) : value;
  },
});

export { schema };
