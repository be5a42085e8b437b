import { describe, expect, it } from "vitest";

import { sameLines, totalColumns } from "@/db/queries/document-lines";

/** Made-up lines (no outside figures: the comparison is of what a person edits). */
const part = {
  kind: "part",
  partId: "p-1",
  sku: "TST-1",
  description: "Test injector",
  quantityMilli: 6000,
  unitPriceMinor: 18000,
  discountBp: 0,
};
const labour = {
  kind: "labour",
  partId: null,
  sku: null,
  description: "Labour",
  quantityMilli: 2500,
  unitPriceMinor: 9000,
  discountBp: 0,
};

describe("the lines quotes and invoices compare before they rewrite them", () => {
  it("the same lines in the same order are the same (a missing part or SKU reads as none)", () => {
    const { partId: _p, sku: _s, ...bare } = labour;
    expect(sameLines([part, labour], [{ ...part }, bare])).toBe(true);
    expect(sameLines([], [])).toBe(true);
  });

  it("another order, another count or any edited field is a change", () => {
    expect(sameLines([part, labour], [labour, part])).toBe(false);
    expect(sameLines([part, labour], [part])).toBe(false);
    for (const edit of [
      { description: "Test injector " },
      { quantityMilli: 6001 },
      { unitPriceMinor: 17999 },
      { discountBp: 1 },
      { sku: "TST-2" },
      { partId: "p-2" },
      { kind: "fee" },
    ])
      expect(sameLines([part], [{ ...part, ...edit }]), JSON.stringify(edit)).toBe(false);
  });

  it("the totals columns are the four sums, nothing else (a deposit is the invoice's own)", () => {
    expect(
      totalColumns({
        subtotalMinor: 100,
        discountMinor: 10,
        taxMinor: 8,
        totalMinor: 108,
        depositMinor: 50,
      } as Parameters<typeof totalColumns>[0]),
    ).toEqual({ subtotalMinor: 100, discountMinor: 10, taxMinor: 8, totalMinor: 108 });
  });
});
