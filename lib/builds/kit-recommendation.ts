import "server-only";

import { getBuild } from "@/db/queries/builds";
import { listParts } from "@/db/queries/parts";
import type { Part } from "@/db/schema";
import { recommendKit, type CatalogPart } from "@/lib/catalog/recommend";
import { NotFound } from "@/lib/domain/errors";
import { parsedEffectiveInputs } from "@/lib/sizing/effective-inputs";
import { shopSizingSettings } from "@/lib/sizing/shop-sizing";

import { readStoredInputs } from "./stored-inputs";

/** A catalog row as the recommender and the kit choice see it. */
export const catalogPartOf = (p: Part): CatalogPart => ({
  id: p.id,
  sku: p.sku,
  brand: p.brand,
  name: p.name,
  category: p.category,
  priceMinor: p.priceMinor,
  stock: p.stock,
  reserved: p.reserved,
  specs: p.specs as Record<string, unknown>,
});

/** The build with the shop's catalog ranked for it, role by role (lib/catalog/recommend.ts). */
export async function kitForBuild(shopId: string, buildId: string) {
  const row = await getBuild(shopId, buildId);
  if (!row) throw new NotFound("That build");
  const catalog = (await listParts(shopId, { limit: 2000 })).map(catalogPartOf);
  return {
    build: row.build,
    // Judged as a choice would be saved: the build's inputs with today's shop settings.
    recommendation: recommendKit(
      parsedEffectiveInputs(await shopSizingSettings(shopId), readStoredInputs(row.build)),
      catalog,
    ),
  };
}
