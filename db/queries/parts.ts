import { and, asc, desc, eq, ilike, inArray, or, sql } from "drizzle-orm";

import { db } from "@/db";
import { parts } from "@/db/schema";
import { type PartCategory } from "@/lib/domain/parts";
import type { PartValues } from "@/lib/validations/parts";

import { escapeLike } from "./like";

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

export async function createPart(shopId: string, v: PartValues) {
  const [row] = await db
    .insert(parts)
    .values({ shopId, ...v })
    .onConflictDoNothing()
    .returning();
  return row ?? null; // null: the SKU is taken
}

export async function updatePart(shopId: string, id: string, v: PartValues) {
  const [row] = await db
    .update(parts)
    .set({ ...v, updatedAt: new Date() })
    .where(and(eq(parts.shopId, shopId), eq(parts.id, id)))
    .returning();
  return row ?? null;
}

export async function deletePart(shopId: string, id: string) {
  const rows = await db
    .delete(parts)
    .where(and(eq(parts.shopId, shopId), eq(parts.id, id)))
    .returning({ id: parts.id });
  return rows.length > 0;
}

/** Which SKUs of a list the shop has already (the import preview marks them "update"). */
export async function existingSkus(shopId: string, skus: string[]) {
  if (skus.length === 0) return new Set<string>();
  const rows = await db
    .select({ sku: parts.sku })
    .from(parts)
    .where(
      and(
        eq(parts.shopId, shopId),
        inArray(
          sql`lower(${parts.sku})`,
          skus.map((s) => s.toLowerCase()),
        ),
      ),
    );
  return new Set(rows.map((r) => r.sku.toLowerCase()));
}

/** Imports validated rows in one transaction: new SKUs are added, known ones updated. */
export async function importParts(shopId: string, rows: PartValues[]) {
  return db.transaction(async (tx) => {
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
            specs: sql`excluded.specs`,
            updatedAt: new Date(),
          },
        })
        .returning({ inserted: sql<boolean>`(xmax = 0)` });
      for (const r of res) r.inserted ? added++ : updated++;
    }
    return { added, updated };
  });
}

export async function partsNewestFirst(shopId: string) {
  return db.select().from(parts).where(eq(parts.shopId, shopId)).orderBy(desc(parts.updatedAt));
}
