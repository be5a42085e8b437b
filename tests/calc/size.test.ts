import fc from "fast-check";
import { describe, expect, it } from "vitest";

import {
  CalcInputError,
  dutyAcrossEthanol,
  dutyAcrossRpm,
  formatWarning,
  fuelBlend,
  FuelSystemInputSchema,
  pumpSupplyCurve,
  sizeFuelSystem,
  sizeParsedFuelSystem,
  sizingAnswer,
  type FuelSystemInput,
  type FuelSystemResult,
} from "@/lib/calc";

import { boostedSix, naFour } from "./fixtures";

const withInput = (patch: (i: FuelSystemInput) => void): FuelSystemInput => {
  const copy = structuredClone(boostedSix);
  patch(copy);
  return copy;
};

/** Every number anywhere in a result is finite. */
function assertAllFinite(value: unknown, path = "result"): void {
  if (typeof value === "number") {
    expect(Number.isFinite(value), `${path} = ${value}`).toBe(true);
  } else if (Array.isArray(value)) value.forEach((v, i) => assertAllFinite(v, `${path}[${i}]`));
  else if (value && typeof value === "object")
    for (const [k, v] of Object.entries(value)) assertAllFinite(v, `${path}.${k}`);
}

describe("sizeFuelSystem, worked by hand with the formulas of calc-spec §2–§4", () => {
  const r = sizeFuelSystem(boostedSix);

  it("turns wheel power into crank power and fuel mass flow at the richest blend", () => {
    const crank = 450 / 0.85;
    expect(r.crankPowerKw).toBeCloseTo(crank, 9);
    // BSFC at E85 boosted = 0.80 lb/(hp·h) (common practice, no source) = 0.8 × 608.277 g/kWh.
    expect(r.blend.rich.bsfcGPerKwh).toBeCloseTo(0.8 * 608.2774, 2);
    expect(r.fuelMassFlowGPerMin).toBeCloseTo((crank * r.blend.rich.bsfcGPerKwh) / 60, 9);
  });

  it("sizes the injectors at the base pressure (boost-referenced) across the blend range", () => {
    const rho = fuelBlend(85).densityKgPerL;
    const qOp = 1300 * Math.sqrt(400 / 300);
    expect(r.injector.differentialPressureKpa).toBe(400);
    expect(r.injector.flowAtOperatingCcPerMin).toBeCloseTo(qOp, 9);
    expect(r.injector.dutyPct).toBeCloseTo((100 * r.fuelMassFlowGPerMin) / (rho * 6 * qOp), 9);
    expect(r.blend.lean.dutyPct).toBeLessThan(r.blend.rich.dutyPct);
    const reqOp = r.fuelMassFlowGPerMin / (rho * 6 * 0.8);
    expect(r.injector.requiredRatedFlowCcPerMin).toBeCloseTo(reqOp * Math.sqrt(300 / 400), 9);
  });

  it("gives the pulse width at redline as duty × cycle plus the dead time", () => {
    const pw = r.injector.pulseWidthRedline;
    expect(pw.cycleMs).toBeCloseTo(120000 / 7000, 12);
    expect(pw.effectiveMs).toBeCloseTo((r.injector.dutyPct / 100) * pw.cycleMs, 12);
    // At the injectors' voltage (schema default 14 V, not the pump's 13 V), 400 kPa in the
    // fixture's table: the 14 V row → 0.975 ms (docs/calculations.md §3.5; by hand).
    expect(r.injector.voltage).toBe(14);
    expect(pw.deadTimeMs).toBeCloseTo(0.975, 12);
    expect(pw.commandedMs).toBeCloseTo(pw.effectiveMs + 0.975, 12);
    // At 13 V at the injectors: rows at 12 V → 1.2, at 14 V → 0.975; midway → 1.0875 (by hand).
    const at13 = sizeFuelSystem(withInput((i) => (i.electrical.injectorVoltage = 13)));
    expect(at13.injector.pulseWidthRedline.deadTimeMs).toBeCloseTo(1.0875, 12);
    // Pump wiring lowers the pump's voltage, never the injectors' dead time.
    const wired = sizeFuelSystem(
      withInput(
        (i) =>
          (i.electrical.wiring = {
            sourceVoltage: 14,
            gaugeAwg: 14,
            roundTripLengthM: 10,
            currentA: 15,
          }),
      ),
    );
    expect(wired.pump.voltageUsed).toBeLessThan(14);
    expect(wired.injector.pulseWidthRedline.deadTimeMs).toBeCloseTo(0.975, 12);
  });

  it("works the pump against rail + boost + losses", () => {
    expect(r.pump.railPressureKpa).toBe(550);
    expect(r.pump.outletPressureKpa).toBeCloseTo(550 + 10 + r.lines.feed!.pressureDropKpa, 1);
    expect(r.pump.demandLPerH).toBeCloseTo(
      (r.fuelMassFlowGPerMin / fuelBlend(85).densityKgPerL) * 0.06,
      9,
    );
    expect(r.pump.marginPct).toBeCloseTo((r.pump.supplyLPerH / r.pump.demandLPerH - 1) * 100, 9);
  });

  it("sizes the return for nearly the whole pump flow at idle", () => {
    expect(r.pump.idleReturnFlowLPerH).toBeGreaterThan(0.95 * r.pump.idleSupplyLPerH);
    expect(r.lines.return!.flowLPerH).toBeCloseTo(r.pump.idleReturnFlowLPerH, 9);
    expect(r.warnings.map((w) => w.code)).toContain("return-line-drop");
    expect(r.lines.recommendedReturnDash).toBeGreaterThan(6);
  });

  it("names what limits the power ceiling", () => {
    expect(r.powerCeiling.kw).toBe(Math.min(r.injector.powerCeilingKw, r.pump.powerCeilingKw));
    expect(r.powerCeiling.limitedBy).toBe(
      r.pump.powerCeilingKw < r.injector.powerCeilingKw ? "pump" : "injectors",
    );
  });

  it("shows its working: each figure has a trace step", () => {
    const ids = r.trace.map((s) => s.id);
    for (const id of [
      "crank-power",
      "injector-dp",
      "duty-rich",
      "duty-lean",
      "pulse-redline",
      "pulse-idle",
      "pump-margin",
      "feed-drop",
    ])
      expect(ids).toContain(id);
    const duty = r.trace.find((s) => s.id === "duty-rich")!;
    expect(duty.value).toBe(r.injector.dutyPct);
    expect(duty.formula).toMatch(/fuel needed/);
  });

  it("with a fixed regulator loses the boost from ΔP and warns", () => {
    const fixed = sizeFuelSystem(
      withInput((i) => (i.regulator = { type: "fixed", basePressureKpa: 450 })),
    );
    expect(fixed.injector.differentialPressureKpa).toBe(300);
    expect(fixed.pump.railPressureKpa).toBe(450);
    expect(fixed.injector.pulseWidthIdle.differentialPressureKpa).toBeCloseTo(
      450 + (101.325 - 35),
      9,
    );
    expect(fixed.warnings.map((w) => w.code)).toContain("fixed-regulator-boost");
  });

  it("warns in bands as duty rises and says what to change", () => {
    const band = (kw: number) => sizeFuelSystem(withInput((i) => (i.target.powerKw = kw)));
    const duty = r.injector.dutyPct;
    // A duty near 90 % leaves almost no headroom (common practice, no source).
    const at = (pct: number) => band((450 * pct) / duty);
    expect(at(85).warnings.find((w) => w.code === "injector-duty-caution")?.severity).toBe(
      "caution",
    );
    expect(at(93).warnings.find((w) => w.code === "injector-duty-danger")?.severity).toBe("danger");
    const stat = at(120);
    expect(stat.injector.dutyBand).toBe("static");
    const w = stat.warnings.find((x) => x.code === "injector-static")!;
    // The rating to fit is a figure of the warning, formatted in the reader's units: the same
    // figure as the "Smallest rating" beside it (rounded once, where it is shown).
    expect(w.params.needRating).toEqual({
      value: stat.injector.requiredRatedFlowCcPerMin,
      quantity: "injectorFlow",
    });
    expect(formatWarning(w, "metric").fix).toMatch(/at least \d+ cc\/min at 300 kPa/);
    // 300 kPa = 43.5 psi (NIST SP 811 B.8: 1 psi = 6.894757 kPa).
    expect(formatWarning(w, "imperial").fix).toMatch(/at least \d+\.\d lb\/h at 43\.5 psi/);
    expect(formatWarning(w, "imperial").message).toMatch(
      /^The injectors would need \d+ % duty at E85/,
    );
  });

  it("warns when the pumps cannot keep up", () => {
    const weak = sizeFuelSystem(withInput((i) => (i.pumps[0]!.quantity = 1)));
    expect(weak.pump.supplyLPerH).toBeLessThan(weak.pump.demandLPerH);
    expect(weak.warnings.find((w) => w.code === "pump-short")?.severity).toBe("danger");
    expect(weak.powerCeiling.limitedBy).not.toBe("injectors");
  });

  it("uses the voltage left after the wiring when the wiring is given", () => {
    const wired = sizeFuelSystem(
      withInput(
        (i) =>
          (i.electrical = {
            voltageAtPump: 13,
            wiring: { sourceVoltage: 13.5, gaugeAwg: 16, roundTripLengthM: 8, currentA: 20 },
          }),
      ),
    );
    expect(wired.pump.voltageUsed).toBeCloseTo(13.5 - wired.pump.wireDropV!, 12);
    expect(wired.pump.supplyLPerH).toBeLessThan(r.pump.supplyLPerH + 60);
  });

  it("takes a given BSFC over the rules of thumb", () => {
    // Taken (by default) at the lowest ethanol of the range, E70; E85 scaled by the rules of
    // thumb' ratio, boosted 0.60 → 0.80 lb/(hp·h) linear in ethanol % (calc-spec §2, common
    // practice, no source): (0.6 + 0.2·85/85) ÷ (0.6 + 0.2·70/85).
    const given = sizeFuelSystem(withInput((i) => (i.fuel.bsfcGPerKwh = 400)));
    expect(given.blend.lean.bsfcGPerKwh).toBe(400);
    expect(given.blend.lean.bsfcSource).toBe("given");
    expect(given.blend.rich.bsfcSource).toBe("scaled");
    expect(given.blend.rich.bsfcGPerKwh).toBeCloseTo((400 * 0.8) / (0.6 + (0.2 * 70) / 85), 9);
    // Given at E85: E85 keeps it, E70 is scaled down by the same ratio.
    const atRich = sizeFuelSystem(
      withInput((i) => {
        i.fuel.bsfcGPerKwh = 400;
        i.fuel.bsfcEthanolVolPct = 85;
      }),
    );
    expect(atRich.blend.rich.bsfcGPerKwh).toBe(400);
    expect(atRich.blend.lean.bsfcGPerKwh).toBeCloseTo((400 * (0.6 + (0.2 * 70) / 85)) / 0.8, 9);
    expect(given.warnings.map((w) => w.code)).not.toContain("bsfc-rule-of-thumb");
  });

  it("sizes a small NA gasoline engine and reports the missing dead-time table", () => {
    const na = sizeFuelSystem(naFour);
    expect(na.injector.differentialPressureKpa).toBe(350);
    expect(na.injector.pulseWidthRedline.commandedMs).toBeNull();
    expect(na.warnings.map((w) => w.code)).toContain("dead-time-missing");
    expect(na.lines.assumedLengthM).toBe(5);
  });

  it("does not mutate its input", () => {
    const input = structuredClone(boostedSix);
    sizeFuelSystem(input);
    expect(input).toEqual(boostedSix);
  });
});

