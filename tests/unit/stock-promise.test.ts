import { describe, expect, it } from "vitest";

import { FuelSystemInputSchema } from "@/lib/calc";
import { fitLabel, fitLabels, recommendKit, type CatalogPart } from "@/lib/catalog/recommend";
import {
  addDays,
  allocate,
  expectedOn,
  holdSummary,
  promiseLines,
  promiseText,
  unitsOf,
  type StockFacts,
} from "@/lib/catalog/stock";

import { boostedSix } from "../calc/fixtures";

// Invented parts and quotes (inputs, not check values); the expected texts are the product's own.
const PUMP = "00000000-0000-4000-8000-00000000a001";
const HOSE = "00000000-0000-4000-8000-00000000a002";
const TODAY = "2026-03-04";
const facts = (f: Partial<StockFacts>): StockFacts => ({
  stock: 0,
  reserved: 0,
  leadTimeDays: null,
  restockOn: null,
  ...f,
});

describe("stock promised once (lib/catalog/stock.ts)", () => {
  it("a part line wants whole units; part of a unit is a unit", () => {
    expect([unitsOf(1000), unitsOf(2000), unitsOf(1500), unitsOf(1)]).toEqual([1, 2, 2, 1]);
  });

  it("holds only what is free, first line first; labour and fees hold nothing", () => {
    const lines = [
      { kind: "part", partId: PUMP, quantityMilli: 2000 },
      { kind: "labour", partId: null, quantityMilli: 4000 },
      { kind: "part", partId: PUMP, quantityMilli: 1000 },
      { kind: "part", partId: HOSE, quantityMilli: 5000 },
    ];
    const held = allocate(
      lines,
      new Map([
        [PUMP, 1],
        [HOSE, 9],
      ]),
    );
    expect(held).toEqual([1, 0, 0, 5]);
  });

  it("the expected day: an announced restock not yet past, else today + lead time, else unknown", () => {
    expect(expectedOn({ restockOn: "2026-03-20", leadTimeDays: 30 }, TODAY)).toBe("2026-03-20");
    expect(expectedOn({ restockOn: "2026-03-01", leadTimeDays: 10 }, TODAY)).toBe("2026-03-14");
    expect(expectedOn({ restockOn: null, leadTimeDays: 0 }, TODAY)).toBe(TODAY);
    expect(expectedOn({ restockOn: null, leadTimeDays: null }, TODAY)).toBeNull();
    // Month and year ends (calendar arithmetic, common practice, no source).
    expect(addDays("2026-02-27", 2)).toBe("2026-03-01");
    expect(addDays("2028-02-28", 1)).toBe("2028-02-29");
    expect(addDays("2026-12-31", 1)).toBe("2027-01-01");
  });

  it("before accepting: '1 of 2 in stock; the other expected by <day>'", () => {
    const lines = [
      { kind: "part", partId: PUMP, quantityMilli: 2000, heldQty: 0, description: "Pump A" },
      { kind: "labour", partId: null, quantityMilli: 4000, heldQty: 0, description: "Fitting" },
    ];
    const parts = new Map([[PUMP, facts({ stock: 3, reserved: 2, leadTimeDays: 10 })]]);
    const p = promiseLines(lines, parts, { holding: false, today: TODAY });
    expect(p[1]).toBeNull();
    expect(p[0]).toEqual({ wanted: 2, held: 1, backOrdered: 1, expectedOn: "2026-03-14" });
    expect(promiseText(p[0]!, false)).toBe("1 of 2 in stock; the other expected by 14 Mar 2026");
    expect(holdSummary(lines, p)).toBe(
      "The shop will hold 1 × Pump A for you; back-ordered: 1 × Pump A (expected by 14 Mar 2026).",
    );
  });

  it("once accepted, what the line holds is what was stored, whatever is free now", () => {
    const lines = [
      { kind: "part", partId: PUMP, quantityMilli: 3000, heldQty: 1, description: "Pump A" },
    ];
    const parts = new Map([[PUMP, facts({ stock: 10, reserved: 1, restockOn: "2026-04-01" })]]);
    const p = promiseLines(lines, parts, { holding: true, today: TODAY })[0]!;
    expect(p).toEqual({ wanted: 3, held: 1, backOrdered: 2, expectedOn: "2026-04-01" });
    expect(promiseText(p, true)).toBe("1 of 3 held; the other 2 expected by 1 Apr 2026");
  });

  it("says so plainly when nothing is in stock and no day is known, and when all is", () => {
    const lines = [
      { kind: "part", partId: PUMP, quantityMilli: 1000, heldQty: 0, description: "Pump A" },
      { kind: "part", partId: HOSE, quantityMilli: 4000, heldQty: 0, description: "Hose" },
    ];
    const parts = new Map([
      [PUMP, facts({ stock: 1, reserved: 1 })],
      [HOSE, facts({ stock: 50 })],
    ]);
    const p = promiseLines(lines, parts, { holding: false, today: TODAY });
    expect(promiseText(p[0]!, false)).toBe(
      "not in stock: back-ordered, expected date to be confirmed by the shop",
    );
    expect(promiseText(p[1]!, false)).toBe("all 4 in stock");
    expect(holdSummary(lines, p)).toBe(
      "The shop will hold 4 × Hose for you; back-ordered: 1 × Pump A (expected date to be confirmed by the shop).",
    );
    expect(holdSummary([{ description: "Fitting" }], [null])).toBe(
      "This quote has no parts to hold.",
    );
  });
});

