import {
  getCountries,
  isSupportedCountry,
  parsePhoneNumberFromString,
  type CountryCode,
} from "libphonenumber-js/max";

import { countryName } from "@/lib/domain/countries";

/**
 * Phone numbers through libphonenumber-js: stored as E.164 (`+12015550188`), read with the shop's
 * country as the default (so a local spelling works), shown in that country's own format (or
 * internationally for a number from elsewhere), and found however they are typed.
 */

const asCountry = (c: string | null | undefined): CountryCode =>
  c && isSupportedCountry(c) ? c : "US";

/** E.164 of a stored value, when it is one. */
export const isE164 = (v: string) => /^\+[1-9]\d{6,14}$/.test(v);

export type PhoneReading = { ok: true; e164: string } | { ok: false; message: string };

/**
 * Reads a phone number as typed, with `country` as the default for one without `+`.
 * @example readPhone("(201) 555-0188", "US") // { ok: true, e164: "+12015550188" }
 */
export function readPhone(typed: string, country: string): PhoneReading {
  const p = parsePhoneNumberFromString(typed, asCountry(country));
  if (p?.isPossible()) return { ok: true, e164: p.number };
  return {
    ok: false,
    message: `Enter the whole number with its area code (a number from outside ${countryName(asCountry(country))} starts with + and its country code)`,
  };
}

/**
 * A stored number as people read it: national format for the shop's country, international
 * otherwise; a value stored before numbers were read (not E.164) as it was typed.
 * @example formatPhone("+12015550188", "US") // "(201) 555-0188"
 */
export function formatPhone(stored: string | null | undefined, shopCountry: string): string {
  if (!stored) return "";
  if (!isE164(stored)) return stored;
  const p = parsePhoneNumberFromString(stored);
  if (!p) return stored;
  return p.country === asCountry(shopCountry) ? p.formatNational() : p.formatInternational();
}

/**
 * The digit runs a search for `q` should look for in stored numbers (their digits), or none when
 * `q` does not look like (part of) a phone number: only digits, spaces, `+()-./`, at least 4
 * digits. Besides the digits as typed, the national number libphonenumber reads from them, so
 * "+1 555 0188" and "1 (201) 555-0188" find "+12015550188".
 * @example phoneSearchDigits("+1 555 0188", "US") // ["15550188", "5550188"]
 */
export function phoneSearchDigits(q: string, country: string): string[] {
  if (!/^[\d\s()+\-./]+$/.test(q)) return [];
  const digits = q.replace(/\D/g, "");
  if (digits.length < 4) return [];
  const out = new Set([digits]);
  const p = parsePhoneNumberFromString(q, asCountry(country));
  if (p && p.nationalNumber.length >= 4) out.add(p.nationalNumber);
  return [...out];
}

/** Every country libphonenumber knows, with its English name, sorted by name (for selects). */
export function countryOptions(): { code: string; name: string }[] {
  return getCountries()
    .map((code) => ({ code, name: countryName(code) }))
    .sort((a, b) => a.name.localeCompare(b.name, "en"));
}
