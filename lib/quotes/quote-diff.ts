import { presentQuote, type PresentableLine, type PresentedLine } from "./quote-presentation";

/**
 * What changed between the revision the customer saw and a newer one: lines added, removed and
 * changed (quantity, unit price, discount, line total), and the totals — each figure as every
 * surface prints it (lib/quotes/quote-presentation.ts).
 */

export interface DiffLine extends PresentableLine {
  partId: string | null;
}

export interface FieldChange {
  field: "Description" | "Qty" | "Unit price" | "Discount" | "Line total";
  before: string;
  after: string;
}

export interface QuoteDiff {
  added: PresentedLine[];
  removed: PresentedLine[];
  changed: { description: string; sku: string | null; changes: FieldChange[] }[];
  totals: { label: string; before: string; after: string }[];
  /** Nothing a customer reads differs. */
  same: boolean;
}

/** Lines are the same line when they name the same part, else the same kind and description. */
const identity = (l: DiffLine) =>
  l.partId ? `part:${l.partId}` : `${l.kind}:${l.description.trim().toLowerCase()}`;

const FIELDS: [FieldChange["field"], (l: PresentedLine) => string][] = [
  ["Description", (l) => l.description],
  ["Qty", (l) => l.quantity],
  ["Unit price", (l) => l.unitPrice],
  ["Discount", (l) => l.discount],
  ["Line total", (l) => l.lineTotal],
];

/**
 * @example diffQuotes(quote, [injector × 6], [injector × 8, labour])
 * // → changed: injector Qty 6 → 8 and its line total; added: labour; totals before → after
 */
export function diffQuotes(
  quote: { currency: string; taxRateBp: number },
  before: readonly DiffLine[],
  after: readonly DiffLine[],
): QuoteDiff {
  const a = presentQuote(quote, before);
  const b = presentQuote(quote, after);
  // Pair each new line with the first unpaired old line of the same identity, in order.
  const pool = new Map<string, number[]>();
  before.forEach((l, i) => pool.set(identity(l), [...(pool.get(identity(l)) ?? []), i]));
  const paired = new Set<number>();
  const added: PresentedLine[] = [];
  const changed: QuoteDiff["changed"] = [];
  after.forEach((l, j) => {
    const i = pool.get(identity(l))?.shift();
    if (i === undefined) {
      added.push(b.lines[j]!);
      return;
    }
    paired.add(i);
    const changes = FIELDS.flatMap(([field, get]) => {
      const x = get(a.lines[i]!);
      const y = get(b.lines[j]!);
      return x === y ? [] : [{ field, before: x, after: y }];
    });
    if (changes.length) changed.push({ description: l.description, sku: l.sku, changes });
  });
  const removed = a.lines.filter((_, i) => !paired.has(i));
  const totals = (
    [
      ["Subtotal", a.subtotal, b.subtotal],
      [a.taxLabel === b.taxLabel ? a.taxLabel : "Tax", a.tax, b.tax],
      ["Total", a.total, b.total],
    ] as const
  )
    .filter(([, x, y]) => x !== y)
    .map(([label, x, y]) => ({ label, before: x, after: y }));
  return {
    added,
    removed,
    changed,
    totals,
    same: !added.length && !removed.length && !changed.length && !totals.length,
  };
}
