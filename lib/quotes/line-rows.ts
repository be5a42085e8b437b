import { formatScaled, minorToPlain, parseMoney, parseScaled } from "@/lib/catalog/money";
import {
  quantityTooLarge,
  unitPriceTooLarge,
  type quoteLimitMessages,
} from "@/lib/quotes/quote-limits";
import type { PricedPart } from "@/lib/quotes/quote-lines";

/*
 * A quote's or a draft invoice's lines as their editors hold them (components/quotes/
 * quote-editor.tsx, components/operations/invoice-editor.tsx): the line as loaded and sent, the
 * row as typed, what the typing parses to and what is wrong with it. Pure: the editors and the
 * pages that fill them share it.
 */

/** A line as an editor loads and sends it (integer milli-units, cents and basis points). */
export interface EditedLine {
  kind: "part" | "labour" | "fee";
  partId: string | null;
  sku: string | null;
  description: string;
  quantityMilli: number;
  unitPriceMinor: number;
  discountBp: number;
}

/** A stored line → what its editor loads (the page passes nothing else). */
export const editedLine = (l: EditedLine): EditedLine => ({
  kind: l.kind,
  partId: l.partId,
  sku: l.sku,
  description: l.description,
  quantityMilli: l.quantityMilli,
  unitPriceMinor: l.unitPriceMinor,
  discountBp: l.discountBp,
});

/** A line as typed: quantity, price and discount are the text in their inputs. */
export interface LineRow {
  kind: EditedLine["kind"];
  partId: string | null;
  sku: string | null;
  description: string;
  qty: string;
  price: string;
  discount: string;
}

/** The fields of a line an editor marks, in the order they stand (the first wrong is focused). */
export const LINE_FIELDS = ["description", "qty", "price", "discount"] as const;
export type LineField = (typeof LINE_FIELDS)[number];
/** The schema's names of a line's fields → the editor's. */
const FIELD_OF: Record<string, LineField> = {
  description: "description",
  quantityMilli: "qty",
  unitPriceMinor: "price",
  discountBp: "discount",
};

/** "lines.2.unitPriceMinor" (a field the server refused) → line 2's price; else undefined. */
export function serverLineField(path: string): { index: number; field: LineField } | undefined {
  const m = /^lines\.(\d+)\.(\w+)$/.exec(path);
  if (!m || !Object.hasOwn(FIELD_OF, m[2]!)) return undefined;
  return { index: Number(m[1]), field: FIELD_OF[m[2]!]! };
}

/** A line → its row, the numbers written as a person types them ("1.5", "120.00", "10"). */
export const lineRowOf = (l: EditedLine): LineRow => ({
  kind: l.kind,
  partId: l.partId,
  sku: l.sku,
  description: l.description,
  qty: formatScaled(l.quantityMilli, 3),
  price: minorToPlain(l.unitPriceMinor),
  discount: formatScaled(l.discountBp, 2),
});

/** A catalog part added to the lines: one of it at its price, no discount. */
export const partLineRow = (p: PricedPart): LineRow =>
  lineRowOf({
    kind: "part",
    partId: p.id,
    sku: p.sku,
    description: `${p.brand} ${p.name}`,
    quantityMilli: 1000,
    unitPriceMinor: p.priceMinor,
    discountBp: 0,
  });

/** What a row's typing reads as: null where it does not read (a blank discount is none). */
export const parseLineRow = (r: LineRow) => ({
  quantityMilli: parseScaled(r.qty, 3),
  unitPriceMinor: parseMoney(r.price),
  discountBp: r.discount.trim() === "" ? 0 : parseScaled(r.discount, 2),
});
export type ParsedLineRow = ReturnType<typeof parseLineRow>;

/**
 * The line a row stands for while it is typed: what does not read counts as 0 and a discount
 * above 100 % as 100 % (the totals shown live; a row without problems is exactly its line).
 */
export const draftLine = (r: LineRow, p: ParsedLineRow): EditedLine => ({
  kind: r.kind,
  partId: r.partId,
  sku: r.sku,
  description: r.description,
  quantityMilli: p.quantityMilli ?? 0,
  unitPriceMinor: p.unitPriceMinor ?? 0,
  discountBp: Math.min(p.discountBp ?? 0, 10000),
});

/** A row's own problems, field by field in order, with the limits the server keeps. */
export function lineIssues(
  r: LineRow,
  p: ParsedLineRow,
  limits: ReturnType<typeof quoteLimitMessages>,
): [LineField, string][] {
  const out: [LineField, string][] = [];
  if (!r.description.trim()) out.push(["description", "Describe the line"]);
  if (p.quantityMilli === null || p.quantityMilli === 0)
    out.push(["qty", `Above 0, up to 3 decimals, ${limits.quantity.toLowerCase()}`]);
  else if (quantityTooLarge(p.quantityMilli)) out.push(["qty", limits.quantity]);
  if (p.unitPriceMinor === null)
    out.push(["price", `A price like 12.50, ${limits.unitPrice.toLowerCase()}`]);
  else if (unitPriceTooLarge(p.unitPriceMinor)) out.push(["price", limits.unitPrice]);
  if (p.discountBp === null || p.discountBp > 10000) out.push(["discount", "From 0 to 100 %"]);
  return out;
}
