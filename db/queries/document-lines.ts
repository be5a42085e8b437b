/**
 * What quotes and invoices share about their lines (db/queries/quotes.ts, invoices.ts and the
 * quote commands' "nothing changed" check): when a sent list of lines equals the stored one, and
 * the totals columns a document keeps from its lines' sums. Their numbers come from the one
 * per-shop counter (`counters.ts#nextShopNumber`).
 */

/** A charge line as it is compared: what a person edits, in the stored shape. */
export interface ComparedLine {
  kind: string;
  partId?: string | null;
  sku?: string | null;
  description: string;
  quantityMilli: number;
  unitPriceMinor: number;
  discountBp: number;
}

const lineKey = (l: ComparedLine) =>
  JSON.stringify([
    l.kind,
    l.partId ?? null,
    l.sku ?? null,
    l.description,
    l.quantityMilli,
    l.unitPriceMinor,
    l.discountBp,
  ]);

/** Are these the stored lines, in the same order (so nothing needs writing)? */
export const sameLines = (stored: readonly ComparedLine[], sent: readonly ComparedLine[]) =>
  stored.length === sent.length && stored.every((s, i) => lineKey(s) === lineKey(sent[i]!));

/** The totals columns a quote or an invoice stores, from its lines' sums (`quoteTotals`, `invoiceTotals`). */
export const totalColumns = (t: {
  subtotalMinor: number;
  discountMinor: number;
  taxMinor: number;
  totalMinor: number;
}) => ({
  subtotalMinor: t.subtotalMinor,
  discountMinor: t.discountMinor,
  taxMinor: t.taxMinor,
  totalMinor: t.totalMinor,
});
