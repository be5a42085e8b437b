/**
 * Vehicle identification numbers (ISO 3779; the check digit of 49 CFR 565.15). A VIN of 1981
 * on is 17 characters of digits and capitals without I, O and Q; one made for North America
 * (first character 1–5) carries a check digit in position 9. Older vehicles carry shorter,
 * maker-specific numbers: 5 to 17 letters and digits.
 */

const TRANSLITERATION: Record<string, number> = {
  A: 1, B: 2, C: 3, D: 4, E: 5, F: 6, G: 7, H: 8,
  J: 1, K: 2, L: 3, M: 4, N: 5, P: 7, R: 9,
  S: 2, T: 3, U: 4, V: 5, W: 6, X: 7, Y: 8, Z: 9,
}; // prettier-ignore
const WEIGHTS = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2];

/** The year from which VINs are the 17-character standard. */
export const VIN_STANDARD_FROM_YEAR = 1981;

/** Spaces and dashes dropped, upper case (what is stored). */
export const normaliseVin = (v: string) => v.replace(/[\s-]/g, "").toUpperCase();

/**
 * The check digit a 17-character VIN should carry in position 9 ("0"–"9" or "X").
 * @example vinCheckDigit("1M8GDM9AXKP042788") // "X"
 */
export function vinCheckDigit(vin: string): string {
  let sum = 0;
  for (let i = 0; i < 17; i++) {
    const c = vin[i]!;
    const value = /\d/.test(c) ? Number(c) : (TRANSLITERATION[c] ?? 0);
    sum += value * WEIGHTS[i]!;
  }
  const r = sum % 11;
  return r === 10 ? "X" : String(r);
}

/**
 * What is wrong with a (normalised) VIN for a vehicle of `year`, or null when it is right.
 * @example vinProblem("1M8GDM9AXKP042788", 1989) // null
 */
export function vinProblem(vin: string, year?: number): string | null {
  if (year !== undefined && year < VIN_STANDARD_FROM_YEAR)
    return /^[A-Z0-9]{5,17}$/.test(vin) ? null : "A VIN before 1981 is 5 to 17 letters and digits";
  if (vin.length !== 17) return `A VIN has 17 characters (this one has ${vin.length})`;
  if (/[IOQ]/.test(vin)) return "A VIN never has the letters I, O or Q";
  if (!/^[A-HJ-NPR-Z0-9]{17}$/.test(vin)) return "A VIN has only letters and digits";
  if (/^[1-5]/.test(vin) && vin[8] !== vinCheckDigit(vin))
    return "That VIN's check digit (the 9th character) does not match: check it for a typo";
  return null;
}
