import { describe, expect, it } from "vitest";

import {
  DEFAULT_BSFC,
  DEFAULT_DRIVETRAIN_LOSS_PCT,
  DEFAULT_LIMITS,
  ETHANOL,
  fuelBlend,
  FuelSystemInputSchema,
  GASOLINE,
  sizeParsedFuelSystem,
  type FuelSystemInput,
} from "@/lib/calc";
import {
  effectiveInputs,
  LIBRARY_SIZING_SETTINGS,
  parsedEffectiveInputs,
  readSizingSettings,
  sizingSettingsOf,
  type ShopSizingColumns,
  type SizingSettings,
} from "@/lib/sizing/effective-inputs";

import { boostedSix } from "../calc/fixtures";

/** A shop whose every sizing setting differs from the library's (the values are inputs, not check values). */
const SHOP: ShopSizingColumns = {
  designDutyPct: 75,
  dutyCautionPct: 75,
  dutyDangerPct: 88,
  minPumpMarginPct: 40,
  maxLineDropKpa: 10,
  bsfcGasolineNa: 310,
  bsfcGasolineBoosted: 370,
  bsfcE85Na: 430,
  bsfcE85Boosted: 520,
  lossManualPct: 11,
  lossAutomaticPct: 18,
  lossAwdPct: 24,
  gasolineDensityKgPerL: 0.74,
  gasolineStoichAfr: 14.6,
  ethanolDensityKgPerL: 0.79,
  ethanolStoichAfr: 8.95,
};
const shop = sizingSettingsOf(SHOP);

/** The build of the fixtures without the values a shop may give. */
const bare = (): FuelSystemInput => {
  const b = structuredClone(boostedSix);
  delete b.target.drivetrainLossPct;
  return b;
};

describe("sizingSettingsOf", () => {
  it("maps the settings row to the sizing's settings, null fuel properties left to the library", () => {
    expect(shop.limits).toEqual({
      designDutyPct: 75,
      dutyCautionPct: 75,
      dutyDangerPct: 88,
      minPumpMarginPct: 40,
      maxLineDropKpa: 10,
    });
    expect(shop.bsfc).toEqual({
      gasolineNaGPerKwh: 310,
      gasolineBoostedGPerKwh: 370,
      e85NaGPerKwh: 430,
      e85BoostedGPerKwh: 520,
      referenceLambdaNa: DEFAULT_BSFC.referenceLambdaNa,
      referenceLambdaBoosted: DEFAULT_BSFC.referenceLambdaBoosted,
    });
    expect(shop.drivetrainLossPct).toEqual({ manual: 11, automatic: 18, awd: 24 });
    expect(
      sizingSettingsOf({ ...SHOP, gasolineDensityKgPerL: null, ethanolStoichAfr: null }).fuel,
    ).toEqual({ gasoline: { stoichAfr: 14.6 }, ethanol: { densityKgPerL: 0.79 } });
  });

  it("a revision without stored settings reads as the library's defaults; a stored copy reads back", () => {
    expect(readSizingSettings(null)).toEqual(LIBRARY_SIZING_SETTINGS);
    expect(readSizingSettings(undefined)).toBe(LIBRARY_SIZING_SETTINGS);
    expect(readSizingSettings(JSON.parse(JSON.stringify(shop)))).toEqual(shop);
    expect(() => readSizingSettings({ limits: {} })).toThrow();
  });
});

