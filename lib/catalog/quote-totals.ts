import { mulDivRound } from "./money";

export interface TotalsLine {
  quantityMilli: number;
  unitPriceMinor: number;
  discountBp: number;
}

export interface QuoteTotals {
  lines: { grossMinor: number; discountMinor: number; netMinor: number }[];
  /** Before discounts: the sum of quantity × unit price (what the column bound is checked on). */
  grossMinor: number;
  /** The sum of the lines' discounts (already taken off each line's total). */
  discountMinor: number;
  /** After discounts: the sum of the line totals, the figure tax is charged on. */
  subtotalMinor: number;
  taxMinor: number;
  totalMinor: number;
}

/**
 * Quote arithmetic in integer minor units. Each line: gross = quantity × unit price, rounded
 * half up to the cent; discount = gross × rate, rounded half up; line total (net) = gross −
 * discount. The subtotal is the sum of the line totals — after discounts, so nothing is taken
 * off twice. Tax is charged once on the subtotal (not per line), rounded half up. Total =
 * subtotal + tax.
 *
 * @example quoteTotals([{ quantityMilli: 2000, unitPriceMinor: 5000, discountBp: 1000 }], 1000)
 * // → subtotal 90.00 (100.00 less 10.00), tax 9.00, total 99.00 (in cents)
 */
export function quoteTotals(lines: TotalsLine[], taxRateBp: number): QuoteTotals {
  const out = lines.map((l) => {
    const grossMinor = mulDivRound(l.quantityMilli, l.unitPriceMinor, 1000);
    const discountMinor = mulDivRound(grossMinor, l.discountBp, 10000);
    return { grossMinor, discountMinor, netMinor: grossMinor - discountMinor };
  });
  const grossMinor = out.reduce((s, l) => s + l.grossMinor, 0);
  const discountMinor = out.reduce((s, l) => s + l.discountMinor, 0);
  const subtotalMinor = grossMinor - discountMinor;
  const taxMinor = mulDivRound(subtotalMinor, taxRateBp, 10000);
  return {
    lines: out,
    grossMinor,
    discountMinor,
    subtotalMinor,
    taxMinor,
    totalMinor: subtotalMinor + taxMinor,
  };
}
