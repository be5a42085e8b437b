/**
 * Countries a shop or a customer may be in (ISO 3166-1 alpha-2), and what each calls the tax
 * number a business customer gives: only countries with a general VAT/GST registration number
 * printed on invoices have one here (the United States has none).
 */

/** What the customer's tax number is called, by country; absent: the country uses none. */
export const TAX_ID_LABELS: Readonly<Record<string, string>> = {
  AT: "VAT number", BE: "VAT number", BG: "VAT number", CY: "VAT number", CZ: "VAT number",
  DE: "VAT number", DK: "VAT number", EE: "VAT number", ES: "VAT number", FI: "VAT number",
  FR: "VAT number", GR: "VAT number", HR: "VAT number", HU: "VAT number", IE: "VAT number",
  IT: "VAT number", LT: "VAT number", LU: "VAT number", LV: "VAT number", MT: "VAT number",
  NL: "VAT number", PL: "VAT number", PT: "VAT number", RO: "VAT number", SE: "VAT number",
  SI: "VAT number", SK: "VAT number", GB: "VAT number", NO: "VAT number", CH: "VAT number",
  AU: "ABN", NZ: "GST number", CA: "GST/HST number", ZA: "VAT number", IN: "GSTIN",
  SG: "GST registration number", MX: "RFC", BR: "CNPJ / CPF", JP: "Invoice registration number",
}; // prettier-ignore

/** The label of the customer tax number in `country`, or null where none is used. */
export const taxIdLabel = (country: string): string | null => TAX_ID_LABELS[country] ?? null;

/** Is this a two-letter country code we know a name for? */
export function isCountryCode(code: string): boolean {
  if (!/^[A-Z]{2}$/.test(code)) return false;
  const name = countryName(code);
  return name !== code && name !== "Unknown Region";
}

let names: Intl.DisplayNames | undefined;
/** The country's English name (the code itself when unknown). */
export function countryName(code: string): string {
  names ??= new Intl.DisplayNames(["en"], { type: "region", fallback: "code" });
  try {
    return names.of(code) ?? code;
  } catch {
    return code;
  }
}
