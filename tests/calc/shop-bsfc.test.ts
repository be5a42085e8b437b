import { describe, expect, it } from "vitest";

import {
  aspirationClassOf,
  fuelClassOf,
  shopBsfcFor,
  shopBsfcTable,
  type BsfcPoint,
} from "@/lib/calc";

describe("fuel classes", () => {
  it("splits at E15 and E51", () => {
    // E15: the highest blend sold as gasoline in the US (EPA E15 partial waiver, 2010–2011), from memory;
    // E51–E83: ethanol fuel blends per ASTM D5798 (ethanol content range), from memory.
    expect(fuelClassOf(0)).toBe("gasoline");
    expect(fuelClassOf(10)).toBe("gasoline");
    expect(fuelClassOf(15)).toBe("gasoline");
    expect(fuelClassOf(15.1)).toBe("mid-blend");
    expect(fuelClassOf(50)).toBe("mid-blend");
    expect(fuelClassOf(51)).toBe("e85");
    expect(fuelClassOf(83)).toBe("e85");
    expect(fuelClassOf(100)).toBe("e85");
    // Turbo and supercharged share the boosted anchors, as the rule-of-thumb BSFC does (common practice, no source).
    expect([
      aspirationClassOf("na"),
      aspirationClassOf("turbo"),
      aspirationClassOf("supercharged"),
    ]).toEqual(["na", "boosted", "boosted"]);
  });
});

describe("the shop's measured BSFC table", () => {
  // Points invented for the test; the checks are plain arithmetic means (common practice, no source).
  const pts: BsfcPoint[] = [
    { buildId: "a", ethanolVolPct: 80, aspiration: "turbo", gPerKwh: 480 },
    { buildId: "b", ethanolVolPct: 72, aspiration: "supercharged", gPerKwh: 520 },
    { buildId: "c", ethanolVolPct: 10, aspiration: "na", gPerKwh: 300 },
    { buildId: "d", ethanolVolPct: 80, aspiration: "na", gPerKwh: 410 },
  ];

  it("groups by fuel class and aspiration, one figure per build", () => {
    const t = shopBsfcTable(pts);
    expect(t.map((r) => `${r.fuel}/${r.aspiration}/${r.builds}`)).toEqual([
      "gasoline/na/1",
      "e85/boosted/2",
      "e85/na/1",
    ]);
    const boosted = t.find((r) => r.fuel === "e85" && r.aspiration === "boosted")!;
    expect(boosted.meanGPerKwh).toBe(500);
    expect([boosted.minGPerKwh, boosted.maxGPerKwh]).toEqual([480, 520]);
  });

  it("a build's later figure replaces its earlier one", () => {
    const t = shopBsfcTable([
      ...pts,
      { buildId: "a", ethanolVolPct: 80, aspiration: "turbo", gPerKwh: 500 },
    ]);
    const boosted = t.find((r) => r.fuel === "e85" && r.aspiration === "boosted")!;
    expect(boosted.builds).toBe(2);
    expect(boosted.meanGPerKwh).toBe(510);
  });

  it("drops figures no engine makes (mapping or logging mistakes) and non-numbers", () => {
    const t = shopBsfcTable([
      { buildId: "x", ethanolVolPct: 80, aspiration: "turbo", gPerKwh: 40 },
      { buildId: "y", ethanolVolPct: 80, aspiration: "turbo", gPerKwh: 5000 },
      { buildId: "z", ethanolVolPct: 80, aspiration: "turbo", gPerKwh: Number.NaN },
      { buildId: "w", ethanolVolPct: 140, aspiration: "turbo", gPerKwh: 480 },
    ]);
    expect(t).toEqual([]);
  });

  it("offers the row for a sizing's ethanol content and aspiration, or none", () => {
    const t = shopBsfcTable(pts);
    expect(shopBsfcFor(t, 85, "turbo")?.builds).toBe(2);
    expect(shopBsfcFor(t, 85, "supercharged")?.meanGPerKwh).toBe(500);
    expect(shopBsfcFor(t, 30, "turbo")).toBeNull();
    expect(shopBsfcFor(t, Number.NaN, "turbo")).toBeNull();
    expect(shopBsfcFor([], 85, "turbo")).toBeNull();
  });
});
