import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { z, type ZodType } from "zod";

import { VolumeToAddSchema } from "@/lib/calc";
import { volumeToAddIssues } from "@/lib/calc/blend-bounds";
import { ForgotPasswordSchema, ResetPasswordSchema, SignInSchema } from "@/lib/validations/auth";
import { CustomerSchema } from "@/lib/validations/customers";
import {
  customerMessages,
  EMAIL_PATTERN,
  forgotPasswordMessages,
  resetPasswordMessages,
  signInMessages,
} from "@/lib/validations/form-checks";

/**
 * The browser's plain checks (no schema library) against the schemas the server parses with:
 * for any input, each field gets the message the schema gives first for it — what
 * `zodResolver` showed before — or none. Common practice, no source: the schemas are the truth.
 */
function schemaMessages(schema: ZodType, values: unknown): Record<string, string> {
  const r = schema.safeParse(values);
  const out: Record<string, string> = {};
  if (r.success) return out;
  for (const i of r.error.issues) {
    const k = String(i.path[0]);
    out[k] ??= i.message;
  }
  return out;
}

/** Text around a length limit, padded, in mixed case, or an address (good or nearly). */
const textNear = (max: number) =>
  fc.oneof(
    fc.string({ maxLength: 6 }),
    fc.constantFrom("", " ", "  \t", "\n"),
    fc.string({ minLength: Math.max(0, max - 2), maxLength: max + 2 }),
    fc
      .tuple(fc.constantFrom("", " ", "  "), fc.string({ minLength: max - 1, maxLength: max + 1 }))
      .map(([pad, s]) => pad + s + pad),
  );
const emailish = fc.oneof(
  fc.emailAddress(),
  fc.emailAddress().map((e) => ` ${e.toUpperCase()} `),
  fc.emailAddress().map((e) => e.replace("@", "")),
  fc.emailAddress().map((e) => `${e}.`),
  fc.constantFrom(
    "a@b",
    "a@b.c",
    "a..b@example.com",
    ".a@example.com",
    "a@-b.com",
    "Ünï@example.com",
  ),
  fc.string({ maxLength: 12 }).map((s) => `${s}@example.org`),
  fc.string({ minLength: 190, maxLength: 205 }).map((s) => `${s.replace(/\W/g, "a")}@example.org`),
);

describe("the browser's form checks say what the schemas say", () => {
  it("uses zod's own e-mail pattern", () => {
    expect(EMAIL_PATTERN.source).toBe(z.regexes.email.source);
    expect(EMAIL_PATTERN.flags).toBe(z.regexes.email.flags);
  });

  it("sign in", () => {
    fc.assert(
      fc.property(emailish, textNear(128), (email, password) => {
        const v = { email, password };
        expect(signInMessages(v)).toEqual(schemaMessages(SignInSchema, v));
      }),
      { numRuns: 400 },
    );
    expect(signInMessages({ email: "", password: "" })).toEqual({
      email: "Enter a valid e-mail address",
      password: "Enter your password",
    });
  });

  it("forgot and reset password", () => {
    fc.assert(
      fc.property(emailish, fc.string({ maxLength: 3 }), textNear(128), (email, token, pw) => {
        expect(forgotPasswordMessages({ email })).toEqual(
          schemaMessages(ForgotPasswordSchema, { email }),
        );
        for (const password of [pw, pw.slice(0, 10), pw.slice(0, 9)]) {
          const v = { token, password };
          expect(resetPasswordMessages(v)).toEqual(schemaMessages(ResetPasswordSchema, v));
        }
      }),
      { numRuns: 300 },
    );
  });

  it("customer", () => {
    const country = fc.oneof(
      fc.constantFrom("", " ", "DE", "de", " gb ", "US", "XX", "ZZ", "U1", "usa", "Ü", "EU"),
      fc.string({ maxLength: 4 }),
    );
    fc.assert(
      fc.property(
        fc.record({
          name: textNear(120),
          email: fc.oneof(emailish, fc.constantFrom("", "  "), textNear(200)),
          phone: textNear(40),
          notes: fc.oneof(fc.string({ maxLength: 20 }), textNear(2000)),
          addressLine1: textNear(120),
          addressLine2: textNear(120),
          city: textNear(80),
          region: textNear(80),
          postcode: textNear(20),
          country,
          taxId: textNear(40),
        }),
        (v) => {
          expect(customerMessages(v)).toEqual(schemaMessages(CustomerSchema, v));
        },
      ),
      { numRuns: 300 },
    );
  });

  it("blend mixer", () => {
    const figure = fc.oneof(
      fc.constant(undefined),
      fc.constantFrom(Number.NaN, Infinity, -Infinity, 0, 0.1, 0.05, 100, 100.01, 100000, 100001),
      fc.double({ min: -10, max: 110, noNaN: true }),
      fc.double({ min: -1e6, max: 1e6, noNaN: true }),
    );
    fc.assert(
      fc.property(
        fc.record({
          tankVolumeL: figure,
          tankEthanolVolPct: figure,
          addedEthanolVolPct: figure,
          targetEthanolVolPct: figure,
          tankCapacityL: figure,
        }),
        (q) => {
          expect(volumeToAddIssues(q)).toEqual(schemaMessages(VolumeToAddSchema, q));
        },
      ),
      { numRuns: 400 },
    );
    expect(volumeToAddIssues({ tankEthanolVolPct: 120 })).toMatchObject({
      tankVolumeL: "Fuel in the tank is required",
      tankEthanolVolPct: "Ethanol content in the tank must be between 0 and 100 %",
    });
  });
});
