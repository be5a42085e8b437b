import { describe, expect, it } from "vitest";

import { quoteEmail, type QuoteEmailData } from "@/lib/quotes/quote-email";
import { linesFromBuild, type PricedPart } from "@/lib/quotes/quote-lines";
import { presentQuote } from "@/lib/quotes/quote-presentation";

// Invented catalog parts (inputs, not check values).
const catalog: PricedPart[] = [
  { id: "p-inj", sku: "INJ-1", brand: "Testbrand", name: "1000 cc injector", priceMinor: 18900 },
  { id: "p-hose", sku: "HOSE-8", brand: "Testbrand", name: "AN-8 hose", priceMinor: 2400 },
];

describe("quote lines from a build's chosen parts", () => {
  it("prices each chosen part from the catalog, names the line's side, and adds labour at the shop's rate", () => {
    const lines = linesFromBuild(
      [
        { role: "injector", partId: "p-inj", sku: "INJ-1", name: "x", quantity: 6 },
        { role: "feed-line", partId: "p-hose", sku: "HOSE-8", name: "x", quantity: 3 },
        { role: "return-line", partId: "p-hose", sku: "HOSE-8", name: "x", quantity: 2 },
        { role: "pump", partId: "p-gone", sku: "GONE", name: "deleted since", quantity: 1 },
      ],
      catalog,
      { hours: 3.5, rateMinor: 11000 },
    );
    expect(lines).toEqual([
      {
        kind: "part",
        partId: "p-inj",
        sku: "INJ-1",
        description: "Testbrand 1000 cc injector",
        quantityMilli: 6000,
        unitPriceMinor: 18900,
        discountBp: 0,
      },
      expect.objectContaining({ description: "Testbrand AN-8 hose — feed", quantityMilli: 3000 }),
      expect.objectContaining({ description: "Testbrand AN-8 hose — return", quantityMilli: 2000 }),
      {
        kind: "labour",
        description: "Fuel system fitting and setup",
        quantityMilli: 3500,
        unitPriceMinor: 11000,
        discountBp: 0,
      },
    ]);
  });

  it("leaves the labour line out at zero hours", () => {
    expect(linesFromBuild([], catalog, { hours: 0, rateMinor: 11000 })).toEqual([]);
  });
});

describe("the quote e-mail", () => {
  const data: QuoteEmailData = {
    shopName: "Test Shop",
    customerName: "Sam",
    buildTitle: "Turbo six",
    quote: { number: 7, revision: 2, validUntil: "2099-01-31" },
    presented: presentQuote({ currency: "USD", taxRateBp: 825 }, [
      {
        kind: "labour",
        sku: null,
        description: "Fitting",
        quantityMilli: 1500,
        unitPriceMinor: 12000,
        discountBp: 0,
      },
    ]),
    link: "https://app.test/my/quotes/q1",
    invite: null,
    attachments: ["quote-Q-0007-r2.pdf"],
  };

  it("names the quote with its revision and states the total; a signed-up customer gets the portal link", () => {
    const { subject, text } = quoteEmail(data);
    expect(subject).toBe("Test Shop: quote Q-0007-r2 for your fuel system");
    expect(text).toContain("Here is quote Q-0007-r2 for Turbo six, valid until 31 Jan 2099.");
    // 1.5 h × 120.00 = 180.00; + 8.25 % = 14.85 → 194.85 (by hand).
    expect(text).toContain("1.5 h × Fitting");
    expect(text).toContain("$120.00 each: $180.00");
    expect(text).toContain("Subtotal $180.00");
    expect(text).toContain("Tax (8.25 %) $14.85");
    expect(text).toContain("Total $194.85");
    expect(text).toContain("Attached: quote-Q-0007-r2.pdf.");
    expect(text).toContain("in your portal: https://app.test/my/quotes/q1");
    expect(text).not.toContain("set your password");
  });

  it("a parts-only quote's subject speaks of parts, not of a fuel system", () => {
    const { subject, text } = quoteEmail({ ...data, buildTitle: null });
    expect(subject).toBe("Test Shop: quote Q-0007-r2 for the parts you asked about");
    expect(subject).not.toContain("fuel system");
    expect(text).toContain("Here is quote Q-0007-r2, valid until 31 Jan 2099.");
  });

  it("a customer without a sign-in gets the invitation first, then the quote's link", () => {
    const { text } = quoteEmail({ ...data, invite: "https://app.test/accept-invitation/abc" });
    const invite = text.indexOf("https://app.test/accept-invitation/abc");
    expect(invite).toBeGreaterThan(text.indexOf("set your password"));
    expect(
      text.indexOf("Afterwards the quote is here: https://app.test/my/quotes/q1"),
    ).toBeGreaterThan(invite);
  });
});
