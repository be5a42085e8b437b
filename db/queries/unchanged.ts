import { getTableColumns, is, SQL, sql } from "drizzle-orm";
import type { PgColumn, PgTable } from "drizzle-orm/pg-core";

/**
 * A save that changes nothing writes nothing: every update puts `differs(table, values)` into its
 * WHERE, so a row whose columns already hold `values` is left alone — `updated_at`, `version`
 * and revisions included — and the caller answers with the row as it is.
 *
 * The comparison is PostgreSQL's own (`IS DISTINCT FROM`, NULL-safe), on values cast to the
 * column's type: jsonb by content (key order and `1.0` against `1` do not count), `real` as
 * stored. Keys whose value is `undefined` are not compared (they are not written either).
 *
 * @example tx.update(customers).set(v).where(and(eq(customers.id, id), differs(customers, v)))
 */
export function differs<T extends PgTable>(table: T, values: Record<string, unknown>): SQL {
  const columns = getTableColumns(table) as Record<string, PgColumn>;
  const conds: SQL[] = [];
  for (const [key, value] of Object.entries(values)) {
    if (value === undefined) continue;
    const col = columns[key];
    if (!col) throw new Error(`${key} is not a column of the table`);
    conds.push(
      is(value, SQL)
        ? sql`${col} is distinct from ${value}`
        : sql`${col} is distinct from ${sql.param(value, col)}::${sql.raw(col.getSQLType())}`,
    );
  }
  return conds.length ? sql`(${sql.join(conds, sql` or `)})` : sql`false`;
}

/**
 * For `INSERT … ON CONFLICT DO UPDATE … WHERE`: the stored row differs from the proposed one
 * (`excluded`) in one of `columns`.
 */
export function differsFromExcluded(columns: PgColumn[]): SQL {
  return sql`(${sql.join(
    columns.map((c) => sql`${c} is distinct from excluded.${sql.identifier(c.name)}`),
    sql` or `,
  )})`;
}
