// Reference: docs/calculations.md §9.
import type { ASPIRATIONS, REGULATOR_TYPES } from "./input-codes";

/**
 * The labels of the sizing's codes, apart from the registry so that a page which only names a
 * code (the catalog's spec summaries) does not load the registry and its schema.
 */
export const ASPIRATION_LABELS: Record<(typeof ASPIRATIONS)[number], string> = {
  na: "Naturally aspirated",
  turbo: "Turbocharged",
  supercharged: "Supercharged",
};
export const REGULATOR_LABELS: Record<(typeof REGULATOR_TYPES)[number], string> = {
  "boost-referenced": "Boost-referenced (1:1 or rising-rate)",
  fixed: "Fixed (not referenced)",
};
export const MEASURED_AT_LABELS = { wheel: "At the wheels", crank: "At the crank" } as const;
export const DRIVE_TYPE_LABELS = {
  manual: "Manual gearbox",
  automatic: "Automatic gearbox",
  awd: "All-wheel drive",
} as const;
export const DUTY_BAND_LABELS = {
  ok: "Duty fine",
  caution: "Duty high",
  danger: "Duty too high",
  static: "Injectors static",
} as const;
export const LIMITED_BY_LABELS = {
  injectors: "the injectors",
  pump: "the pump",
  "feed-line": "the feed line",
} as const;
/** The power ceiling's one severity (§7.2), as the results, the spec sheet and compare say it. */
export const CEILING_SEVERITY_LABELS = {
  ok: "Meets the target",
  info: "Below the target (within the limits)",
  caution: "Below the target: caution",
  danger: "Below the target: danger",
} as const;
export const BSFC_SOURCE_LABELS = {
  given: "given",
  scaled: "given, scaled to this blend",
  "rule-of-thumb": "rule of thumb",
} as const;
export const BLEND_END_LABELS = { lean: "lowest ethanol", rich: "highest ethanol" } as const;
export const FLOW_REGIME_LABELS = {
  laminar: "laminar",
  transitional: "transitional",
  turbulent: "turbulent",
} as const;
