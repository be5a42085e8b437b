import { describe, expect, it } from "vitest";

import { FuelSystemInputSchema, sizeParsedFuelSystem } from "@/lib/calc";
import { minorToPlain, mulDivRound, parseMoney } from "@/lib/catalog/money";
import { quoteTotals } from "@/lib/catalog/quote-totals";
import {
  applyKit,
  reasonText,
  recommendKit,
  type CatalogPart,
  type Reason,
} from "@/lib/catalog/recommend";

import { boostedSix, naFour } from "../calc/fixtures";

// Catalog fixtures: invented parts (inputs, not check values).
let n = 0;
const part = (
  category: CatalogPart["category"],
  specs: Record<string, unknown>,
  priceMinor = 10000,
  stock = 10,
): CatalogPart => ({
  id: `00000000-0000-4000-8000-${String(++n).padStart(12, "0")}`,
  sku: `T-${n}`,
  brand: "Test",
  name: `${category} ${n}`,
  category,
  priceMinor,
  stock,
  reserved: 0,
  specs,
});
const curve = (flowAt300: number) => [
  {
    voltage: 13,
    points: [
      { pressureKpa: 300, flowLPerH: flowAt300 },
      { pressureKpa: 500, flowLPerH: flowAt300 * 0.85 },
      { pressureKpa: 700, flowLPerH: flowAt300 * 0.7 },
    ],
  },
];

describe("kit idle check: the commanded pulse against the minimum (docs/calculations.md §3.6)", () => {
  it("a 4.4 L V8 idling at 750 rpm fits a 1300 cc/min injector whose dead time is known", () => {
    const v8 = FuelSystemInputSchema.parse({
      ...boostedSix,
      engine: {
        cylinders: 8,
        displacementL: 4.4,
        aspiration: "turbo",
        redlineRpm: 7000,
        idleRpm: 750,
        maxBoostKpa: 150,
      },
      injectors: { ...boostedSix.injectors, count: 8 },
    });
    // Data-sheet-like table (invented input): ≈ 0.95 ms at 14 V, 400 kPa; minimum commanded 1.0 ms.
    const deadTime = {
      voltages: [12, 14],
      pressuresKpa: [300, 500],
      deadTimeMs: [
        [1.1, 1.3],
        [0.9, 1.05],
      ],
    };
    const withTable = part("injector", {
      ratedFlowCcPerMin: 1300,
      ratedPressureKpa: 300,
      minPulseWidthMs: 1.0,
      deadTime,
      ethanolOk: true,
    });
    const noTable = part("injector", {
      ratedFlowCcPerMin: 1300,
      ratedPressureKpa: 300,
      minPulseWidthMs: 1.0,
      ethanolOk: true,
    });
    const rec = recommendKit(v8, [withTable, noTable]);
    const cands = rec.roles.find((x) => x.role === "injector")!.candidates;
    const text = (id: string) =>
      cands
        .find((c) => c.part.id === id)!
        .why.map((w) => reasonText(w, "metric"))
        .join("; ");
    // Opening time at idle is under 1 ms; plus the dead time it is well over (by hand, §3.7).
    expect(text(withTable.id)).toContain("idle commanded pulse");
    expect(text(withTable.id)).not.toContain("too big for idle");
    expect(text(noTable.id)).toContain("too big for idle");
    expect(text(noTable.id)).toContain("no dead time known");
  });
});

