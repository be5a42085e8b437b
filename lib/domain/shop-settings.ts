/**
 * The shop settings' labels: the one source for the settings form (each field's label under its
 * heading) and for every message about a setting (the form's, the API's), so a message names a
 * field as the person reads it. `section` is the heading a field sits under where its label
 * alone does not say what it is ("E85, boosted" under "BSFC rules of thumb"); a message then
 * adds it in brackets ("E85, boosted (BSFC) must be between …").
 */
export const SETTING_LABELS = {
  shopName: { label: "Shop name" },
  currency: { label: "Currency" },
  taxRatePct: { label: "Tax rate" },
  units: { label: "Units" },
  country: { label: "Country" },
  address: { label: "Address" },
  phone: { label: "Phone" },
  paperSize: { label: "Paper for PDFs" },
  timeZone: { label: "Time zone" },
  bsfcGasolineNa: { label: "Gasoline, NA", section: "BSFC" },
  bsfcGasolineBoosted: { label: "Gasoline, boosted", section: "BSFC" },
  bsfcE85Na: { label: "E85, NA", section: "BSFC" },
  bsfcE85Boosted: { label: "E85, boosted", section: "BSFC" },
  designDutyPct: { label: "Design duty" },
  dutyCautionPct: { label: "Caution above" },
  dutyDangerPct: { label: "Danger above" },
  minPumpMarginPct: { label: "Minimum pump margin" },
  maxLineDropKpa: { label: "Line drop limit" },
  lossManualPct: { label: "Manual", section: "drivetrain loss" },
  lossAutomaticPct: { label: "Automatic", section: "drivetrain loss" },
  lossAwdPct: { label: "AWD", section: "drivetrain loss" },
  gasolineDensityKgPerL: { label: "Gasoline density" },
  gasolineStoichAfr: { label: "Gasoline stoichiometric AFR" },
  ethanolDensityKgPerL: { label: "Ethanol density" },
  ethanolStoichAfr: { label: "Ethanol stoichiometric AFR" },
  labourRate: { label: "Labour rate" },
  depositPct: { label: "Deposit asked on acceptance" },
  quoteValidDays: { label: "Quotes valid for" },
} as const satisfies Record<string, { label: string; section?: string }>;

export type SettingName = keyof typeof SETTING_LABELS;

/** The headings the form groups fields under (the BSFC fields' section is said short above). */
export const SETTING_SECTIONS = {
  bsfc: "BSFC rules of thumb",
  duty: "Duty and margins",
  loss: "Drivetrain loss",
  fuel: "Fuel properties",
  quotes: "Quotes",
} as const;

/** A setting as a message names it: its label, with its heading where the label needs it. */
export function settingName(name: SettingName): string {
  const s: { label: string; section?: string } = SETTING_LABELS[name];
  return s.section ? `${s.label} (${s.section})` : s.label;
}
