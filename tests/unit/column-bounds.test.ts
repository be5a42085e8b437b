import { describe, expect, it } from "vitest";

import { fieldErrorsOf } from "@/lib/actions/state";
import { quoteLimitMessages, quoteSizeIssue } from "@/lib/quotes/quote-limits";
import {
  calendarDate,
  DATE_MAX,
  DATE_MIN,
  INT4_MAX,
  versionNumber,
  versionParam,
} from "@/lib/validations/column-bounds";
import { CustomerListQuery } from "@/lib/validations/customers";
import { PartFieldsSchema } from "@/lib/validations/parts";
import { QuoteFieldsSchema } from "@/lib/validations/quotes";

// PostgreSQL's `integer` is a 4-byte signed whole number: −2 147 483 648 to +2 147 483 647
// (PostgreSQL 15 documentation, §8.1.1 "Integer Types", table 8.2).
describe("numbers the schemas accept fit the integer columns", () => {
  it("INT4_MAX is PostgreSQL's integer maximum", () => expect(INT4_MAX).toBe(2 ** 31 - 1));

  it("a version of 2^31 is refused, 2^31 − 1 accepted, in bodies and in query strings", () => {
    expect(versionNumber().safeParse(2 ** 31).success).toBe(false);
    expect(versionNumber().safeParse(2 ** 31 - 1).success).toBe(true);
    expect(versionParam().safeParse("2147483648").success).toBe(false);
    expect(versionParam().safeParse("7").data).toBe(7);
  });

  const part = (price: string) =>
    PartFieldsSchema.safeParse({ sku: "X-1", category: "other", brand: "B", name: "N", price });

  it("a part priced 21 474 836.48 or more is a field error on price; 21 474 836.47 is not", () => {
    const big = part("21474836.48");
    expect(big.success).toBe(false);
    expect(big.error?.issues.map((i) => i.path.join("."))).toContain("price");
    expect(part("21474836.47").error?.issues.map((i) => i.path.join(".")) ?? []).not.toContain(
      "price",
    );
  });

  const line = (quantityMilli: number, unitPriceMinor: number) => ({
    kind: "part" as const,
    description: "Injector",
    quantityMilli,
    unitPriceMinor,
    discountBp: 0,
  });

  it("quote lines whose sum cannot be stored are refused, each line alone being valid, the limit said as money", () => {
    // 100 000 × 1 000 000.00: both within their own limits, the product is not.
    const big = [line(100_000_000, 100_000_000)];
    expect(QuoteFieldsSchema.shape.lines.safeParse(big).success).toBe(true);
    // Half of PostgreSQL's integer maximum in cents: 1 073 741 823 → $10,737,418.23.
    expect(quoteSizeIssue(big, "USD")).toBe(
      "The lines add up to more than $10,737,418.23, the most one quote can hold",
    );
    expect(quoteSizeIssue(big, "EUR")).toMatch(/more than €10,737,418\.23/);
    expect(quoteSizeIssue([line(2_000, 34_900)], "USD")).toBeNull();
  });

  it("a line past 100 000 units or 1 000 000.00 a unit is refused on that line's field", () => {
    const lines = [line(1_000, 100_000_001), line(100_000_001, 100)];
    const r = QuoteFieldsSchema.shape.lines.safeParse(lines);
    expect(r.error?.issues.map((i) => [i.path.join("."), i.message])).toEqual([
      ["0.unitPriceMinor", "Unit price must be at most 1,000,000.00"],
      ["1.quantityMilli", "Quantity must be at most 100,000"],
    ]);
    expect(
      QuoteFieldsSchema.shape.lines.safeParse([line(100_000_000, 100_000_000 / 1000)]).success,
    ).toBe(true);
    expect(quoteLimitMessages("USD")).toMatchObject({
      unitPrice: "At most $1,000,000.00",
      quantity: "At most 100,000",
    });
  });
});

describe("text at the edge", () => {
  it("a search with a NUL is refused by the list query (pages then show the unfiltered list)", () => {
    expect(CustomerListQuery.safeParse({ q: "a\u0000b" }).success).toBe(false);
    expect(CustomerListQuery.safeParse({ q: "555-0188" }).success).toBe(true);
  });

  it("field errors keyed by hostile names stay plain fields", () => {
    const out = fieldErrorsOf([
      { path: "constructor", message: "a" },
      { path: "__proto__", message: "b" },
      { path: "constructor", message: "c" },
    ]);
    expect(Object.getPrototypeOf(out)).toBe(Object.prototype);
    expect(Object.entries(out)).toEqual([
      ["constructor", ["a", "c"]],
      ["__proto__", ["b"]],
    ]);
  });
});

// PostgreSQL's date runs from 4713 BC to 5874897 AD and has no year 0 (PostgreSQL 16
// documentation, §8.5 "Date/Time Types", table 8.9); the app keeps to 1900–9999 (common
// practice, no source: four-digit years a person means).
describe("dates the schemas accept fit the date columns", () => {
  it("year 0, five-digit years, days that do not exist and dates before 1900 are one field error each", () => {
    for (const d of ["0000-01-01", "0000-00-00", "10000-01-01", "2023-02-29", "1899-12-31", ""]) {
      const r = calendarDate().safeParse(d);
      expect(r.success, d).toBe(false);
      expect(r.error?.issues, d).toHaveLength(1);
    }
  });
  it("the first and last days taken, and a leap day", () => {
    for (const d of [DATE_MIN, DATE_MAX, "2024-02-29"])
      expect(calendarDate().safeParse(d).success, d).toBe(true);
  });
});
