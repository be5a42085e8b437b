import { describe, expect, it } from "vitest";

import { diffQuotes, type DiffLine } from "@/lib/quotes/quote-diff";
import { quoteEmail } from "@/lib/quotes/quote-email";
import { withLabour } from "@/lib/quotes/quote-lines";
import { formatRateBp, presentQuote } from "@/lib/quotes/quote-presentation";
import { parseQuoteNumber, QuoteCreateSchema } from "@/lib/validations/quotes";

// Invented lines (inputs); every check value is worked by hand beside it.
const pump: DiffLine = {
  kind: "part",
  partId: "p-pump",
  sku: "TP-340",
  description: "Testbrand 340 L/h pump",
  quantityMilli: 1000,
  unitPriceMinor: 18000,
  discountBp: 1000,
};
const fitting: DiffLine = {
  kind: "labour",
  partId: null,
  sku: null,
  description: "Fitting",
  quantityMilli: 1500,
  unitPriceMinor: 12000,
  discountBp: 0,
};
const usd825 = { currency: "USD", taxRateBp: 825 };

describe("one presentation of a quote", () => {
  it("a 10 % discount: price, discount and line total per line; the subtotal after discounts", () => {
    const p = presentQuote(usd825, [pump, fitting]);
    // By hand: 1 × 180.00 less 10 % (18.00) = 162.00; 1.5 h × 120.00 = 180.00.
    expect(p.lines[0]).toMatchObject({
      quantity: "1",
      unitPrice: "$180.00",
      discountRate: "10 %",
      discountAmount: "−$18.00",
      discount: "10 % (−$18.00)",
      lineTotal: "$162.00",
    });
    expect(p.lines[1]).toMatchObject({
      // Labour in hours, with its unit (the quantity registry's "h").
      quantity: "1.5 h",
      unitPrice: "$120.00",
      discountRate: null,
      discount: "—",
      lineTotal: "$180.00",
    });
    // Subtotal 162.00 + 180.00 = 342.00 (the discount is already in it, not taken off again);
    // tax 8.25 % of 342.00 = 28.215 → 28.22 (half up); total 370.22.
    expect(p).toMatchObject({
      subtotal: "$342.00",
      discountNote: "Includes discounts of $18.00",
      taxLabel: "Tax (8.25 %)",
      tax: "$28.22",
      total: "$370.22",
      minor: { subtotal: 34200, discount: 1800, tax: 2822, total: 37022 },
    });
  });

  it("no discount: no note and no discount figures", () => {
    const p = presentQuote(usd825, [fitting]);
    expect(p.discountNote).toBeNull();
    expect(p.lines[0]!.discountAmount).toBeNull();
  });

  it("rates read with the decimals they have", () => {
    // Common practice, no source: basis points are hundredths of a percent.
    expect(formatRateBp(1000)).toBe("10 %");
    expect(formatRateBp(1250)).toBe("12.5 %");
    expect(formatRateBp(825)).toBe("8.25 %");
    expect(formatRateBp(0)).toBe("0 %");
  });

  it("the e-mail prints what the presentation says, not a discount of its own", () => {
    const { text } = quoteEmail({
      shopName: "Test Shop",
      customerName: "Sam",
      buildTitle: null,
      quote: { number: 3, revision: 1, validUntil: "2099-01-31" },
      presented: presentQuote(usd825, [pump, fitting]),
      link: "https://app.test/my/quotes/q3",
      invite: null,
      attachments: ["quote-Q-0003.pdf"],
    });
    expect(text).toContain("1 × Testbrand 340 L/h pump (TP-340)");
    expect(text).toContain("$180.00 each, discount 10 % (−$18.00): $162.00");
    expect(text).toContain("Subtotal $342.00 (includes discounts of $18.00)");
    expect(text).toContain("Tax (8.25 %) $28.22");
    expect(text).toContain("Total $370.22");
    expect(text).not.toMatch(/less \d/);
  });
});

describe("labour at the shop's rate, added once", () => {
  it("adds one labour line when there is none, and none when labour is already on the quote", () => {
    const parts = [{ ...pump, partId: "p-pump" }];
    const once = withLabour(parts, { hours: 2, rateMinor: 11000 });
    expect(once.filter((l) => l.kind === "labour")).toEqual([
      expect.objectContaining({ quantityMilli: 2000, unitPriceMinor: 11000 }),
    ]);
    expect(withLabour(once, { hours: 2, rateMinor: 11000 })).toBe(once);
    expect(withLabour(parts, { hours: 0, rateMinor: 11000 })).toBe(parts);
  });
});

describe("what changed since the revision the customer saw", () => {
  it("lists lines added, removed and changed, and the totals before and after", () => {
    const hose: DiffLine = { ...fitting, kind: "part", partId: "p-hose", sku: "H-8" };
    const d = diffQuotes(
      usd825,
      [pump, fitting, hose],
      [{ ...pump, quantityMilli: 2000 }, fitting, { ...fitting, description: "Dyno session" }],
    );
    expect(d.same).toBe(false);
    expect(d.added.map((l) => l.description)).toEqual(["Dyno session"]);
    expect(d.removed.map((l) => l.description)).toEqual(["Fitting"]);
    // By hand: 2 × 180.00 = 360.00 less 10 % (36.00) = 324.00, was 162.00.
    expect(d.changed).toEqual([
      {
        description: "Testbrand 340 L/h pump",
        sku: "TP-340",
        changes: [
          { field: "Qty", before: "1", after: "2" },
          { field: "Discount", before: "10 % (−$18.00)", after: "10 % (−$36.00)" },
          { field: "Line total", before: "$162.00", after: "$324.00" },
        ],
      },
    ]);
    // Before: 162 + 180 + 180 = 522.00, tax 43.065 → 43.07, total 565.07.
    // After: 324 + 180 + 180 = 684.00, tax 56.43, total 740.43.
    expect(d.totals).toEqual([
      { label: "Subtotal", before: "$522.00", after: "$684.00" },
      { label: "Tax (8.25 %)", before: "$43.07", after: "$56.43" },
      { label: "Total", before: "$565.07", after: "$740.43" },
    ]);
  });

  it("the same lines in another order are no change", () => {
    expect(diffQuotes(usd825, [pump, fitting], [fitting, pump]).same).toBe(true);
  });
});

describe("quote list search and the parts-only quote's input", () => {
  it("reads a quote number however it is typed", () => {
    expect(parseQuoteNumber("Q-0007")).toEqual({ number: 7 });
    expect(parseQuoteNumber("q7")).toEqual({ number: 7 });
    expect(parseQuoteNumber("0007")).toEqual({ number: 7 });
    expect(parseQuoteNumber("Q-0007-r2")).toEqual({ number: 7, revision: 2 });
    expect(parseQuoteNumber("Mustang")).toBeNull();
  });

  it("a parts-only quote names a customer; lines and a build together are refused on lines", () => {
    const c = "00000000-0000-4000-8000-000000000001";
    const line = { ...pump, partId: "00000000-0000-4000-8000-0000000000aa" };
    expect(QuoteCreateSchema.safeParse({ customerId: c, lines: [line] }).success).toBe(true);
    const both = QuoteCreateSchema.safeParse({ buildId: c, lines: [line] });
    expect(both.success).toBe(false);
    expect(both.error!.issues[0]!.path).toEqual(["lines"]);
    const none = QuoteCreateSchema.safeParse({ lines: [] });
    expect(none.error!.issues[0]!.path).toEqual(["customerId"]);
  });
});
