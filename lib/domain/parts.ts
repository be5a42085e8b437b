/** The catalog's vocabulary: part categories and their labels. */

export const PART_CATEGORIES = [
  "injector",
  "pump",
  "regulator",
  "line",
  "fitting",
  "filter",
  "sensor",
  "other",
] as const;
export type PartCategory = (typeof PART_CATEGORIES)[number];

export const CATEGORY_LABELS: Record<PartCategory, string> = {
  injector: "Injector",
  pump: "Pump",
  regulator: "Regulator",
  line: "Line / hose",
  fitting: "Fitting",
  filter: "Filter",
  sensor: "Ethanol sensor",
  other: "Other",
};
