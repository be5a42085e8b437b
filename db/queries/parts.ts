import { and, asc, desc, eq, ilike, inArray, or, sql } from "drizzle-orm";

import { db } from "@/db";
import { parts, type Part } from "@/db/schema";
import { Conflict, NotFound } from "@/lib/domain/errors";
import { type PartCategory } from "@/lib/domain/parts";

import { escapeLike } from "./like";
import { differs, differsFromExcluded } from "./unchanged";

const SORTS = {
  name: [asc(parts.name)],
  sku: [asc(parts.sku)],
  price: [asc(parts.priceMinor)],
  stock: [asc(sql`${parts.stock} - ${parts.reserved}`)],
} as const;

export async function listParts(
  shopId: string,
  opts: { q?: string; category?: PartCategory; sort?: keyof typeof SORTS; limit?: number } = {},
) {
  const conds = [eq(parts.shopId, shopId)];
  if (opts.category) conds.push(eq(parts.category, opts.category));
  if (opts.q) {
    const like = `%${escapeLike(opts.q)}%`;
    conds.push(or(ilike(parts.sku, like), ilike(parts.name, like), ilike(parts.brand, like))!);
  }
  return db
    .select()
    .from(parts)
    .where(and(...conds))
    .orderBy(...SORTS[opts.sort ?? "name"], asc(parts.id))
    .limit(opts.limit ?? 500);
}

export async function getPart(shopId: string, id: string) {
  const [row] = await db
    .select()
    .from(parts)
    .where(and(eq(parts.shopId, shopId), eq(parts.id, id)))
    .limit(1);
  return row ?? null;
}

export async function getPartsByIds(shopId: string, ids: string[]) {
  if (ids.length === 0) return [];
  return db
    .select()
    .from(parts)
    .where(and(eq(parts.shopId, shopId), inArray(parts.id, ids)));
}

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

/** A part's own columns, as a command writes them. */
export type PartColumns = Pick<
  typeof parts.$inferInsert,
  | "sku"
  | "category"
  | "brand"
  | "name"
  | "priceMinor"
  | "costMinor"
  | "stock"
  | "reorderLevel"
  | "leadTimeDays"
  | "restockOn"
> & { specs: Record<string, unknown> };

/** The columns to change: only the keys present are written. */
export type PartPatch = Partial<PartColumns>;

const skuTaken = (sku: string | undefined) =>
  Conflict.field(
    "sku",
    sku ? `SKU ${sku} is already in the catalog` : "That SKU is already in the catalog",
    "duplicate_sku",
  );

