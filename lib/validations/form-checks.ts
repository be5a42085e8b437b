/*
 * The browser's checks for the sign-in, password and customer forms, without the schema library
 * (31.7 KiB gzipped in each of those pages; `npm run bench:bundle`). The server still parses
 * every submission with the zod schemas (`auth.ts`, `customers.ts`), which stay the one truth:
 * these give the same message for the same text, field by field — the first message the schema
 * gives for that field — and `tests/unit/form-checks.test.ts` holds them to it with generated
 * input. A change to one of those schemas needs the same change here.
 */
import { isCountryCode } from "@/lib/domain/countries";

/** Field name → its message; a field without one is fine. */
export type FieldMessages<K extends string> = Partial<Record<K, string>>;

/** zod's e-mail pattern (`z.regexes.email`, which `z.email()` checks; a unit test compares them). */
export const EMAIL_PATTERN =
  /^(?:[A-Za-z0-9_'+\-]+\.)*[A-Za-z0-9_'+\-]*[A-Za-z0-9_+-]@(?:[A-Za-z0-9][A-Za-z0-9\-]*\.)+[A-Za-z]{2,}$/;

/** zod's own wording for a string over its `.max(n)` when the schema gives no message. */
const tooLong = (max: number) => `Too big: expected string to have <=${max} characters`;

/** `auth.ts#EmailSchema`: trimmed, lower-cased, an address. */
function email(v: string | undefined): string | undefined {
  return EMAIL_PATTERN.test((v ?? "").trim().toLowerCase())
    ? undefined
    : "Enter a valid e-mail address";
}

/** `auth.ts#PasswordSchema`. */
function password(v: string): string | undefined {
  if (v.length < 10) return "Use at least 10 characters";
  if (v.length > 128) return "Use at most 128 characters";
  return undefined;
}

const only = <K extends string>(o: Record<K, string | undefined>): FieldMessages<K> =>
  Object.fromEntries(Object.entries(o).filter(([, m]) => m !== undefined)) as FieldMessages<K>;

/** `auth.ts#SignInSchema`. */
export function signInMessages(v: { email: string; password: string }) {
  return only({
    email: email(v.email),
    password:
      v.password.length < 1
        ? "Enter your password"
        : v.password.length > 128
          ? tooLong(128)
          : undefined,
  });
}

/** `auth.ts#ForgotPasswordSchema`. */
export function forgotPasswordMessages(v: { email: string }) {
  return only({ email: email(v.email) });
}

/** `auth.ts#ResetPasswordSchema`. */
export function resetPasswordMessages(v: { token: string; password: string }) {
  return only({
    token: v.token.length < 1 ? "The reset link is incomplete" : undefined,
    password: password(v.password),
  });
}

/** What the customer form's fields hold (all text, as typed). */
export interface CustomerFormValues {
  name: string;
  email: string;
  phone: string;
  notes: string;
  addressLine1: string;
  addressLine2: string;
  city: string;
  region: string;
  postcode: string;
  country: string;
  taxId: string;
}

const optionalText = (v: string | undefined, max: number, label: string) =>
  (v ?? "").trim().length > max ? `${label} is too long (at most ${max} characters)` : undefined;

/** `customers.ts#CustomerSchema`. */
export function customerMessages(v: CustomerFormValues) {
  const name = (v.name ?? "").trim();
  const mail = (v.email ?? "").trim();
  const country = (v.country ?? "").trim();
  return only({
    name:
      name.length < 1
        ? "Enter the customer's name"
        : name.length > 120
          ? "Name is too long (at most 120 characters)"
          : undefined,
    email:
      mail.length > 200
        ? tooLong(200)
        : mail && !EMAIL_PATTERN.test(mail.toLowerCase())
          ? "Enter a valid e-mail address"
          : undefined,
    phone: optionalText(v.phone, 40, "Phone"),
    notes: optionalText(v.notes, 2000, "Notes"),
    addressLine1: optionalText(v.addressLine1, 120, "Address"),
    addressLine2: optionalText(v.addressLine2, 120, "Address line 2"),
    city: optionalText(v.city, 80, "City"),
    region: optionalText(v.region, 80, "State or region"),
    postcode: optionalText(v.postcode, 20, "Postcode"),
    country:
      country.length > 2 || (country !== "" && !isCountryCode(country.toUpperCase()))
        ? "Choose a country"
        : undefined,
    taxId: optionalText(v.taxId, 40, "Tax number"),
  });
}
