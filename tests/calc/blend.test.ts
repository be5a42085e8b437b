import fc from "fast-check";
import { describe, expect, it } from "vitest";

import {
  CalcInputError,
  ethanolFromFlexSensorHz,
  fillSplit,
  flexSensorHzFromEthanol,
  mixFuels,
  volumeToAdd,
} from "@/lib/calc";

describe("mixFuels", () => {
  it("adds volumes and ethanol volumes", () => {
    // Volume balance (calc-spec §1), by hand: 20 L E10 + 20 L E85 = 40 L E47.5.
    expect(
      mixFuels([
        { volumeL: 20, ethanolVolPct: 10 },
        { volumeL: 20, ethanolVolPct: 85 },
      ]),
    ).toEqual({ volumeL: 40, ethanolVolPct: 47.5 });
  });
  it("lies between its parts and conserves volume (property)", () => {
    const part = fc.record({
      volumeL: fc.double({ min: 0.01, max: 500, noNaN: true }),
      ethanolVolPct: fc.double({ min: 0, max: 100, noNaN: true }),
    });
    fc.assert(
      fc.property(fc.array(part, { minLength: 1, maxLength: 8 }), (parts) => {
        const m = mixFuels(parts);
        const es = parts.map((p) => p.ethanolVolPct);
        expect(m.ethanolVolPct).toBeGreaterThanOrEqual(Math.min(...es) - 1e-9);
        expect(m.ethanolVolPct).toBeLessThanOrEqual(Math.max(...es) + 1e-9);
        expect(m.volumeL).toBeCloseTo(
          parts.reduce((s, p) => s + p.volumeL, 0),
          9,
        );
      }),
    );
  });
  it("does not mutate its input", () => {
    const parts = [{ volumeL: 10, ethanolVolPct: 85 }];
    const copy = structuredClone(parts);
    mixFuels(parts);
    expect(parts).toEqual(copy);
  });
  it("refuses an empty mix or negative volumes", () => {
    expect(() => mixFuels([])).toThrow(CalcInputError);
    expect(() => mixFuels([{ volumeL: 0, ethanolVolPct: 10 }])).toThrow(/no volume/);
    expect(() => mixFuels([{ volumeL: -5, ethanolVolPct: 10 }])).toThrow(/Volume/);
  });
});

describe("volumeToAdd", () => {
  it("finds the litres of E85 to bring a tank of E10 to E50", () => {
    // By hand: x = V(t − a)/(b − t) = 20·40/35 = 22.857 L.
    const r = volumeToAdd({
      tankVolumeL: 20,
      tankEthanolVolPct: 10,
      addedEthanolVolPct: 85,
      targetEthanolVolPct: 50,
    });
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.volumeL).toBeCloseTo((20 * 40) / 35, 9);
  });
  it("reaches the target when the result is mixed back (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 80, noNaN: true }),
        fc.integer({ min: 0, max: 40 }),
        fc.integer({ min: 60, max: 100 }),
        fc.integer({ min: 41, max: 59 }),
        (V, a, b, t) => {
          const r = volumeToAdd({
            tankVolumeL: V,
            tankEthanolVolPct: a,
            addedEthanolVolPct: b,
            targetEthanolVolPct: t,
          });
          expect(r.ok).toBe(true);
          if (r.ok)
            expect(
              mixFuels([
                { volumeL: V, ethanolVolPct: a },
                { volumeL: r.volumeL, ethanolVolPct: b },
              ]).ethanolVolPct,
            ).toBeCloseTo(t, 6);
        },
      ),
    );
  });
  it("explains a target that adding this fuel cannot reach", () => {
    const r = volumeToAdd({
      tankVolumeL: 20,
      tankEthanolVolPct: 10,
      addedEthanolVolPct: 30,
      targetEthanolVolPct: 50,
    });
    expect(r).toMatchObject({ ok: false, code: "target-unreachable" });
    if (!r.ok) expect(r.message).toMatch(/E50 cannot be reached/);
  });
  it("says how much to drain first when the fill would overflow", () => {
    // By hand: keep 60/(1 + 40/35) = 28 L of E10, drain 12 L, add 32 L of E85 → 60 L of E50.
    const r = volumeToAdd({
      tankVolumeL: 40,
      tankEthanolVolPct: 10,
      addedEthanolVolPct: 85,
      targetEthanolVolPct: 50,
      tankCapacityL: 60,
    });
    expect(r).toMatchObject({ ok: false, code: "overflow" });
    if (!r.ok) {
      expect(r.drainL).toBeCloseTo(12, 9);
      expect(r.thenAddL).toBeCloseTo(32, 9);
      expect(r.message).toContain("Drain 12.0 L first");
      expect(
        mixFuels([
          { volumeL: 28, ethanolVolPct: 10 },
          { volumeL: r.thenAddL!, ethanolVolPct: 85 },
        ]).ethanolVolPct,
      ).toBeCloseTo(50, 9);
    }
  });
  it("needs nothing when the tank is already on target", () => {
    expect(
      volumeToAdd({
        tankVolumeL: 30,
        tankEthanolVolPct: 50,
        addedEthanolVolPct: 85,
        targetEthanolVolPct: 50,
      }),
    ).toMatchObject({ ok: true, volumeL: 0 });
  });
  it("refuses a tank said to hold more than it can", () => {
    expect(
      volumeToAdd({
        tankVolumeL: 70,
        tankEthanolVolPct: 10,
        addedEthanolVolPct: 85,
        targetEthanolVolPct: 50,
        tankCapacityL: 60,
      }),
    ).toMatchObject({ ok: false, code: "tank-over-capacity" });
  });
  it("throws for non-numbers rather than answering NaN", () => {
    expect(() =>
      volumeToAdd({
        tankVolumeL: Number.NaN,
        tankEthanolVolPct: 10,
        addedEthanolVolPct: 85,
        targetEthanolVolPct: 50,
      }),
    ).toThrow(CalcInputError);
  });
});

