/**
 * Money in integer minor units (cents). No floating-point arithmetic touches an amount: parsing
 * reads the digits, rounding is integer half-up (away from zero for the positive amounts here).
 */

/** "1,234.5" → 123450; null when it is not an amount with at most two decimals. */
export function parseMoney(text: string): number | null {
  const s = text
    .trim()
    .replace(/^[$€£]/, "")
    .replace(/,(?=\d{3}(\D|$))/g, "");
  const m = /^(\d{1,9})(?:\.(\d{1,2}))?$/.exec(s);
  if (!m) return null;
  return Number(m[1]) * 100 + Number((m[2] ?? "").padEnd(2, "0"));
}

/** 123450 → "1234.50" (for CSV and inputs). */
export function minorToPlain(minor: number): string {
  const sign = minor < 0 ? "-" : "";
  const a = Math.abs(minor);
  return `${sign}${Math.floor(a / 100)}.${String(a % 100).padStart(2, "0")}`;
}

/** 123450, "USD" → "$1,234.50" in the viewer's locale conventions (en-US here). */
export function formatMoney(minor: number, currency: string): string {
  return new Intl.NumberFormat("en-US", { style: "currency", currency }).format(minor / 100);
}

/** a × b / d for non-negative integers, rounded half up, exact with BigInt. */
export function mulDivRound(a: number, b: number, d: number): number {
  const n = BigInt(a) * BigInt(b);
  const D = BigInt(d);
  return Number((n * 2n + D) / (2n * D));
}

/** "1.5", 3 → 1500: a non-negative decimal as an integer of 10^-decimals; null when not one. */
export function parseScaled(text: string, decimals: number): number | null {
  const m = new RegExp(`^(\\d{1,9})(?:[.,](\\d{1,${decimals}}))?$`).exec(text.trim());
  if (!m) return null;
  return Number(m[1]) * 10 ** decimals + Number((m[2] ?? "").padEnd(decimals, "0"));
}
/** 1500, 3 → "1.5" */
export function formatScaled(value: number, decimals: number): string {
  const s = (value / 10 ** decimals).toFixed(decimals);
  return decimals ? s.replace(/\.?0+$/, "") : s;
}