describe("kit recommendation", () => {
  const input = FuelSystemInputSchema.parse(boostedSix);
  const small = part("injector", {
    ratedFlowCcPerMin: 600,
    ratedPressureKpa: 300,
    minPulseWidthMs: 0.5,
    ethanolOk: true,
  });
  const right = part("injector", {
    ratedFlowCcPerMin: 1000,
    ratedPressureKpa: 300,
    minPulseWidthMs: 0.5,
    ethanolOk: true,
  });
  const bigger = part("injector", {
    ratedFlowCcPerMin: 1300,
    ratedPressureKpa: 300,
    minPulseWidthMs: 0.5,
    ethanolOk: true,
  });
  const huge = part("injector", {
    ratedFlowCcPerMin: 4000,
    ratedPressureKpa: 300,
    minPulseWidthMs: 1.5,
    ethanolOk: true,
  });
  const gasOnly = part("injector", {
    ratedFlowCcPerMin: 1000,
    ratedPressureKpa: 300,
    ethanolOk: false,
  });
  const weakPump = part("pump", { curves: curve(300), mounting: "in-tank", ethanolOk: true });
  const strongPump = part("pump", { curves: curve(520), mounting: "in-tank", ethanolOk: true });
  const rec = recommendKit(input, [small, right, bigger, huge, gasOnly, weakPump, strongPump]);
  const role = (r: string) => rec.roles.find((x) => x.role === r)!.candidates;
  const read = (why: Reason[], units: "metric" | "imperial" = "metric") =>
    why.map((w) => reasonText(w, units)).join(" ");

  it("ranks the smallest injector that meets the design duty first", () => {
    const inj = role("injector");
    expect(inj[0]!.part.id).toBe(right.id);
    expect(inj.find((c) => c.part.id === small.id)!.fits).toBe(false);
    expect(read(inj.find((c) => c.part.id === small.id)!.why)).toMatch(/over the 80 % design duty/);
  });

  it("refuses an injector too big for idle and one not rated for ethanol", () => {
    const h = role("injector").find((c) => c.part.id === huge.id)!;
    expect(h.fits).toBe(false);
    expect(read(h.why)).toMatch(/too big for idle/);
    const g = role("injector").find((c) => c.part.id === gasOnly.id)!;
    expect(g.fits).toBe(false);
    expect(read(g.why)).toMatch(/not rated for E85/);
  });

  it("picks two pumps when one lacks margin", () => {
    const pumps = role("pump");
    const weakOne = pumps.find((c) => c.part.id === weakPump.id && c.quantity === 1)!;
    const weakTwo = pumps.find((c) => c.part.id === weakPump.id && c.quantity === 2)!;
    expect(weakOne.fits).toBe(false);
    expect(weakTwo.fits).toBe(true);
    // The strong pump alone fits, so no pair of it is offered and it ranks before the weak pair.
    expect(pumps.filter((c) => c.part.id === strongPump.id).map((c) => c.quantity)).toEqual([1]);
    expect(pumps[0]!.part.id).toBe(strongPump.id);
    // The verdict's figures are data, read in either system.
    expect(read(weakOne.why, "metric")).toMatch(/margin at \d+ kPa and [\d.]+ V/);
    expect(read(weakOne.why, "imperial")).toMatch(/margin at [\d.]+ psi and [\d.]+ V/);
    expect(read(weakOne.why, "imperial")).not.toMatch(/kPa|L\/h/);
  });

  it("applying the chosen parts sizes the build on their data", () => {
    const next = applyKit(input, [
      { role: "injector", part: right, quantity: 6 },
      { role: "pump", part: weakPump, quantity: 2 },
    ]);
    expect(next.injectors.ratedFlowCcPerMin).toBe(1000);
    expect(next.pumps[0]!.quantity).toBe(2);
    const r = sizeParsedFuelSystem(next);
    expect(r.blend.rich.dutyPct).toBeCloseTo(role("injector")[0]!.figure!, 6);
  });

  it("asks for an ethanol sensor exactly when the build sheet does (docs/calculations.md §1)", () => {
    const sensor = part("sensor", { kind: "ethanol" });
    // One rule, flexSensorAdvice: 20 points or more of blend range (common practice, no source).
    for (const [lo, hi, needed] of [
      [51, 83, true], // pump E85 across ASTM D5798's classes
      [0, 85, true],
      [70, 85, false], // 15 points: the fuel trims cover it
      [0, 10, false],
      [85, 85, false],
    ] as const) {
      const build = FuelSystemInputSchema.parse({
        ...boostedSix,
        fuel: { ethanolMinVolPct: lo, ethanolMaxVolPct: hi },
      });
      const kit = recommendKit(build, [sensor]).roles.find((r) => r.role === "sensor")!;
      const sheet = sizeParsedFuelSystem(build).warnings.some((w) => w.code === "blend-range-flex");
      expect(kit.needed, `E${lo}–E${hi}`).toBe(needed);
      expect(sheet, `E${lo}–E${hi}`).toBe(needed);
      expect(kit.candidates[0]!.fits).toBe(needed);
    }
    const fixed = FuelSystemInputSchema.parse({
      ...naFour,
      fuel: { ethanolMinVolPct: 10, ethanolMaxVolPct: 10 },
    });
    expect(recommendKit(fixed, [sensor]).roles.find((r) => r.role === "sensor")!.needed).toBe(
      false,
    );
  });
});