describe("an honest kit: best fit out of stock says so", () => {
  const input = FuelSystemInputSchema.parse(boostedSix);
  const injector = (
    id: string,
    flow: number,
    stock: number,
    expected: string | null = null,
  ): CatalogPart => ({
    id,
    sku: `T-${flow}-${id.slice(-2)}`,
    brand: "Test",
    name: `${flow} cc/min`,
    category: "injector",
    priceMinor: 10000,
    stock,
    reserved: 0,
    expectedOn: expected,
    specs: {
      ratedFlowCcPerMin: flow,
      ratedPressureKpa: 300,
      minPulseWidthMs: 0.5,
      ethanolOk: true,
    },
  });
  const ids = (n: number) => `00000000-0000-4000-8000-0000000000${String(n).padStart(2, "0")}`;
  // 1000 cc/min is the closest to the design duty for this build (see kit-and-quotes.test.ts).
  const best = injector(ids(1), 1000, 0, "2026-03-18");
  const next = injector(ids(2), 1300, 12);
  const small = injector(ids(3), 600, 12);
  const catalog = [small, next, best];
  const cands = () => recommendKit(input, catalog).roles.find((r) => r.role === "injector")!;

  it("ranks by fit and labels the out-of-stock best fit with its expected day; the first in stock is 'Best in stock'", () => {
    const c = cands().candidates;
    expect(c[0]!.part.id).toBe(best.id);
    expect(c[0]!.stock).toEqual({ free: 0, needed: 6, expectedOn: "2026-03-18" });
    const labels = fitLabels(c);
    expect(labels[0]).toBe("Best fit — out of stock, expected by 18 Mar 2026");
    expect(labels[c.findIndex((x) => x.part.id === next.id)]).toBe("Best in stock");
    expect(labels[c.findIndex((x) => x.part.id === small.id)]).toBe("Does not fit");
    expect(labels.filter((l) => l === "Best fit")).toEqual([]);
  });

  it("a part short of stock and one with no restock day", () => {
    const short = { ...best, stock: 2, expectedOn: null };
    const c = recommendKit(input, [short]).roles.find((r) => r.role === "injector")!.candidates[0]!;
    expect(fitLabel(c, true)).toBe(
      "Best fit — only 2 of 6 in stock, the rest with no restock date yet",
    );
    const plenty = recommendKit(input, [{ ...best, stock: 6 }]).roles.find(
      (r) => r.role === "injector",
    )!.candidates[0]!;
    expect(fitLabels([plenty])).toEqual(["Best fit"]);
  });

  it("the ranking does not depend on the catalog's order (ties break on the SKU)", () => {
    const twin = { ...next, id: ids(4), sku: "T-1300-AA" };
    const a = recommendKit(input, [next, twin, best, small]).roles[0]!.candidates;
    const b = recommendKit(input, [small, best, twin, next]).roles[0]!.candidates;
    expect(a.map((c) => c.part.id)).toEqual(b.map((c) => c.part.id));
  });
});

describe("a part whose stored data the library refuses does not break the kit", () => {
  const input = FuelSystemInputSchema.parse(boostedSix);
  // Invented records; a pump stored without a usable curve (older data, a hand-edited row).
  const pump = (id: string, curves: unknown[]): CatalogPart => ({
    id,
    sku: `P-${id.slice(-2)}`,
    brand: "Test",
    name: "Pump",
    category: "pump",
    priceMinor: 20000,
    stock: 3,
    reserved: 0,
    expectedOn: null,
    specs: { curves, mounting: "in-tank", ethanolOk: true },
  });
  const good = pump("00000000-0000-4000-8000-0000000000b1", [
    {
      voltage: 13.5,
      points: [
        { pressureKpa: 300, flowLPerH: 400 },
        { pressureKpa: 600, flowLPerH: 330 },
      ],
    },
  ]);
  const broken = pump("00000000-0000-4000-8000-0000000000b2", []);

  it("lists it last as not checked, never as a fit, and ranks the others as before", () => {
    const pumps = recommendKit(input, [broken, good]).roles.find((r) => r.role === "pump")!;
    const last = pumps.candidates.at(-1)!;
    expect(last.part.id).toBe(broken.id);
    expect(last.fits).toBe(false);
    expect(last.why[0]!.text).toMatch(/cannot be checked/);
    expect(pumps.candidates[0]!.part.id).toBe(good.id);
    const alone = recommendKit(input, [good]).roles.find((r) => r.role === "pump")!;
    expect(alone.candidates[0]!.figure).toBe(pumps.candidates[0]!.figure);
  });
});