describe("fillSplit", () => {
  it("splits a 50 L fill of E85 and E10 to reach E40", () => {
    // By hand: a = V(t − eB)/(eA − eB) = 50·30/75 = 20 L of E85.
    expect(
      fillSplit({
        fillVolumeL: 50,
        fuelAEthanolVolPct: 85,
        fuelBEthanolVolPct: 10,
        targetEthanolVolPct: 40,
      }),
    ).toMatchObject({ ok: true, fuelAL: 20, fuelBL: 30 });
  });
  it("counts what the tank already holds", () => {
    const r = fillSplit({
      fillVolumeL: 40,
      fuelAEthanolVolPct: 85,
      fuelBEthanolVolPct: 10,
      targetEthanolVolPct: 60,
      tankVolumeL: 20,
      tankEthanolVolPct: 30,
    });
    expect(r.ok).toBe(true);
    if (r.ok)
      expect(
        mixFuels([
          { volumeL: 20, ethanolVolPct: 30 },
          { volumeL: r.fuelAL, ethanolVolPct: 85 },
          { volumeL: r.fuelBL, ethanolVolPct: 10 },
        ]).ethanolVolPct,
      ).toBeCloseTo(60, 9);
  });
  it("explains an unreachable target with the closest it can do", () => {
    const r = fillSplit({
      fillVolumeL: 10,
      fuelAEthanolVolPct: 85,
      fuelBEthanolVolPct: 10,
      targetEthanolVolPct: 80,
      tankVolumeL: 40,
      tankEthanolVolPct: 10,
    });
    expect(r).toMatchObject({ ok: false, code: "target-unreachable" });
    if (!r.ok) expect(r.closestEthanolVolPct).toBeCloseTo(25, 9);
  });
});

describe("flex-fuel sensor", () => {
  it("reads 50 Hz as E0, 150 Hz as E100 and 135 Hz as E85", () => {
    // Flex-fuel sensor convention: 50–150 Hz linear (common practice; a 1993 FFV service manual).
    expect(ethanolFromFlexSensorHz(50)).toBe(0);
    expect(ethanolFromFlexSensorHz(150)).toBe(100);
    expect(ethanolFromFlexSensorHz(135)).toBe(85);
    expect(flexSensorHzFromEthanol(10)).toBe(60);
  });
  it("calls a reading outside 50–150 Hz a fault", () => {
    expect(() => ethanolFromFlexSensorHz(170)).toThrow(/sensor fault/);
  });
});
