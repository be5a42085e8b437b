import type { ChosenPart } from "@/lib/domain/builds";
import type { QuoteLineInput } from "@/lib/validations/quotes";

/** What a quote line needs to know of a catalog part. */
export interface PricedPart {
  id: string;
  sku: string;
  brand: string;
  name: string;
  priceMinor: number;
}

/**
 * Quote lines from a build's chosen parts at today's catalog prices, plus a labour line at the
 * shop's rate. A chosen part deleted from the catalog since is left out.
 */
export function linesFromBuild(
  chosen: ChosenPart[],
  catalog: PricedPart[],
  labour: { hours: number; rateMinor: number },
): QuoteLineInput[] {
  const byId = new Map(catalog.map((p) => [p.id, p]));
  const lines: QuoteLineInput[] = [];
  for (const c of chosen) {
    const p = byId.get(c.partId);
    if (!p) continue;
    const side = c.role === "feed-line" ? " — feed" : c.role === "return-line" ? " — return" : "";
    lines.push({
      kind: "part",
      partId: p.id,
      sku: p.sku,
      description: `${p.brand} ${p.name}${side}`,
      quantityMilli: c.quantity * 1000,
      unitPriceMinor: p.priceMinor,
      discountBp: 0,
    });
  }
  return withLabour(lines, labour);
}

/** The description a labour line starts with. */
export const LABOUR_DESCRIPTION = "Fuel system fitting and setup";

/**
 * The lines with one labour line at the shop's rate — added once: lines that already carry
 * labour (a kit's quote, a line typed in) are returned as they are, as are zero hours.
 */
export function withLabour(
  lines: QuoteLineInput[],
  labour: { hours: number; rateMinor: number },
): QuoteLineInput[] {
  if (labour.hours <= 0 || lines.some((l) => l.kind === "labour")) return lines;
  return [
    ...lines,
    {
      kind: "labour",
      description: LABOUR_DESCRIPTION,
      quantityMilli: Math.round(labour.hours * 1000),
      unitPriceMinor: labour.rateMinor,
      discountBp: 0,
    },
  ];
}
