import { describe, expect, it } from "vitest";

import { FuelSystemInputSchema, PRE_PUMP_FILTER_CAUTION_KPA, sizeFuelSystem } from "@/lib/calc";

import { boostedSix } from "./fixtures";

describe("pre- and post-pump filters as separate items (docs/calculations.md §4.5)", () => {
  it("the post-pump filter is in the pressure the pump works against", () => {
    const none = sizeFuelSystem({ ...boostedSix, filters: { postPumpDropKpa: 0 } });
    const some = sizeFuelSystem({ ...boostedSix, filters: { postPumpDropKpa: 40 } });
    // 40 kPa more filter drop: the outlet rises by about 40 kPa (less a little line drop, as
    // the pump then flows less), so the supply falls.
    const rise = some.pump.outletPressureKpa - none.pump.outletPressureKpa;
    const lineDropFell = none.lines.feed!.pressureDropKpa - some.lines.feed!.pressureDropKpa;
    expect(lineDropFell).toBeGreaterThan(0);
    // Within the solver's 0.01 kPa tolerance (§4.1): outlet = rail + filter + line drop.
    expect(rise).toBeCloseTo(40 - lineDropFell, 1);
    expect(some.pump.supplyLPerH).toBeLessThan(none.pump.supplyLPerH);
    // The rail is the regulator's, whatever the filters.
    expect(some.pump.railPressureKpa).toBe(none.pump.railPressureKpa);
  });

  it("the pre-pump filter is on the suction side: not in the outlet pressure, a caution when large", () => {
    const base = sizeFuelSystem(boostedSix);
    const small = sizeFuelSystem({
      ...boostedSix,
      filters: { ...boostedSix.filters, prePumpDropKpa: 5 },
    });
    expect(small.pump.outletPressureKpa).toBe(base.pump.outletPressureKpa);
    expect(small.warnings.map((w) => w.code)).not.toContain("pre-pump-filter-drop");
    const large = sizeFuelSystem({
      ...boostedSix,
      filters: { ...boostedSix.filters, prePumpDropKpa: PRE_PUMP_FILTER_CAUTION_KPA + 5 },
    });
    const w = large.warnings.filter((x) => x.code === "pre-pump-filter-drop");
    expect(w).toHaveLength(1);
    expect(w[0]!.severity).toBe("caution");
    expect(w[0]!.params.drop!.value).toBe(15);
  });

  it("defaults both to none, and refuses a negative drop at its field", () => {
    const { filters, ...rest } = boostedSix;
    void filters;
    expect(FuelSystemInputSchema.parse(rest).filters).toEqual({
      prePumpDropKpa: 0,
      postPumpDropKpa: 0,
    });
    const bad = FuelSystemInputSchema.safeParse({ ...rest, filters: { prePumpDropKpa: -1 } });
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0]!.path.join(".")).toBe("filters.prePumpDropKpa");
  });
});