describe("kit filters: a strainer before the pump, a fine filter after it (docs/calculations.md §4.5)", () => {
  // The tester's catalog: a 100 µm strainer with -10 ports, 10 µm filters with -10 and -8 ports.
  const strainer = part("filter", { micron: 100, dropKpa: 2, dash: 10, ethanolOk: true });
  const fine = part("filter", { micron: 10, dropKpa: 4, dash: 10, ethanolOk: true });
  const fineSmall = part("filter", { micron: 10, dropKpa: 5, dash: 6, ethanolOk: true });
  const build = FuelSystemInputSchema.parse(boostedSix);
  const kit = recommendKit(build, [strainer, fine, fineSmall]);
  const role = (r: string) => kit.roles.find((x) => x.role === r)!;

  it("offers the strainer as the pre-pump role and the fine filters as the post-pump role", () => {
    expect(role("pre-filter").label).toBe("Pre-pump strainer");
    expect(role("pre-filter").candidates.map((c) => c.part.id)).toEqual([strainer.id]);
    expect(role("pre-filter").candidates[0]!.fits).toBe(true);
    expect(role("filter").label).toBe("Post-pump filter");
    // Best post-pump fit is the 10 µm filter, not the strainer.
    expect(role("filter").candidates[0]!.part.id).toBe(fine.id);
    expect(role("filter").candidates[0]!.fits).toBe(true);
    expect(role("filter").candidates.map((c) => c.part.id)).not.toContain(strainer.id);
  });

  it("each choice feeds its own input", () => {
    const next = applyKit(build, [
      { role: "pre-filter", part: strainer, quantity: 1 },
      { role: "filter", part: fine, quantity: 1 },
    ]);
    expect(next.filters.prePumpDropKpa).toBe(2);
    expect(next.filters.postPumpDropKpa).toBe(4);
  });
});

describe("quote totals in integer cents", () => {
  it("a hand-worked quote: line discount, then tax once on the net", () => {
    // By hand: 6 × 109.00 = 654.00; 5 × 29.00 = 145.00; 5 h × 120.00 = 600.00 less 10 % = 540.00.
    // Net 654 + 145 + 540 = 1339.00; tax 8.25 % = 110.4675 → 110.47; total 1449.47.
    const t = quoteTotals(
      [
        { quantityMilli: 6000, unitPriceMinor: 10900, discountBp: 0 },
        { quantityMilli: 5000, unitPriceMinor: 2900, discountBp: 0 },
        { quantityMilli: 5000, unitPriceMinor: 12000, discountBp: 1000 },
      ],
      825,
    );
    // The subtotal is after the line discounts (1339.00): nothing is taken off twice.
    expect(t).toMatchObject({
      grossMinor: 139900,
      subtotalMinor: 133900,
      discountMinor: 6000,
      taxMinor: 11047,
      totalMinor: 144947,
    });
  });

  it("rounds half a cent up", () => {
    // By hand: 1.5 × 0.33 = 0.495 → 0.50; 10 % tax = 0.05. And 0.10 at 5 % tax = 0.005 → 0.01.
    expect(
      quoteTotals([{ quantityMilli: 1500, unitPriceMinor: 33, discountBp: 0 }], 1000),
    ).toMatchObject({ subtotalMinor: 50, taxMinor: 5, totalMinor: 55 });
    expect(
      quoteTotals([{ quantityMilli: 1000, unitPriceMinor: 10, discountBp: 0 }], 500).taxMinor,
    ).toBe(1);
    // 0.1 + 0.2 in floating point is 0.30000000000000004; in cents it is exact.
    expect(
      quoteTotals(
        [
          { quantityMilli: 1000, unitPriceMinor: 10, discountBp: 0 },
          { quantityMilli: 1000, unitPriceMinor: 20, discountBp: 0 },
        ],
        0,
      ).totalMinor,
    ).toBe(30);
  });

  it("an empty quote is zero", () => {
    expect(quoteTotals([], 825)).toMatchObject({ subtotalMinor: 0, taxMinor: 0, totalMinor: 0 });
  });

  it("integer arithmetic stays exact beyond 2^53", () => {
    // 99 999 999 × 99 999 999 = 9 999 999 800 000 001 (> 2^53); ÷ 1000 = 9 999 999 800 000.001 → …800 000.
    expect(mulDivRound(99_999_999, 99_999_999, 1000)).toBe(9_999_999_800_000);
  });

  it("reads and writes amounts without floats", () => {
    expect(parseMoney("1,234.5")).toBe(123450);
    expect(parseMoney("$0.07")).toBe(7);
    expect(parseMoney("12.345")).toBeNull();
    expect(parseMoney("-5")).toBeNull();
    expect(parseMoney("ten")).toBeNull();
    expect(minorToPlain(123405)).toBe("1234.05");
  });
});
