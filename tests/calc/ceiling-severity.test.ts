import { describe, expect, it } from "vitest";

import { sizeFuelSystem, type FuelSystemInput } from "@/lib/calc";

import { boostedSix, naFour } from "./fixtures";

const LIMITER_CODES = {
  injectors: ["injector-static", "injector-duty-danger", "injector-duty-caution"],
  pump: ["pump-short", "pump-margin-low"],
  "feed-line": ["feed-line-drop"],
} as const;

describe("powerCeiling.severity: one severity for the ceiling everywhere (docs/calculations.md §7.2)", () => {
  const builds: FuelSystemInput[] = [];
  for (const base of [boostedSix, naFour])
    for (const k of [0.5, 0.9, 1, 1.1, 1.2, 1.35, 1.5, 2]) {
      builds.push({ ...base, target: { ...base.target, powerKw: base.target.powerKw * k } });
      builds.push({
        ...base,
        target: { ...base.target, powerKw: base.target.powerKw * k },
        limits: { designDutyPct: 70, dutyCautionPct: 85, dutyDangerPct: 95, minPumpMarginPct: 10 },
      });
    }

  it("is the limiting figure's own severity, or a note when the limiter is within its bands", () => {
    const seen = new Set<string>();
    for (const input of builds) {
      const r = sizeFuelSystem(input);
      const { severity, limitedBy, kw } = r.powerCeiling;
      seen.add(severity);
      const note = r.warnings.filter((w) => w.code === "ceiling-below-target");
      const limiter = r.warnings.filter((w) =>
        (LIMITER_CODES[limitedBy] as readonly string[]).includes(w.code),
      );
      if (severity === "ok") {
        expect(kw).toBeGreaterThanOrEqual(r.crankPowerKw);
        expect(note).toHaveLength(0);
      } else if (severity === "info") {
        expect(kw).toBeLessThan(r.crankPowerKw);
        expect(note.map((w) => w.severity)).toEqual(["info"]);
        expect(limiter).toHaveLength(0);
      } else {
        // Caution or danger: exactly the limiter's warning says it, at that severity.
        expect(note).toHaveLength(0);
        expect(limiter.map((w) => w.severity)).toEqual([severity]);
      }
    }
    // Not vacuous: the builds reach every verdict.
    expect([...seen].sort()).toEqual(["caution", "danger", "info", "ok"]);
  });
});
