import { randomUUID } from "node:crypto";

import { hashPassword } from "better-auth/crypto";
import postgres from "postgres";

export const sql = postgres(
  process.env.DATABASE_URL ?? "postgres://fuelwright@127.0.0.1:54339/fuelwright_test",
  { max: 2, onnotice: () => {} },
);

/** A second, unrelated shop with an owner who can sign in (password `other-shop-pass`). */
export async function makeOtherShop(label = randomUUID().slice(0, 8)) {
  const shopId = `test-shop-${label}`;
  const userId = `test-user-${label}`;
  const email = `owner-${label}@other.fuelwright.test`;
  const hash = await hashPassword("other-shop-pass");
  await sql`insert into organization (id, name, slug) values (${shopId}, ${"Other shop " + label}, ${"other-" + label})`;
  await sql`insert into shop_settings (shop_id, bsfc_gasoline_na, bsfc_gasoline_boosted, bsfc_e85_na, bsfc_e85_boosted) values (${shopId}, 304, 365, 426, 487)`;
  await sql`insert into "user" (id, name, email, email_verified) values (${userId}, ${"Other Owner"}, ${email}, true)`;
  await sql`insert into account (id, account_id, provider_id, user_id, password) values (${userId + "-cred"}, ${userId}, 'credential', ${userId}, ${hash})`;
  await sql`insert into member (id, organization_id, user_id, role) values (${randomUUID()}, ${shopId}, ${userId}, 'owner')`;
  return { shopId, userId, email, password: "other-shop-pass" };
}

/** A fingerprint of tables' rows, to prove a refused request changed nothing. */
export async function fingerprint(tables: string[]): Promise<string> {
  const parts: string[] = [];
  for (const t of tables) {
    const [row] = await sql.unsafe(
      `select count(*)::int as n, coalesce(md5(string_agg(x::text, ',' order by x::text)), '') as h from "${t}" x`,
    );
    parts.push(`${t}:${row!.n}:${row!.h}`);
  }
  return parts.join("|");
}

/**
 * The app's tables: every table of the public schema but those that reads and sign-ins write
 * by design (sessions, better-auth's verification tokens, rate-limit counters).
 */
export async function appTables(): Promise<string[]> {
  const rows = await sql<{ name: string }[]>`
    select table_name as name from information_schema.tables
    where table_schema = 'public' and table_type = 'BASE TABLE'
    order by table_name`;
  return rows
    .map((r) => r.name)
    .filter((n) => !["session", "verification"].includes(n) && !/rate/i.test(n));
}

/**
 * One fingerprint per table, read in one query: what a refusal must not change. The row count
 * and the sum of a 64-bit hash of each row's text (no sort, so cheap enough to take after every
 * request); any changed, added or removed row changes it.
 */
export async function tableHashes(tables: string[]): Promise<Record<string, string>> {
  const cols = tables
    .map(
      (t) =>
        `(select count(*) || ':' || coalesce(sum(hashtextextended(x::text, 16)), 0) from "${t}" x) as "${t}"`,
    )
    .join(", ");
  const [row] = await sql.unsafe(`select ${cols}`);
  return row as Record<string, string>;
}

/** The tables whose hashes differ. */
export const changedTables = (a: Record<string, string>, b: Record<string, string>) =>
  Object.keys(a).filter((t) => a[t] !== b[t]);
