import "server-only";

import { reorderFacts } from "@/db/queries/purchasing";
import { reorderList } from "@/lib/domain/purchasing";

/**
 * The reorder list with each part's names and the supplier to order from: the one offering it at
 * the lowest cost (a supplier without a price comes after those with one), else none.
 */
export async function reorderRows(shopId: string) {
  const facts = await reorderFacts(shopId);
  const byId = new Map(facts.parts.map((p) => [p.id, p]));
  return reorderList(facts.parts, facts.backOrdered, facts.onOrder).map((r) => {
    const p = byId.get(r.partId)!;
    const offers = facts.offers
      .filter((o) => o.partId === r.partId)
      .sort((a, b) => (a.costMinor ?? Infinity) - (b.costMinor ?? Infinity));
    return {
      ...r,
      sku: p.sku,
      brand: p.brand,
      name: p.name,
      stock: p.stock,
      reserved: p.reserved,
      reorderLevel: p.reorderLevel,
      supplier: offers[0]
        ? {
            id: offers[0].supplierId,
            name: offers[0].supplierName,
            supplierSku: offers[0].supplierSku,
            costMinor: offers[0].costMinor ?? p.costMinor,
          }
        : null,
    };
  });
}