describe("effectiveInputs: build value > shop setting > library default", () => {
  it("fills every value the build leaves out from the shop's settings", () => {
    const e = effectiveInputs(shop, bare());
    expect(e.limits).toEqual(shop.limits);
    expect(e.fuel.bsfcDefaults).toEqual(shop.bsfc);
    // No drive type named: manual.
    expect(e.target).toMatchObject({ driveType: "manual", drivetrainLossPct: 11 });
    expect(e.fuel.properties).toEqual({
      gasoline: { densityKgPerL: 0.74, stoichAfr: 14.6 },
      ethanol: { densityKgPerL: 0.79, stoichAfr: 8.95 },
    });
  });

  it("takes the shop's loss for the build's drive type", () => {
    for (const [driveType, loss] of [
      ["manual", 11],
      ["automatic", 18],
      ["awd", 24],
    ] as const) {
      const b = bare();
      b.target.driveType = driveType;
      expect(effectiveInputs(shop, b).target.drivetrainLossPct).toBe(loss);
    }
  });

  it("keeps every value the build states, field by field", () => {
    const b = bare();
    b.target.driveType = "awd";
    b.target.drivetrainLossPct = 9;
    b.limits = { designDutyPct: 85, minPumpMarginPct: 30 };
    b.fuel.bsfcDefaults = { ...DEFAULT_BSFC, e85BoostedGPerKwh: 500 };
    b.fuel.properties = { gasoline: { densityKgPerL: 0.76 } };
    const e = effectiveInputs(shop, b);
    expect(e.target.drivetrainLossPct).toBe(9);
    expect(e.limits).toEqual({ ...shop.limits, designDutyPct: 85, minPumpMarginPct: 30 });
    expect(e.fuel.bsfcDefaults?.e85BoostedGPerKwh).toBe(500);
    expect(e.fuel.properties).toEqual({
      gasoline: { densityKgPerL: 0.76, stoichAfr: 14.6 },
      ethanol: { densityKgPerL: 0.79, stoichAfr: 8.95 },
    });
  });

  it("leaves to the library what neither gives: the library's settings size exactly as lib/calc alone", () => {
    const e = effectiveInputs(LIBRARY_SIZING_SETTINGS, bare());
    expect(e.limits).toEqual(DEFAULT_LIMITS);
    expect(e.target.drivetrainLossPct).toBe(DEFAULT_DRIVETRAIN_LOSS_PCT);
    expect(e.fuel.properties).toBeUndefined();
    // Builds sized before shop settings applied (no stored settings) keep their figures.
    const plain = sizeParsedFuelSystem(FuelSystemInputSchema.parse(bare()));
    const viaLibrary = sizeParsedFuelSystem(parsedEffectiveInputs(LIBRARY_SIZING_SETTINGS, bare()));
    expect(viaLibrary).toEqual(plain);
  });

  it("changes neither of its arguments", () => {
    const b = bare();
    const before = structuredClone(b);
    const s: SizingSettings = structuredClone(shop);
    effectiveInputs(s, b);
    expect(b).toEqual(before);
    expect(s).toEqual(shop);
  });
});

