import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { sql } from "../helpers/db";

// The session look-ups kept in memory (db/session-cache.ts), driven in this process against the
// test database: when a look-up may be kept, and every way it must be forgotten. The servers'
// side of it (a signed-in request's round trips, sign-out, a change made elsewhere) is in
// round-trips.test.ts.

const url = process.env.DATABASE_URL!;
type Cache = typeof import("@/db/session-cache");
let cache: Cache;

beforeAll(async () => {
  // Only a Next.js server keeps look-ups; this process stands in for one.
  process.env.NEXT_RUNTIME = "nodejs";
  cache = await import("@/db/session-cache");
});

/** A look-up of `token` that counts how often it reached "the database". */
function counted(token: string) {
  let reads = 0;
  const look = () =>
    cache.keptLookup(url, token, async () => {
      reads += 1;
      return { token, reads };
    });
  return { look, reads: () => reads };
}

async function until(check: () => boolean, ms = 5000) {
  const end = Date.now() + ms;
  while (!check()) {
    if (Date.now() > end) throw new Error("timed out");
    await new Promise((r) => setTimeout(r, 10));
  }
}

const heldOver = () => until(() => !cache.sessionCacheState().held, 5000);

describe("session look-ups kept in memory", () => {
  it("keeps nothing until the listener is heard, then keeps a look-up and serves it again", async () => {
    const a = counted("token-a");
    await a.look(); // starts the listener; not listening yet, so not kept
    await until(() => cache.sessionCacheState().listening);
    await heldOver();
    await a.look();
    const before = a.reads();
    expect(await a.look()).toEqual({ token: "token-a", reads: before });
    expect(a.reads()).toBe(before);
  });

  it("this process's own write to a table the look-up reads forgets at once and keeps nothing for a while", async () => {
    await heldOver();
    const a = counted("token-b");
    await a.look();
    await a.look();
    expect(a.reads()).toBe(1);
    for (const statement of [
      `update "member" set "role" = $1 where "id" = $2`,
      `delete from "session" where "token" = $1`,
      `update shop_settings set design_duty_pct = 80 where shop_id = 'x'`,
      `insert into "organization" ("id", "name") values ($1, $2)`,
      `UPDATE "user" SET "name" = $1`,
    ]) {
      const reads = a.reads();
      cache.noteStatement(statement);
      expect(cache.sessionCacheState()).toMatchObject({ kept: 0, held: true });
      await a.look();
      await a.look();
      expect(a.reads(), statement).toBe(reads + 2);
    }
  });

  it("statements that change no look-up forget nothing", async () => {
    await heldOver();
    const a = counted("token-c");
    await a.look();
    for (const statement of [
      `insert into "session" ("id", "token") values ($1, $2)`,
      `select * from "session" where "token" = $1`,
      `update "builds" set "title" = $1`,
      `update "member_notes" set "x" = 1`,
      `insert into "sessions_archive" values (1)`,
    ]) {
      cache.noteStatement(statement);
      expect(cache.sessionCacheState().held, statement).toBe(false);
    }
    await a.look();
    expect(a.reads()).toBe(1);
  });

  it("a look-up read while something changed is not kept", async () => {
    await heldOver();
    let reads = 0;
    const look = () =>
      cache.keptLookup(url, "token-d", async () => {
        reads += 1;
        if (reads === 1) {
          // The database's notice arrives while this read is on its way.
          const g = cache.sessionCacheState().generation;
          await sql`notify fw_auth_changed, 'test'`;
          await until(() => cache.sessionCacheState().generation > g, 3000);
        }
        return { reads };
      });
    await look();
    await look();
    expect(reads).toBe(2);
    await look();
    expect(reads).toBe(2);
  });

  it("a change committed by another client forgets every look-up once its notice arrives", async () => {
    await heldOver();
    const a = counted("token-e");
    await a.look();
    await a.look();
    expect(a.reads()).toBe(1);
    // Another instance's write: the trigger's notice, nothing this process saw being sent.
    const [row] = await sql<{ shop_id: string; time_zone: string }[]>`
      select shop_id, time_zone from shop_settings limit 1`;
    await sql`update shop_settings set time_zone = ${row!.time_zone} where shop_id = ${row!.shop_id}`;
    await until(() => cache.sessionCacheState().kept === 0, 3000);
    expect(cache.sessionCacheState().held).toBe(false);
    await a.look();
    expect(a.reads()).toBe(2);
    // A change that is rolled back sends no notice and forgets nothing.
    await a.look();
    await sql
      .begin(async (tx) => {
        await tx`update shop_settings set time_zone = ${row!.time_zone} where shop_id = ${row!.shop_id}`;
        throw new Error("roll back");
      })
      .catch(() => {});
    await new Promise((r) => setTimeout(r, 200));
    await a.look();
    expect(a.reads()).toBe(2);
  });

  it("a dropped listener keeps nothing until it is back, and forgets what it kept before", async () => {
    await heldOver();
    const a = counted("token-f");
    await a.look();
    await a.look();
    expect(a.reads()).toBe(1);
    const pid = cache.sessionCacheState().pid!;
    const [cut] = await sql<{ done: boolean }[]>`select pg_terminate_backend(${pid}) as done`;
    expect(cut!.done).toBe(true);
    await until(() => !cache.sessionCacheState().listening, 3000);
    expect(cache.sessionCacheState().kept).toBe(0);
    // While deaf: every look-up reads.
    await a.look();
    await a.look();
    expect(a.reads()).toBe(3);
    // Back (it retries after a second): kept again.
    await until(() => cache.sessionCacheState().listening, 6000);
    await a.look();
    const reads = a.reads();
    await a.look();
    expect(a.reads()).toBe(reads);
  });
});

afterAll(async () => {
  await sql.end();
});
