import { spawnSync } from "node:child_process";
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

import { afterAll, describe, expect, it } from "vitest";

import { freshDatabase, PG_PORT, sqlFor } from "../helpers/system";

const conns: ReturnType<typeof sqlFor>[] = [];
afterAll(async () => {
  await Promise.all(conns.map((c) => c.end()));
});

/** Every table's row count and a hash of its rows, in one string. */
async function snapshot(sql: ReturnType<typeof sqlFor>) {
  const tables = (
    await sql`select tablename from pg_tables where schemaname = 'public' order by 1`
  ).map((r) => r.tablename as string);
  const parts: string[] = [];
  for (const t of tables) {
    const [row] = await sql.unsafe(
      `select count(*)::int as n, coalesce(md5(string_agg(x::text, ',' order by x::text)), '') as h from "${t}" x`,
    );
    parts.push(`${t}:${row!.n}:${row!.h}`);
  }
  return { tables, text: parts.join("\n") };
}

const npm = (script: string, url: string, args: string[]) =>
  spawnSync("npm", ["run", "-s", script, "--", ...args], {
    env: { ...process.env, DATABASE_URL: url },
    encoding: "utf8",
  });

describe("backup and restore", () => {
  it("db:backup then db:restore round-trips a seeded database, also over one that changed since", async () => {
    const src = freshDatabase("fuelwright_backup_src");
    const file = join(mkdtempSync(join(tmpdir(), "fw-backup-")), "snapshot.dump");
    const backup = npm("db:backup", src, [file]);
    expect(backup.status, backup.stderr).toBe(0);
    expect(backup.stdout.trim()).toBe(file);

    // Into an empty database…
    const admin = sqlFor(`postgres://fuelwright@127.0.0.1:${PG_PORT}/postgres`);
    conns.push(admin);
    await admin.unsafe("drop database if exists fuelwright_backup_dst with (force)");
    await admin.unsafe("create database fuelwright_backup_dst");
    const dstUrl = `postgres://fuelwright@127.0.0.1:${PG_PORT}/fuelwright_backup_dst`;
    const restore = npm("db:restore", dstUrl, [file]);
    expect(restore.status, restore.stderr).toBe(0);
    const a = sqlFor(src);
    const b = sqlFor(dstUrl);
    conns.push(a, b);
    const want = await snapshot(a);
    expect(want.tables.length).toBeGreaterThan(15);
    expect((await snapshot(b)).text).toBe(want.text);

    // …and over a database that has changed since: the backup's state comes back.
    await b`delete from quote_lines`;
    await b`update builds set title = 'changed after the backup'`;
    expect((await snapshot(b)).text).not.toBe(want.text);
    const again = npm("db:restore", dstUrl, [file]);
    expect(again.status, again.stderr).toBe(0);
    expect((await snapshot(b)).text).toBe(want.text);

    // A missing file is refused plainly and changes nothing.
    const missing = npm("db:restore", dstUrl, [join(tmpdir(), "no-such-backup.dump")]);
    expect(missing.status).not.toBe(0);
    expect(missing.stderr).toMatch(/no backup file/);
    expect((await snapshot(b)).text).toBe(want.text);
  }, 120_000);
});