describe("sizeFuelSystem rejects bad input with the field and the reason", () => {
  it.each([
    [
      "regulator.basePressureKpa",
      (i: FuelSystemInput) => (i.regulator.basePressureKpa = 5000),
      /Base pressure must be between 50 and 1000 kPa/,
    ],
    ["injectors.count", (i: FuelSystemInput) => (i.injectors.count = -2), /Injector count/],
    [
      "engine.cylinders",
      (i: FuelSystemInput) => ((i.engine as { cylinders: unknown }).cylinders = "six"),
      /Cylinders must be a number/,
    ],
    [
      "fuel.ethanolMaxVolPct",
      (i: FuelSystemInput) => (i.fuel.ethanolMaxVolPct = 50),
      /not be below the lowest/,
    ],
    ["pumps", (i: FuelSystemInput) => (i.pumps = []), /at least one fuel pump/],
  ])("%s", (field, patch, message) => {
    try {
      sizeFuelSystem(withInput(patch));
      expect.unreachable("should have thrown");
    } catch (e) {
      expect(e).toBeInstanceOf(CalcInputError);
      expect((e as CalcInputError).field).toBe(field);
      expect((e as Error).message).toMatch(message);
    }
  });
  it("requires the base pressure of a fixed regulator to exceed the boost", () => {
    const r = FuelSystemInputSchema.safeParse(
      withInput((i) => (i.regulator = { type: "fixed", basePressureKpa: 180 })),
    );
    expect(r.success).toBe(false);
    expect(r.error!.issues[0]!.path).toEqual(["regulator", "basePressureKpa"]);
  });
  it("refuses NaN and Infinity", () => {
    expect(() => sizeFuelSystem(withInput((i) => (i.target.powerKw = Number.NaN)))).toThrow(
      CalcInputError,
    );
    expect(() =>
      sizeFuelSystem(withInput((i) => (i.engine.displacementL = Number.POSITIVE_INFINITY))),
    ).toThrow(CalcInputError);
  });
});

