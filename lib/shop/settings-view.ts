import type { z } from "zod";

import type { ShopSettings } from "@/db/schema";
import { fromShown, shownText } from "@/lib/calc/quantities";
import type { UnitSystem } from "@/lib/calc/units";
import { OLD_ZONE_NAMES } from "@/lib/domain/time-zones";
import {
  SHOWN_SETTINGS,
  type ShopSettingsFormInput,
  type ShopSettingsSchema,
  type ShownSetting,
} from "@/lib/validations/settings";

type ShopSettingsInput = z.output<typeof ShopSettingsSchema>;

/** The shop's settings by the names the form and the API use (money in major units, rates in %). */
export type ShopSettingsView = ReturnType<typeof shopSettingsView>;

export function shopSettingsView(name: string, s: ShopSettings) {
  return {
    shopName: name,
    currency: s.currency,
    taxRatePct: s.taxRateBp / 100,
    units: s.units,
    country: s.country,
    address: s.address,
    phone: s.phone,
    paperSize: s.paperSize,
    timeZone: s.timeZone,
    bsfcGasolineNa: s.bsfcGasolineNa,
    bsfcGasolineBoosted: s.bsfcGasolineBoosted,
    bsfcE85Na: s.bsfcE85Na,
    bsfcE85Boosted: s.bsfcE85Boosted,
    designDutyPct: s.designDutyPct,
    dutyCautionPct: s.dutyCautionPct,
    dutyDangerPct: s.dutyDangerPct,
    minPumpMarginPct: s.minPumpMarginPct,
    maxLineDropKpa: s.maxLineDropKpa,
    lossManualPct: s.lossManualPct,
    lossAutomaticPct: s.lossAutomaticPct,
    lossAwdPct: s.lossAwdPct,
    gasolineDensityKgPerL: s.gasolineDensityKgPerL,
    gasolineStoichAfr: s.gasolineStoichAfr,
    ethanolDensityKgPerL: s.ethanolDensityKgPerL,
    ethanolStoichAfr: s.ethanolStoichAfr,
    labourRate: s.labourRateMinor / 100,
    depositPct: s.depositBp / 100,
    quoteValidDays: s.quoteValidDays,
    /** The shop's default tune limits (null: the library's, DEFAULT_TUNE_LIMITS). */
    tuneLimits: s.tuneLimits ?? null,
    updatedAt: s.updatedAt.toISOString(),
  };
}

/**
 * The settings as the form's text fields hold them, in the viewer's units (BSFC, line drop and
 * densities converted and rounded to the registry's precision; blank: no value, the library's).
 */
export function settingsFormValues(
  v: ShopSettingsView,
  system: UnitSystem,
): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, x] of Object.entries(v))
    if (typeof x !== "object" || x === null)
      out[k] = x === null || x === undefined ? "" : String(x);
  for (const [k, s] of Object.entries(SHOWN_SETTINGS))
    out[k] = shownText(s.quantity, v[k as ShownSetting], system);
  // A zone stored under an old name (before names were checked) is offered under its new one.
  out.timeZone = Object.hasOwn(OLD_ZONE_NAMES, v.timeZone)
    ? OLD_ZONE_NAMES[v.timeZone]!
    : v.timeZone;
  out.shownUnits = system;
  return out;
}

/**
 * The form's settings in canonical units. A field shown in other units converts back; one the
 * person left as it was shown keeps the stored value exactly (so an unchanged save writes
 * nothing); blank stays blank (the library's).
 */
export function settingsFromShown(
  input: ShopSettingsFormInput,
  current: Pick<ShopSettingsView, ShownSetting>,
): ShopSettingsInput {
  const { shownUnits, ...rest } = input;
  const out: Record<string, unknown> = { ...rest };
  for (const [k, s] of Object.entries(SHOWN_SETTINGS)) {
    const v = input[k as ShownSetting];
    if (typeof v === "number")
      out[k] = fromShown(s.quantity, v, shownUnits, current[k as ShownSetting]);
  }
  return out as ShopSettingsInput;
}
