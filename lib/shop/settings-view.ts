import type { ShopSettings } from "@/db/schema";

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
    updatedAt: s.updatedAt.toISOString(),
  };
}