describe("sizeFuelSystem properties", () => {
  const base = FuelSystemInputSchema.parse(boostedSix);
  const size = (patch: (i: typeof base) => void): FuelSystemResult => {
    const i = structuredClone(base);
    patch(i);
    return sizeParsedFuelSystem(i);
  };

  it("duty rises with power and falls with more or bigger injectors", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 50, max: 1500, noNaN: true }),
        fc.double({ min: 1.01, max: 3, noNaN: true }),
        (kw, k) => {
          const a = size((i) => (i.target.powerKw = kw));
          expect(size((i) => (i.target.powerKw = kw * k)).injector.dutyPct).toBeGreaterThan(
            a.injector.dutyPct,
          );
          expect(
            size((i) => ((i.target.powerKw = kw), (i.injectors.ratedFlowCcPerMin *= k))).injector
              .dutyPct,
          ).toBeLessThan(a.injector.dutyPct);
          expect(
            size((i) => ((i.target.powerKw = kw), (i.injectors.count = 12))).injector.dutyPct,
          ).toBeCloseTo(a.injector.dutyPct / 2, 9);
        },
      ),
      { numRuns: 50 },
    );
  });

  it("sizing at the injectors' power ceiling gives the design duty", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 60, max: 90, noNaN: true }),
        fc.integer({ min: 0, max: 100 }),
        (designDutyPct, e) => {
          const first = size(
            (i) => (
              (i.limits = { ...i.limits!, designDutyPct }),
              (i.fuel.ethanolMinVolPct = e),
              (i.fuel.ethanolMaxVolPct = e),
              (i.target.measuredAt = "crank")
            ),
          );
          const again = size(
            (i) => (
              (i.limits = { ...i.limits!, designDutyPct }),
              (i.fuel.ethanolMinVolPct = e),
              (i.fuel.ethanolMaxVolPct = e),
              (i.target.measuredAt = "crank"),
              (i.target.powerKw = first.injector.powerCeilingKw)
            ),
          );
          expect(again.injector.dutyPct).toBeCloseTo(designDutyPct, 6);
        },
      ),
      { numRuns: 50 },
    );
  });

  it("never returns NaN or Infinity for any input the schema accepts", () => {
    // Curves whose flow falls as pressure rises (the schema refuses the others, point named).
    const curvePoints = fc
      .uniqueArray(
        fc.record({
          pressureKpa: fc.double({ min: 0, max: 1500, noNaN: true }),
          flowLPerH: fc.double({ min: 0, max: 3000, noNaN: true }),
        }),
        { minLength: 2, maxLength: 6, selector: (p) => Math.round(p.pressureKpa) },
      )
      .map((pts) => {
        const ps = pts.map((p) => p.pressureKpa).sort((a, b) => a - b);
        const fs = pts.map((p) => p.flowLPerH).sort((a, b) => b - a);
        return ps.map((pressureKpa, i) => ({ pressureKpa, flowLPerH: fs[i]! }));
      });
    const input = fc.record({
      engine: fc.record({
        cylinders: fc.integer({ min: 1, max: 16 }),
        displacementL: fc.double({ min: 0.1, max: 20, noNaN: true }),
        aspiration: fc.constantFrom("na", "turbo", "supercharged"),
        redlineRpm: fc.double({ min: 3001, max: 20000, noNaN: true }),
        idleRpm: fc.double({ min: 300, max: 3000, noNaN: true }),
        maxBoostKpa: fc.double({ min: 0, max: 500, noNaN: true }),
      }),
      target: fc.record({
        powerKw: fc.double({ min: 1, max: 5000, noNaN: true }),
        measuredAt: fc.constantFrom("wheel", "crank"),
        drivetrainLossPct: fc.double({ min: 0, max: 50, noNaN: true }),
      }),
      fuel: fc.record({
        ethanolMinVolPct: fc.double({ min: 0, max: 50, noNaN: true }),
        ethanolMaxVolPct: fc.double({ min: 50, max: 100, noNaN: true }),
        targetLambda: fc.option(fc.double({ min: 0.6, max: 1.3, noNaN: true }), { nil: undefined }),
      }),
      injectors: fc.record({
        count: fc.integer({ min: 1, max: 32 }),
        ratedFlowCcPerMin: fc.double({ min: 20, max: 10000, noNaN: true }),
        ratedPressureKpa: fc.double({ min: 100, max: 1000, noNaN: true }),
        minPulseWidthMs: fc.double({ min: 0.1, max: 10, noNaN: true }),
      }),
      regulator: fc.record({
        type: fc.constantFrom("boost-referenced", "fixed"),
        basePressureKpa: fc.double({ min: 50, max: 1000, noNaN: true }),
      }),
      pumps: fc.array(
        fc.record({
          quantity: fc.integer({ min: 1, max: 4 }),
          curves: fc.array(
            fc.record({
              voltage: fc.double({ min: 6, max: 20, noNaN: true }),
              points: curvePoints,
            }),
            { minLength: 1, maxLength: 3 },
          ),
        }),
        { minLength: 1, maxLength: 3 },
      ),
      electrical: fc.record({ voltageAtPump: fc.double({ min: 6, max: 20, noNaN: true }) }),
      lines: fc.record({
        feed: fc.record({
          insideDiameterMm: fc.double({ min: 2, max: 40, noNaN: true }),
          lengthM: fc.double({ min: 0.1, max: 30, noNaN: true }),
        }),
        return: fc.record({
          insideDiameterMm: fc.double({ min: 2, max: 40, noNaN: true }),
          lengthM: fc.double({ min: 0.1, max: 30, noNaN: true }),
        }),
      }),
    });
    let sized = 0;
    fc.assert(
      fc.property(input, (raw) => {
        const parsed = FuelSystemInputSchema.safeParse(raw);
        if (!parsed.success) return; // the schema refused it: the API answers 4xx
        sized++;
        const r = sizeParsedFuelSystem(parsed.data);
        assertAllFinite(r);
        assertAllFinite(
          dutyAcrossRpm(r, parsed.data.engine.idleRpm, parsed.data.engine.redlineRpm),
        );
        assertAllFinite(dutyAcrossEthanol(parsed.data, r.crankPowerKw));
        assertAllFinite(pumpSupplyCurve(parsed.data, r));
      }),
      { numRuns: Number(process.env.FC_RUNS ?? 300) },
    );
    expect(sized).toBeGreaterThan(50);
  }, 600_000);
});

