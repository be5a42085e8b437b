// Reference: docs/calculations.md §8.

/**
 * A number as a person types it into a field, read the same by every number field (the build
 * editor, the goal and settings forms, the tools): digits with a decimal point or a decimal
 * comma ("7.5", "7,5"), thousands separators ("7,000", "7 000", "1,234.5", "1.234,5") and
 * exponents ("1e5"). Anything else is NaN, which the schemas call "not a number". A number too
 * large to hold ("1e400") is Infinity, which the schemas call out of range with their limits.
 */
export function parseNumberText(text: string): number {
  // Spaces (also no-break and thin ones) and apostrophes between digits group thousands.
  let s = text.trim().replace(/(?<=\d)[\s\u00a0\u202f'](?=\d{3}(\D|$))/g, "");
  if (/^[+-]?[1-9]\d{0,2}(,\d{3})+(\.\d+)?$/.test(s)) s = s.replace(/,/g, "");
  else if (/^[+-]?[1-9]\d{0,2}(\.\d{3})+,\d+$/.test(s)) s = s.replace(/\./g, "").replace(",", ".");
  else if (/^[+-]?\d*,\d+$/.test(s)) s = s.replace(",", ".");
  return /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(s) ? Number(s) : NaN;
}

/** A field's text as a number, blank as no number (undefined); numbers pass as they are. */
export const numberFromField = (v: unknown): unknown =>
  typeof v === "string" ? (v.trim() === "" ? undefined : parseNumberText(v)) : v;