describe("each shop setting moves the figure it should", () => {
  const size = (s: SizingSettings, b = bare()) => sizeParsedFuelSystem(parsedEffectiveInputs(s, b));
  const lib = size(LIBRARY_SIZING_SETTINGS);
  const withShop = (patch: (s: SizingSettings) => void) => {
    const s = structuredClone(LIBRARY_SIZING_SETTINGS);
    patch(s);
    return size(s);
  };

  it("design duty: the required injector rating (∝ 1 / design duty)", () => {
    const r = withShop((s) => (s.limits.designDutyPct = 75));
    expect(r.limits.designDutyPct).toBe(75);
    // Q_req = ṁ / (ρ · n · duty): 80 % → 75 % raises it by 80/75 (calc-spec §3).
    expect(
      r.injector.requiredRatedFlowCcPerMin / lib.injector.requiredRatedFlowCcPerMin,
    ).toBeCloseTo(80 / 75, 9);
  });

  it("caution and danger levels: the duty band and its warning", () => {
    const duty = Math.max(lib.blend.lean.dutyPct, lib.blend.rich.dutyPct);
    const caution = withShop((s) => (s.limits.dutyCautionPct = Math.floor(duty) - 1));
    expect(caution.injector.dutyBand).toBe("caution");
    expect(caution.warnings.map((w) => w.code)).toContain("injector-duty-caution");
    const danger = withShop((s) => {
      s.limits.dutyCautionPct = Math.floor(duty) - 2;
      s.limits.dutyDangerPct = Math.floor(duty) - 1;
    });
    expect(danger.injector.dutyBand).toBe("danger");
  });

  it("minimum pump margin: the pump's power ceiling and the low-margin warning", () => {
    const r = withShop((s) => (s.limits.minPumpMarginPct = 40));
    // Ceiling = supply ÷ (1 + margin) × ρ × 1000 ÷ BSFC (calc-spec §4): 1.25 / 1.40 of the library's.
    expect(r.pump.powerCeilingKw / lib.pump.powerCeilingKw).toBeCloseTo(1.25 / 1.4, 9);
    const high = withShop((s) => (s.limits.minPumpMarginPct = 200));
    expect(high.warnings.map((w) => w.code)).toContain("pump-margin-low");
  });

  it("line-drop limit: which lines are within it and the recommended size", () => {
    const tight = withShop((s) => (s.limits.maxLineDropKpa = 1));
    expect(tight.limits.maxLineDropKpa).toBe(1);
    expect(tight.lines.recommendedFeedDash ?? 99).toBeGreaterThanOrEqual(
      lib.lines.recommendedFeedDash ?? 0,
    );
    expect(tight.lines.feed!.withinLimit).toBe(tight.lines.feed!.pressureDropKpa <= 1);
  });

  it("BSFC rules of thumb by fuel class and aspiration: E85 boosted moves a boosted E85 build, gasoline NA does not", () => {
    const r = withShop((s) => (s.bsfc.e85BoostedGPerKwh = 520));
    expect(r.blend.rich.bsfcGPerKwh).not.toBeCloseTo(lib.blend.rich.bsfcGPerKwh, 3);
    // At E85 exactly the anchor itself (λ at reference): calc-spec §2 interpolation.
    const e85 = bare();
    e85.fuel = { ethanolMinVolPct: 85, ethanolMaxVolPct: 85 };
    expect(
      size(
        (() => {
          const s = structuredClone(LIBRARY_SIZING_SETTINGS);
          s.bsfc.e85BoostedGPerKwh = 520;
          return s;
        })(),
        e85,
      ).blend.rich.bsfcGPerKwh,
    ).toBeCloseTo(520, 9);
    const na = withShop((s) => (s.bsfc.gasolineNaGPerKwh = 400));
    expect(na.blend.rich.bsfcGPerKwh).toBeCloseTo(lib.blend.rich.bsfcGPerKwh, 9);
    // A typed BSFC (or the shop's measured one the tuner chose) beats the rule of thumb, at the
    // ethanol content it was taken at (calc-spec §2).
    const typed = bare();
    typed.fuel.bsfcGPerKwh = 480;
    typed.fuel.bsfcEthanolVolPct = typed.fuel.ethanolMaxVolPct;
    expect(size(shop, typed).blend.rich.bsfcGPerKwh).toBe(480);
  });

  it("drivetrain loss by drive type: the crank power", () => {
    const b = bare();
    b.target.driveType = "automatic";
    const s = structuredClone(LIBRARY_SIZING_SETTINGS);
    s.drivetrainLossPct.automatic = 20;
    // P_crank = P_wheel / (1 − loss) (calc-spec §2): 450 / 0.8.
    expect(size(s, b).crankPowerKw).toBeCloseTo(450 / 0.8, 9);
  });

  it("fuel properties: the blend's density and stoichiometric AFR", () => {
    const r = withShop((s) => {
      s.fuel.gasoline = { densityKgPerL: 0.72, stoichAfr: 14.5 };
      s.fuel.ethanol = { densityKgPerL: 0.8, stoichAfr: 8.9 };
    });
    // Volume-weighted density (calc-spec §1): E85 = 0.85 × 0.80 + 0.15 × 0.72.
    expect(r.blend.rich.densityKgPerL).toBeCloseTo(0.85 * 0.8 + 0.15 * 0.72, 12);
    expect(r.blend.rich.densityKgPerL).not.toBeCloseTo(fuelBlend(85).densityKgPerL, 4);
    expect(r.blend.lean.stoichAfr).toBeCloseTo(
      fuelBlend(70, {
        gasoline: { densityKgPerL: 0.72, stoichAfr: 14.5 },
        ethanol: { densityKgPerL: 0.8, stoichAfr: 8.9 },
      }).stoichAfr,
      12,
    );
    expect(r.injector.pulseWidthIdle.effectiveMs).not.toBeCloseTo(
      lib.injector.pulseWidthIdle.effectiveMs,
      4,
    );
    expect(lib.blend.rich.densityKgPerL).toBeCloseTo(
      0.85 * ETHANOL.densityKgPerL + 0.15 * GASOLINE.densityKgPerL,
      12,
    );
  });
});