describe("regressions found by the property tests", () => {
  it("a pump curve of denormal flows gives finite figures", () => {
    const r = sizeFuelSystem({
      engine: {
        cylinders: 1,
        displacementL: 0.1,
        aspiration: "na",
        redlineRpm: 3001,
        idleRpm: 300,
        maxBoostKpa: 0,
      },
      target: { powerKw: 1, measuredAt: "wheel", drivetrainLossPct: 0 },
      fuel: { ethanolMinVolPct: 0, ethanolMaxVolPct: 50 },
      injectors: { count: 1, ratedFlowCcPerMin: 20, ratedPressureKpa: 100, minPulseWidthMs: 0.1 },
      regulator: { type: "boost-referenced", basePressureKpa: 50 },
      pumps: [
        {
          quantity: 1,
          curves: [
            {
              voltage: 6,
              points: [
                { pressureKpa: 50.00000002829482, flowLPerH: 2e-323 },
                { pressureKpa: 0, flowLPerH: 1.5719545166619716e-308 },
              ],
            },
          ],
        },
      ],
      electrical: { voltageAtPump: 6 },
      lines: {
        feed: { insideDiameterMm: 2, lengthM: 0.1 },
        return: { insideDiameterMm: 2, lengthM: 0.1 },
      },
    } as FuelSystemInput);
    assertAllFinite(r);
  });
});

