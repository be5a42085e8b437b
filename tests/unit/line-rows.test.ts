import { describe, expect, it } from "vitest";

import {
  draftLine,
  lineIssues,
  lineRowOf,
  parseLineRow,
  partLineRow,
  serverLineField,
  type LineRow,
} from "@/lib/quotes/line-rows";
import { quoteLimitMessages } from "@/lib/quotes/quote-limits";

// The rows the quote and invoice editors hold (lib/quotes/line-rows.ts). Invented lines; the
// expected texts are what the editors show (common practice, no source).
const limits = quoteLimitMessages("USD");
const row = (over: Partial<LineRow> = {}): LineRow => ({
  kind: "part",
  partId: null,
  sku: "T-PUMP-1",
  description: "Testbrand in-tank pump",
  qty: "2",
  price: "189.50",
  discount: "",
  ...over,
});
const issues = (r: LineRow) => lineIssues(r, parseLineRow(r), limits);

describe("a line as its editor holds it", () => {
  it("loads a stored line as the text a person types, and reads it back the same", () => {
    const line = {
      kind: "labour" as const,
      partId: null,
      sku: null,
      description: "Fit and tune",
      quantityMilli: 1500,
      unitPriceMinor: 12000,
      discountBp: 1000,
    };
    const r = lineRowOf(line);
    expect(r).toMatchObject({ qty: "1.5", price: "120.00", discount: "10" });
    expect(draftLine(r, parseLineRow(r))).toEqual(line);
  });

  it("adds a catalog part as one of it at its price, no discount", () => {
    expect(
      partLineRow({
        id: "p1",
        sku: "T-INJ-1",
        brand: "Testbrand",
        name: "Injector",
        priceMinor: 10900,
      }),
    ).toEqual({
      kind: "part",
      partId: "p1",
      sku: "T-INJ-1",
      description: "Testbrand Injector",
      qty: "1",
      price: "109.00",
      discount: "0",
    });
  });

  it("a good row has no problems; a blank discount is none", () => {
    expect(issues(row())).toEqual([]);
    expect(parseLineRow(row()).discountBp).toBe(0);
  });

  it("names each wrong field in order, with the limits said as the editor says them", () => {
    expect(issues(row({ description: " ", qty: "0", price: "12.5.0", discount: "101" }))).toEqual([
      ["description", "Describe the line"],
      ["qty", `Above 0, up to 3 decimals, ${limits.quantity.toLowerCase()}`],
      ["price", `A price like 12.50, ${limits.unitPrice.toLowerCase()}`],
      ["discount", "From 0 to 100 %"],
    ]);
    expect(issues(row({ qty: "-1" }))[0]?.[0]).toBe("qty");
    expect(issues(row({ price: "999999999" }))).toEqual([["price", limits.unitPrice]]);
  });

  it("while typed, what does not read counts as 0 and a discount is at most 100 %", () => {
    const r = row({ qty: "two", discount: "150" });
    expect(draftLine(r, parseLineRow(r))).toMatchObject({ quantityMilli: 0, discountBp: 10000 });
  });

  it("points a field the server refused at its line and input; anything else at none", () => {
    expect(serverLineField("lines.2.unitPriceMinor")).toEqual({ index: 2, field: "price" });
    expect(serverLineField("lines.0.quantityMilli")).toEqual({ index: 0, field: "qty" });
    expect(serverLineField("lines.0.constructor")).toBeUndefined();
    expect(serverLineField("notes")).toBeUndefined();
  });
});
