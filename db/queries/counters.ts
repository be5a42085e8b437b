import { sql } from "drizzle-orm";

import { db } from "@/db";
import { shopCounters } from "@/db/schema";

export type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

/**
 * The next number of a per-shop counter ("purchase_order", "job", "invoice", "credit_note"),
 * inside the caller's transaction: the counter's row is locked until it ends, so numbers have no
 * gaps and no duplicates.
 */
export async function nextShopNumber(tx: Tx, shopId: string, name: string): Promise<number> {
  const [row] = await tx
    .insert(shopCounters)
    .values({ shopId, name, value: 1 })
    .onConflictDoUpdate({
      target: [shopCounters.shopId, shopCounters.name],
      set: { value: sql`${shopCounters.value} + 1` },
    })
    .returning({ value: shopCounters.value });
  return row!.value;
}