/** Is this (or what it wraps: drizzle wraps driver errors) a unique-index violation? */
function isUniqueViolation(err: unknown): boolean {
  for (let e = err, depth = 0; e && typeof e === "object" && depth < 5; depth++) {
    if ((e as { code?: unknown }).code === "23505") return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}

/** A new part; a SKU the shop has already is a Conflict on `sku`. */
export async function createPart(shopId: string, v: PartColumns) {
  const [row] = await db
    .insert(parts)
    .values({ shopId, ...v })
    .onConflictDoNothing()
    .returning();
  if (!row) throw skuTaken(v.sku);
  return row;
}

/**
 * Changes a part under a row lock, in one transaction: `change` sees the stored row and returns
 * the columns to write (a key it leaves out keeps its stored value; it may throw to refuse).
 * With `expectedVersion`, a part no longer at it is a Conflict carrying the part as it is now.
 * Nothing is written — `version` and `updated_at` stay — when every given value equals the
 * stored one; the answer is then the part as it is.
 */
export async function updatePartWith(
  shopId: string,
  id: string,
  expectedVersion: number | undefined,
  change: (stored: Part) => PartPatch,
) {
  let sku: string | undefined;
  try {
    return await db.transaction(async (tx) => {
      const mine = and(eq(parts.shopId, shopId), eq(parts.id, id));
      const [stored] = await tx.select().from(parts).where(mine).for("update").limit(1);
      if (!stored) throw new NotFound("That part");
      if (expectedVersion !== undefined && stored.version !== expectedVersion)
        throw new Conflict<Part>(
          `Someone saved this part meanwhile (now version ${stored.version}); nothing was overwritten`,
          "conflict",
          stored,
        );
      const patch = Object.fromEntries(
        Object.entries(change(stored)).filter(([, v]) => v !== undefined),
      ) as PartPatch;
      sku = patch.sku;
      const [row] = await tx
        .update(parts)
        .set({ ...patch, version: sql`${parts.version} + 1`, updatedAt: new Date() })
        .where(and(mine, differs(parts, patch)))
        .returning();
      return row ?? stored;
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw skuTaken(sku);
    throw e;
  }
}

export async function deletePart(shopId: string, id: string) {
  const rows = await db
    .delete(parts)
    .where(and(eq(parts.shopId, shopId), eq(parts.id, id)))
    .returning({ id: parts.id });
  if (rows.length === 0) throw new NotFound("That part");
}

/**
 * The shop's parts with these SKUs (exactly as spelt: the SKU index is case-sensitive, and an
 * import matches it the same way), by SKU. Within `tx` with `lock`, the rows are locked.
 */
export async function partsBySku(
  shopId: string,
  skus: string[],
  { tx = db as Tx | typeof db, lock = false } = {},
) {
  const stored = new Map<string, Part>();
  for (let i = 0; i < skus.length; i += 1000) {
    const q = tx
      .select()
      .from(parts)
      .where(and(eq(parts.shopId, shopId), inArray(parts.sku, skus.slice(i, i + 1000))));
    for (const p of await (lock ? q.for("update") : q)) stored.set(p.sku, p);
  }
  return stored;
}

/**
 * Imports rows in one transaction, upserting by SKU. The shop's parts with these SKUs are locked
 * first and handed to `build`, which returns the rows to write (for a known SKU: the stored part
 * with the file's changes merged in).
 */
export async function importPartsWith(
  shopId: string,
  skus: string[],
  build: (stored: Map<string, Part>) => PartColumns[],
) {
  return db.transaction(async (tx) => {
    const stored = await partsBySku(shopId, skus, { tx, lock: true });
    return upsertParts(tx, shopId, build(stored));
  });
}

/** The columns an import writes: a known SKU whose row already holds them is left alone. */
const IMPORTED = [
  parts.category,
  parts.brand,
  parts.name,
  parts.priceMinor,
  parts.costMinor,
  parts.stock,
  parts.reorderLevel,
  parts.leadTimeDays,
  parts.restockOn,
  parts.specs,
];

async function upsertParts(tx: Tx, shopId: string, rows: PartColumns[]) {
  let added = 0;
  let updated = 0;
  for (let i = 0; i < rows.length; i += 500) {
    const chunk = rows.slice(i, i + 500);
    const res = await tx
      .insert(parts)
      .values(chunk.map((r) => ({ shopId, ...r })))
      .onConflictDoUpdate({
        target: [parts.shopId, parts.sku],
        set: {
          category: sql`excluded.category`,
          brand: sql`excluded.brand`,
          name: sql`excluded.name`,
          priceMinor: sql`excluded.price_minor`,
          costMinor: sql`excluded.cost_minor`,
          stock: sql`excluded.stock`,
          reorderLevel: sql`excluded.reorder_level`,
          leadTimeDays: sql`excluded.lead_time_days`,
          restockOn: sql`excluded.restock_on`,
          specs: sql`excluded.specs`,
          version: sql`${parts.version} + 1`,
          updatedAt: new Date(),
        },
        setWhere: differsFromExcluded(IMPORTED),
      })
      .returning({ inserted: sql<boolean>`(xmax = 0)` });
    for (const r of res) r.inserted ? added++ : updated++;
  }
  return { added, updated, unchanged: rows.length - added - updated };
}

export async function partsNewestFirst(shopId: string) {
  return db.select().from(parts).where(eq(parts.shopId, shopId)).orderBy(desc(parts.updatedAt));
}
