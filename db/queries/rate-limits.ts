import { sql } from "drizzle-orm";

import { db } from "@/db";

/**
 * Counts one request against `key` in one statement (so concurrent requests, on any instance,
 * cannot all slip past a stale read): a fresh window of `windowSeconds` when the last one is
 * over, else one more in the current one. The database's clock is the only clock.
 */
export async function consumeRateLimit(
  key: string,
  windowSeconds: number,
  max: number,
): Promise<{ allowed: boolean; retryAfter: number | null }> {
  const rows = await db.execute<{ count: number; left: number }>(sql`
    insert into rate_limits as r (key, count, resets_at)
    values (${key}, 1, now() + make_interval(secs => ${windowSeconds}))
    on conflict (key) do update set
      count = case when r.resets_at <= now() then 1 else r.count + 1 end,
      resets_at = case when r.resets_at <= now() then excluded.resets_at else r.resets_at end
    returning count, ceil(extract(epoch from resets_at - now()))::int as left`);
  const row = rows[0]!;
  return row.count <= max
    ? { allowed: true, retryAfter: null }
    : { allowed: false, retryAfter: Math.max(1, Number(row.left)) };
}

/** Gives back one counted request in the current window (a sign-in that succeeded). */
export async function refundRateLimit(key: string): Promise<void> {
  await db.execute(
    sql`update rate_limits set count = greatest(count - 1, 0) where key = ${key} and resets_at > now()`,
  );
}

/** Drops counters whose window ended over an hour ago. */
export async function pruneRateLimits(): Promise<void> {
  await db.execute(sql`delete from rate_limits where resets_at < now() - interval '1 hour'`);
}
