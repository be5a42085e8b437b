import "server-only";

import { getPartsByIds } from "@/db/queries/parts";
import type { QuoteLineInput } from "@/db/queries/quotes";
import { getShopSettings } from "@/db/queries/shops";
import { type ChosenPart } from "@/lib/domain/builds";

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
