import "server-only";

import { getBuild } from "@/db/queries/builds";
import { listParts } from "@/db/queries/parts";
import { heldForBuild } from "@/db/queries/quotes";
import { getShopSettings } from "@/db/queries/shops";
import type { Part } from "@/db/schema";
import { recommendKit, type CatalogPart } from "@/lib/catalog/recommend";
import { expectedOn } from "@/lib/catalog/stock";
import { NotFound } from "@/lib/domain/errors";
import { calendarDay } from "@/lib/format/dates";
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

/**
 * The build with the shop's catalog ranked for it, role by role (lib/catalog/recommend.ts). The
 * ranking depends neither on the parts the build has chosen nor on the stock its own quotes hold:
 * it is judged on the inputs as they stood before the kit wrote parts into them (`kit_basis`), and
 * the units this build's quotes hold count as free for it. Parts not (all) on the shelf carry the
 * day they are expected, counted in the shop's time zone.
 */
export async function kitForBuild(shopId: string, buildId: string) {
  const row = await getBuild(shopId, buildId);
  if (!row) throw new NotFound("That build");
  const [rows, held, settings, sizing] = await Promise.all([
    listParts(shopId, { limit: 2000 }),
    heldForBuild(shopId, buildId),
    getShopSettings(shopId),
    shopSizingSettings(shopId),
  ]);
  const today = calendarDay(new Date(), settings?.settings.timeZone ?? "UTC");
  const catalog = rows.map((p) => ({
    ...catalogPartOf(p),
    reserved: Math.max(0, p.reserved - (held.get(p.id) ?? 0)),
    expectedOn: expectedOn(p, today),
  }));
  const basis = row.build.kitBasis ?? row.build;
  return {
    build: row.build,
    // Judged as a choice would be saved: the build's inputs with today's shop settings.
    recommendation: recommendKit(parsedEffectiveInputs(sizing, readStoredInputs(basis)), catalog),
  };
}