describe("chart series", () => {
  const parsed = FuelSystemInputSchema.parse(boostedSix);
  const r = sizeParsedFuelSystem(parsed);
  it("the API answer is the sizing plus the three series over the engine's own rpm span (common practice, no source)", () => {
    const a = sizingAnswer(parsed);
    expect(a.result).toEqual(r);
    expect(a.charts.dutyVsRpm[0]!.rpm).toBe(parsed.engine.idleRpm);
    expect(a.charts.dutyVsRpm.at(-1)!.rpm).toBe(parsed.engine.redlineRpm);
    expect(a.charts.dutyVsEthanol).toEqual(dutyAcrossEthanol(parsed, r.crankPowerKw));
    expect(a.charts.pumpSupply).toEqual(pumpSupplyCurve(parsed, r));
  });
  it("duty across rpm ends at the target duty at redline", () => {
    const s = dutyAcrossRpm(r, 1000, 7000, 7);
    expect(s).toHaveLength(7);
    expect(s[6]!.dutyPctRich).toBeCloseTo(r.injector.dutyPct, 9);
  });
  it("duty across ethanol rises from E0 to E100", () => {
    const s = dutyAcrossEthanol(parsed, r.crankPowerKw, 11);
    expect(s[0]!.ethanolVolPct).toBe(0);
    expect(s[10]!.dutyPct).toBeGreaterThan(s[0]!.dutyPct);
    expect(s.find((p) => p.ethanolVolPct === 80)).toBeDefined();
  });
  it("pump supply falls with pressure", () => {
    const s = pumpSupplyCurve(parsed, r, 10);
    expect(s[9]!.supplyLPerH).toBeLessThan(s[2]!.supplyLPerH);
  });
});
