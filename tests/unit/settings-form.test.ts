import { describe, expect, it } from "vitest";

import { DEFAULT_BSFC } from "@/lib/calc";
import { settingsFromShown } from "@/lib/shop/settings-view";
import {
  DUTY_ORDER_MESSAGE,
  ShopSettingsFormSchema,
  shownSettingBounds,
} from "@/lib/validations/settings";

/** The settings form as a browser posts it (text fields), canonical values, metric. */
const FORM = {
  shopName: "Unit Test Fuel",
  currency: "USD",
  taxRatePct: "8.25",
  units: "imperial",
  paperSize: "letter",
  timeZone: "UTC",
  bsfcGasolineNa: "304",
  bsfcGasolineBoosted: "334",
  bsfcE85Na: "426",
  bsfcE85Boosted: "456",
  designDutyPct: "80",
  dutyCautionPct: "80",
  dutyDangerPct: "90",
  minPumpMarginPct: "25",
  maxLineDropKpa: "14",
  lossManualPct: "12",
  lossAutomaticPct: "17",
  lossAwdPct: "22",
  gasolineDensityKgPerL: "",
  ethanolDensityKgPerL: "",
  labourRate: "120",
  depositPct: "30",
  quoteValidDays: "30",
};
/** The same form as an imperial page shows it (lb/hp/h, psi; 1 lb/hp·h = 608.277 g/kWh, NIST SP 811). */
const IMPERIAL = {
  ...FORM,
  shownUnits: "imperial",
  bsfcGasolineNa: "0.5",
  bsfcGasolineBoosted: "0.549",
  bsfcE85Na: "0.7",
  bsfcE85Boosted: "0.75",
  maxLineDropKpa: "2.03",
};

const paths = (r: ReturnType<typeof ShopSettingsFormSchema.safeParse>) =>
  r.success ? [] : r.error.issues.map((i) => i.path.join("."));

describe("the settings form's validation", () => {
  it("accepts the form in both systems", () => {
    expect(ShopSettingsFormSchema.safeParse(FORM).success).toBe(true);
    expect(ShopSettingsFormSchema.safeParse(IMPERIAL).success).toBe(true);
  });

  for (const [system, form] of [
    ["metric", FORM],
    ["imperial", IMPERIAL],
  ] as const) {
    it(`${system}: a bad form names every bad field at once, the rule across fields included`, () => {
      const r = ShopSettingsFormSchema.safeParse({
        ...form,
        currency: "dollars",
        taxRatePct: "99",
        dutyCautionPct: "95",
        dutyDangerPct: "85",
        bsfcE85Na: "lots",
      });
      expect(r.success).toBe(false);
      // No loaded levels sent: as if both were changed, the caution level is marked, saying why.
      expect(paths(r)).toEqual(
        expect.arrayContaining(["currency", "taxRatePct", "dutyCautionPct", "bsfcE85Na"]),
      );
      expect(paths(r)).not.toContain("dutyDangerPct");
      expect(r.error!.issues.find((i) => i.path[0] === "dutyCautionPct")?.message).toBe(
        `Caution above (95 %) must not be higher than Danger above (85 %); both were changed, so the caution level is marked: the duty bands start from it`,
      );
    });

    it(`${system}: caution above danger is marked on the level the person changed`, () => {
      const loaded = { loadedDutyCautionPct: "80", loadedDutyDangerPct: "90" };
      const caution = ShopSettingsFormSchema.safeParse({
        ...form,
        ...loaded,
        dutyCautionPct: "95",
      });
      expect(paths(caution)).toEqual(["dutyCautionPct"]);
      expect(caution.error!.issues[0]!.message).toBe(
        "Caution above (95 %) must not be higher than Danger above (90 %)",
      );
      const danger = ShopSettingsFormSchema.safeParse({ ...form, ...loaded, dutyDangerPct: "70" });
      expect(paths(danger)).toEqual(["dutyDangerPct"]);
      expect(danger.error!.issues[0]!.message).toBe(
        "Danger above (70 %) must not be lower than Caution above (80 %)",
      );
      expect(DUTY_ORDER_MESSAGE).toBe("Caution above must not be higher than Danger above");
    });
  }

  it("states the bounds in the units the page showed", () => {
    // 150–1200 g/kWh = 0.2466–1.9728 lb/hp·h (608.277 g/kWh per lb/hp·h), rounded inwards.
    expect(shownSettingBounds("bsfcGasolineNa", "imperial").message).toBe(
      "Gasoline, NA (BSFC) must be between 0.247 lb/hp/h and 1.972 lb/hp/h",
    );
    expect(shownSettingBounds("bsfcGasolineNa", "metric").message).toBe(
      "Gasoline, NA (BSFC) must be between 150 g/kWh and 1200 g/kWh",
    );
    const r = ShopSettingsFormSchema.safeParse({ ...IMPERIAL, bsfcGasolineNa: "300" });
    expect(r.error!.issues[0]!.message).toContain("lb/hp/h");
  });

  it("a value left as shown keeps the stored one; a changed one converts back", () => {
    const stored = {
      bsfcGasolineNa: DEFAULT_BSFC.gasolineNaGPerKwh,
      bsfcGasolineBoosted: 334.1,
      bsfcE85Na: 426.5,
      bsfcE85Boosted: 456.2,
      maxLineDropKpa: 14,
      gasolineDensityKgPerL: null,
      ethanolDensityKgPerL: null,
    };
    const parsed = ShopSettingsFormSchema.parse({
      ...IMPERIAL,
      bsfcGasolineNa: String(Number((DEFAULT_BSFC.gasolineNaGPerKwh / 608.277).toFixed(3))),
      maxLineDropKpa: "3",
    });
    const out = settingsFromShown(parsed, stored);
    expect(out.bsfcGasolineNa).toBe(DEFAULT_BSFC.gasolineNaGPerKwh);
    // 3 psi = 20.684 kPa (1 psi = 6.894757 kPa, NIST SP 811 B.8).
    expect(out.maxLineDropKpa).toBeCloseTo(20.684, 2);
    expect(out.gasolineDensityKgPerL).toBeNull();
  });
});
