import { mulDivRound } from "./money";

export interface TotalsLine {
  quantityMilli: number;
  unitPriceMinor: number;
  discountBp: number;
}

export interface QuoteTotals {
  lines: { grossMinor: number; discountMinor: number; netMinor: number }[];
  subtotalMinor: number;
  discountMinor: number;
  taxMinor: number;
  totalMinor: number;
}

/**
 * Quote arithmetic in integer minor units. Each line: gross = quantity × unit price, rounded
 * half up to the cent; discount = gross × rate, rounded half up; net = gross − discount. Tax
 * is charged once on the sum of the nets (not per line), rounded half up. Total = nets + tax.
 */
export function quoteTotals(lines: TotalsLine[], taxRateBp: number): QuoteTotals {
  const out = lines.map((l) => {
    const grossMinor = mulDivRound(l.quantityMilli, l.unitPriceMinor, 1000);
    const discountMinor = mulDivRound(grossMinor, l.discountBp, 10000);
    return { grossMinor, discountMinor, netMinor: grossMinor - discountMinor };
  });
  const subtotalMinor = out.reduce((s, l) => s + l.grossMinor, 0);
  const discountMinor = out.reduce((s, l) => s + l.discountMinor, 0);
  const net = subtotalMinor - discountMinor;
  const taxMinor = mulDivRound(net, taxRateBp, 10000);
  return { lines: out, subtotalMinor, discountMinor, taxMinor, totalMinor: net + taxMinor };
}
