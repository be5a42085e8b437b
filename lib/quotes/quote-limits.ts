import { formatMoney } from "@/lib/catalog/money";
import { quoteTotals, type TotalsLine } from "@/lib/catalog/quote-totals";
import {
  QUOTE_LINE_PRICE_MAX_MINOR,
  QUOTE_LINE_QTY_MAX_MILLI,
  QUOTE_SUBTOTAL_MAX_MINOR,
} from "@/lib/validations/column-limits";

/**
 * What one quote holds, said the way a person reads it: the limits of a line's quantity and
 * unit price (field messages in the editor) and of the lines' sum (the commands' and the
 * editor's message), money in the quote's currency. Pure: the editor and the commands share it.
 */
export function quoteLimitMessages(currency: string) {
  return {
    quantity: `At most ${new Intl.NumberFormat("en-US").format(QUOTE_LINE_QTY_MAX_MILLI / 1000)}`,
    unitPrice: `At most ${formatMoney(QUOTE_LINE_PRICE_MAX_MINOR, currency)}`,
    subtotal: (what = "The lines add up") =>
      `${what} to more than ${formatMoney(QUOTE_SUBTOTAL_MAX_MINOR, currency)}, the most one quote can hold`,
  };
}

/** A line's quantity (thousandths) past the largest one line takes. */
export const quantityTooLarge = (quantityMilli: number) => quantityMilli > QUOTE_LINE_QTY_MAX_MILLI;
/** A line's unit price (cents) past the largest one line takes. */
export const unitPriceTooLarge = (unitPriceMinor: number) =>
  unitPriceMinor > QUOTE_LINE_PRICE_MAX_MINOR;

/**
 * Lines that add up to more than one quote holds (before discounts: what the column bound is
 * checked on) → the message naming the limit in `currency`; else null.
 */
export function quoteSizeIssue(
  lines: TotalsLine[],
  currency: string,
  what?: string,
): string | null {
  return quoteTotals(lines, 0).grossMinor > QUOTE_SUBTOTAL_MAX_MINOR
    ? quoteLimitMessages(currency).subtotal(what)
    : null;
}
