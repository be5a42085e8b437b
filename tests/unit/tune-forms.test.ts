import { describe, expect, it } from "vitest";

import {
  DEFAULT_TUNE_LIMITS,
  mergeTuneLimits,
  nextOverride,
  TuneLimitsSchema,
  type TuneLimits,
} from "@/lib/calc/tune";
import {
  limitsFromText,
  limitsText,
  limitsTextChanged,
  limitsTextErrors,
} from "@/lib/tune/limits-form";
import { pullFromText, pullText, pullTextErrors } from "@/lib/tune/pull-form";

/**
 * The tune session's editors in the reader's units: what a tuner sees in the fields, and what a
 * save sends back. Conversions are NIST SP 811's (1 psi = 6.894757 kPa; °F = °C × 1.8 + 32).
 */
describe("the limits editor's fields", () => {
  it("shows the library's limits in psi and °F, and an unchanged save sends them back exactly (60 kPa, not 59.98)", () => {
    const shown = limitsText(DEFAULT_TUNE_LIMITS, "imperial");
    // 60 kPa = 8.7 psi, 150 kPa = 21.8 psi (NIST SP 811 B.8, rounded to the registry's 0.1 psi).
    expect(shown.rows.map((r) => r.boost)).toEqual(["0", "8.7", "21.8", "36.3"]);
    // 950 °C = 1742 °F; 80 °C apart = 144 °F apart (× 1.8).
    expect(shown.single.maxEgtC).toBe("1742");
    expect(shown.single.maxEgtSpreadC).toBe("144");
    expect(shown.single.maxTurboRpm).toBe("");
    const sent = limitsFromText(shown, "imperial", DEFAULT_TUNE_LIMITS);
    expect(sent).toEqual(DEFAULT_TUNE_LIMITS);
    expect(limitsTextChanged(shown, limitsText(DEFAULT_TUNE_LIMITS, "imperial"))).toBe(false);
  });

  it("keeps figures with more digits than shown when left alone, in both unit systems", () => {
    const odd: TuneLimits = {
      ...DEFAULT_TUNE_LIMITS,
      lambdaTargets: [
        { boostKpa: 0, lambda: 0.905 },
        { boostKpa: 61.37, lambda: 0.8612 },
      ],
      maxEgtC: 937.4,
      maxBackPressureRatio: 1.875,
    };
    for (const units of ["metric", "imperial"] as const)
      expect(limitsFromText(limitsText(odd, units), units, odd), units).toEqual(odd);
  });

  it("converts a typed figure back to canonical units, one digit past metric", () => {
    const shown = limitsText(DEFAULT_TUNE_LIMITS, "imperial");
    shown.rows[1]!.boost = "10";
    shown.single.maxEgtC = "1700";
    const sent = limitsFromText(shown, "imperial", DEFAULT_TUNE_LIMITS) as TuneLimits;
    // 10 psi = 68.95 kPa; 1700 °F = 926.67 °C (NIST SP 811 B.8 and B.9).
    expect(sent.lambdaTargets[1]!.boostKpa).toBe(68.9);
    expect(sent.maxEgtC).toBe(926.7);
    expect(TuneLimitsSchema.safeParse(sent).success).toBe(true);
  });

  it("says a bad field in the reader's units before anything is sent", () => {
    const shown = limitsText(DEFAULT_TUNE_LIMITS, "imperial");
    shown.single.maxEgtC = "3000";
    shown.rows[0]!.lambda = "lean";
    shown.single.maxTurboRpm = "";
    const errors = limitsTextErrors(shown, "imperial");
    // 300–1200 °C is 572–2192 °F.
    expect(errors["limits.maxEgtC"]).toBe("Maximum EGT must be between 572 °F and 2192 °F");
    expect(errors["limits.lambdaTargets.0.lambda"]).toBe("Target lambda must be a number");
    expect(errors).not.toHaveProperty("limits.maxTurboRpm");
    expect(limitsTextErrors(limitsText(DEFAULT_TUNE_LIMITS, "imperial"), "imperial")).toEqual({});
    expect(limitsTextErrors(limitsText(DEFAULT_TUNE_LIMITS, "metric"), "metric")).toEqual({});
  });
});

describe("a build's own limits over the shop's", () => {
  const shop: TuneLimits = { ...DEFAULT_TUNE_LIMITS, maxDutyPct: 85 };

  it("keeps only the fields that stand apart from the shop's", () => {
    expect(nextOverride(shop, null, { ...shop, maxEgtC: 900 })).toEqual({ maxEgtC: 900 });
    // Back to the shop's value: the field follows the shop again; nothing of its own: null.
    expect(nextOverride(shop, { maxEgtC: 900 }, { ...shop, maxEgtC: 950 })).toBeNull();
    expect(mergeTuneLimits(shop, { maxEgtC: 900 })).toEqual({ ...shop, maxEgtC: 900 });
  });

  it("an unchanged save keeps what the build had, field for field", () => {
    const own = { maxDutyPct: 85, maxEgtC: 900 };
    const inForce = mergeTuneLimits(shop, own);
    expect(nextOverride(shop, own, inForce)).toEqual(own);
    expect(nextOverride(shop, null, shop)).toBeNull();
  });
});

describe("the pull editor's fields", () => {
  const pull = {
    ethanolPct: 85,
    boostTargetKpa: 100,
    notes: "E85, second gear",
    powerMeasuredAt: "wheel" as const,
  };

  it("shows the boost target in psi and saves it back exactly when left alone", () => {
    const t = pullText(pull, "imperial");
    // 100 kPa = 14.5 psi (NIST SP 811 B.8).
    expect(t).toEqual({
      ethanolPct: "85",
      boostTarget: "14.5",
      notes: "E85, second gear",
      powerMeasuredAt: "wheel",
    });
    expect(pullFromText(t, "imperial", pull)).toEqual(pull);
    expect(pullFromText(pullText(pull, "metric"), "metric", pull)).toEqual(pull);
  });

  it("a blank boost target is not stated; errors speak the reader's units", () => {
    expect(
      pullFromText({ ...pullText(pull, "imperial"), boostTarget: " " }, "imperial", pull)
        .boostTargetKpa,
    ).toBeNull();
    // 500 kPa = 72.5 psi.
    expect(
      pullTextErrors({ ...pullText(pull, "imperial"), boostTarget: "90" }, "imperial"),
    ).toEqual({ boostTargetKpa: "Boost target must be between 0.0 psi and 72.5 psi" });
    expect(pullTextErrors({ ...pullText(pull, "metric"), ethanolPct: "120" }, "metric")).toEqual({
      ethanolPct: "Ethanol content must be between 0 and 100 %",
    });
  });
});
