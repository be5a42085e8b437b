// Reference: docs/calculations.md §7 (the stages of a sizing).
import type { Tracer } from "../_lib/trace";
import type { ParsedFuelSystemInput } from "../schema";

/** The limits a sizing works to: the build's, else the shop's, else the library's. */
export interface SizingLimits {
  designDutyPct: number;
  dutyCautionPct: number;
  dutyDangerPct: number;
  minPumpMarginPct: number;
  maxLineDropKpa: number;
}

/** The library's limits where neither the build nor the shop gives one (calc-spec §3–§5, common practice). */
export const DEFAULT_LIMITS: SizingLimits = {
  designDutyPct: 80,
  dutyCautionPct: 80,
  dutyDangerPct: 90,
  minPumpMarginPct: 25,
  maxLineDropKpa: 14,
};

/** The library's drivetrain loss where neither the build nor the shop gives one (common practice, no source). */
export const DEFAULT_DRIVETRAIN_LOSS_PCT = 15;

/** What every stage reads: the parsed input, the limits in force and the trace being written. */
export interface SizingContext {
  input: ParsedFuelSystemInput;
  limits: SizingLimits;
  t: Tracer;
}

/** The limits in force for an input. */
export function limitsOf(input: ParsedFuelSystemInput): SizingLimits {
  const l = input.limits;
  return {
    designDutyPct: l?.designDutyPct ?? DEFAULT_LIMITS.designDutyPct,
    dutyCautionPct: l?.dutyCautionPct ?? DEFAULT_LIMITS.dutyCautionPct,
    dutyDangerPct: l?.dutyDangerPct ?? DEFAULT_LIMITS.dutyDangerPct,
    minPumpMarginPct: l?.minPumpMarginPct ?? DEFAULT_LIMITS.minPumpMarginPct,
    maxLineDropKpa: l?.maxLineDropKpa ?? DEFAULT_LIMITS.maxLineDropKpa,
  };
}
