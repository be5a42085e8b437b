import "server-only";

import { getBuild, saveBuild } from "@/db/queries/builds";
import { getPartsByIds, listParts } from "@/db/queries/parts";
import type { QuoteLineInput } from "@/db/queries/quotes";
import { getShopSettings } from "@/db/queries/shops";
import type { Part } from "@/db/schema";
import { sizeForSave } from "@/lib/builds/service";
import { FuelSystemInputSchema, type FuelSystemInput } from "@/lib/calc";
import { type ChosenPart, type KitRole } from "@/lib/domain/builds";
import { NotFound } from "@/lib/domain/errors";
import { HttpError } from "@/lib/http/http-error";

import { applyKit, recommendKit, type CatalogPart } from "./recommend";

const asCatalog = (p: Part): CatalogPart => ({
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

export async function kitFor(shopId: string, buildId: string) {
  const row = await getBuild(shopId, buildId);
  if (!row) throw new NotFound("That build");
  const input = FuelSystemInputSchema.parse(row.build.inputs);
  const catalog = (await listParts(shopId, { limit: 2000 })).map(asCatalog);
  return { build: row.build, recommendation: recommendKit(input, catalog) };
}

/** Writes the chosen parts into the build as a new revision; the sizing then runs on their data. */
export async function chooseKit(
  shopId: string,
  userId: string,
  buildId: string,
  version: number,
  choice: { role: KitRole; partId: string; quantity: number }[],
) {
  const row = await getBuild(shopId, buildId);
  if (!row) throw new NotFound("That build");
  const found = new Map(
    (await getPartsByIds(shopId, [...new Set(choice.map((c) => c.partId))])).map((p) => [p.id, p]),
  );
  const chosen = choice.map((c) => {
    const p = found.get(c.partId);
    if (!p)
      throw new HttpError(422, "invalid_input", "A chosen part is not in this shop's catalog");
    const wanted = (
      {
        injector: "injector",
        pump: "pump",
        regulator: "regulator",
        "feed-line": "line",
        "return-line": "line",
        filter: "filter",
        sensor: "sensor",
      } as const
    )[c.role];
    if (p.category !== wanted)
      throw new HttpError(422, "invalid_input", `${p.sku} is a ${p.category}, not a ${wanted}`);
    return { role: c.role, part: asCatalog(p), quantity: c.quantity };
  });
  const input = FuelSystemInputSchema.parse(row.build.inputs);
  const next = applyKit(input, chosen);
  const sized = sizeForSave(next as FuelSystemInput);
  const parts: ChosenPart[] = chosen.map((c) => ({
    role: c.role,
    partId: c.part.id,
    sku: c.part.sku,
    name: `${c.part.brand} ${c.part.name}`,
    quantity: c.quantity,
  }));
  return saveBuild(shopId, buildId, userId, version, {
    ...sized,
    parts,
    note: `Parts chosen: ${parts.map((p) => p.sku).join(", ")}`,
  });
}

/** Quote lines from a build's chosen parts at today's prices, plus a labour line at the shop's rate. */
export async function linesFromBuild(
  shopId: string,
  parts: ChosenPart[],
  labourHours = 4,
): Promise<QuoteLineInput[]> {
  const catalog = new Map(
    (
      await getPartsByIds(
        shopId,
        parts.map((p) => p.partId),
      )
    ).map((p) => [p.id, p]),
  );
  const settings = await getShopSettings(shopId);
  const lines: QuoteLineInput[] = [];
  for (const c of parts) {
    const p = catalog.get(c.partId);
    if (!p) continue; // deleted from the catalog since
    lines.push({
      kind: "part",
      partId: p.id,
      sku: p.sku,
      description: `${p.brand} ${p.name}${c.role === "feed-line" ? " — feed" : c.role === "return-line" ? " — return" : ""}`,
      quantityMilli: c.quantity * 1000,
      unitPriceMinor: p.priceMinor,
      discountBp: 0,
    });
  }
  if (labourHours > 0)
    lines.push({
      kind: "labour",
      description: "Fuel system fitting and setup",
      quantityMilli: Math.round(labourHours * 1000),
      unitPriceMinor: settings?.settings.labourRateMinor ?? 12000,
      discountBp: 0,
    });
  return lines;
}
