import { formatValue } from "@/lib/calc/quantities";
import { formatMoney, formatScaled } from "@/lib/catalog/money";
import { quoteTotals, type TotalsLine } from "@/lib/catalog/quote-totals";

/**
 * How a quote reads, wherever it is read: the shop's quote page, the quote PDF, the customer's
 * portal and the e-mail all render what `presentQuote` returns, so a discount is shown one way
 * everywhere — each line's price, its discount (rate and amount) and its total after the
 * discount; the subtotal is the sum of those line totals (after discounts, nothing taken off
 * twice); tax once on the subtotal; the total.
 */

export interface PresentableLine extends TotalsLine {
  kind: "part" | "labour" | "fee";
  sku: string | null;
  description: string;
}

export interface PresentedLine {
  kind: PresentableLine["kind"];
  sku: string | null;
  description: string;
  /** "1.5 h" for labour (through the quantity registry), "2" pieces (up to three decimals). */
  quantity: string;
  /** "$120.00" a unit. */
  unitPrice: string;
  /** "10 %", or null without a discount. */
  discountRate: string | null;
  /** "−$18.00" taken off this line, or null without a discount. */
  discountAmount: string | null;
  /** The discount column as one phrase: "10 % (−$18.00)", or "—". */
  discount: string;
  /** After the line's discount: "$162.00". */
  lineTotal: string;
}

export interface PresentedQuote {
  currency: string;
  lines: PresentedLine[];
  /** After discounts: the sum of the line totals. */
  subtotal: string;
  /** "Includes discounts of $18.00" (already in the line totals), or null without any. */
  discountNote: string | null;
  /** "Tax (8.25 %)". */
  taxLabel: string;
  tax: string;
  total: string;
  /** The minor-unit figures behind the text, for anything that must compare or sum them. */
  minor: { subtotal: number; discount: number; tax: number; total: number };
}

/** A rate in basis points as a person reads it: 1000 → "10 %", 825 → "8.25 %", 1250 → "12.5 %". */
export function formatRateBp(bp: number): string {
  const decimals = bp % 100 === 0 ? 0 : bp % 10 === 0 ? 1 : 2;
  // Rates are the same in both unit systems.
  return formatValue("percent", bp / 100, "metric", decimals);
}

/** A quantity in thousandths as shown on a quote: 1500 → "1.5". */
export const formatQuoteQuantity = (quantityMilli: number) => formatScaled(quantityMilli, 3);

/**
 * A line's quantity with its unit where it has one: labour in hours through the quantity
 * registry with the decimals it has (1500 → "1.5 h", 2000 → "2 h"); parts and fees as counts.
 */
export function formatLineQuantity(kind: PresentableLine["kind"], quantityMilli: number): string {
  if (kind !== "labour") return formatQuoteQuantity(quantityMilli);
  const decimals =
    quantityMilli % 1000 === 0
      ? 0
      : quantityMilli % 100 === 0
        ? 1
        : quantityMilli % 10 === 0
          ? 2
          : 3;
  // Hours are the same in both unit systems.
  return formatValue("hours", quantityMilli / 1000, "metric", decimals);
}

/** Money taken off, with a true minus sign: 1800 → "−$18.00". */
export const formatDeduction = (minor: number, currency: string) =>
  `−${formatMoney(minor, currency)}`;

/**
 * The quote as every surface shows it.
 *
 * @example presentQuote({ currency: "USD", taxRateBp: 1000 }, [
 *   { kind: "labour", sku: null, description: "Fitting", quantityMilli: 1500,
 *     unitPriceMinor: 12000, discountBp: 1000 } ])
 * // → line: 1.5 × $120.00, "10 % (−$18.00)", $162.00; subtotal $162.00, tax $16.20, total $178.20
 */
export function presentQuote(
  quote: { currency: string; taxRateBp: number },
  lines: readonly PresentableLine[],
): PresentedQuote {
  const money = (m: number) => formatMoney(m, quote.currency);
  const t = quoteTotals([...lines], quote.taxRateBp);
  return {
    currency: quote.currency,
    lines: lines.map((l, i) => {
      const figures = t.lines[i]!;
      const rate = l.discountBp ? formatRateBp(l.discountBp) : null;
      const amount = l.discountBp ? formatDeduction(figures.discountMinor, quote.currency) : null;
      return {
        kind: l.kind,
        sku: l.sku,
        description: l.description,
        quantity: formatLineQuantity(l.kind, l.quantityMilli),
        unitPrice: money(l.unitPriceMinor),
        discountRate: rate,
        discountAmount: amount,
        discount: rate ? `${rate} (${amount})` : "—",
        lineTotal: money(figures.netMinor),
      };
    }),
    subtotal: money(t.subtotalMinor),
    discountNote: t.discountMinor ? `Includes discounts of ${money(t.discountMinor)}` : null,
    taxLabel: `Tax (${formatRateBp(quote.taxRateBp)})`,
    tax: money(t.taxMinor),
    total: money(t.totalMinor),
    minor: {
      subtotal: t.subtotalMinor,
      discount: t.discountMinor,
      tax: t.taxMinor,
      total: t.totalMinor,
    },
  };
}
