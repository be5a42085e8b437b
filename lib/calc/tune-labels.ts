// Reference: docs/calculations.md §6.5.
/**
 * The limits a tune session judges each pull against, and their names. Apart from `tune.ts`
 * (which holds the schemas and the sizing) so a screen that only names a limit ships neither.
 */
export const LIMIT_KEYS = [
  "lambda",
  "duty",
  "egt",
  "egtSpread",
  "backPressure",
  "turboSpeed",
] as const;
export type LimitKey = (typeof LIMIT_KEYS)[number];
export type LimitStatus = "within" | "near" | "over" | "no-data" | "not-set";

export const LIMIT_LABELS: Record<LimitKey, string> = {
  lambda: "Lambda against the boost table",
  duty: "Injector duty",
  egt: "Exhaust gas temperature",
  egtSpread: "EGT spread between cylinders",
  backPressure: "Exhaust-to-boost pressure ratio",
  turboSpeed: "Turbo speed",
};
