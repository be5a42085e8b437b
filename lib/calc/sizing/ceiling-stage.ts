// Reference: docs/calculations.md §7.2 (stage "ceiling" of §7).
import type { LineResult } from "./result";

export interface Ceiling {
  kw: number;
  limitedBy: "injectors" | "pump" | "feed-line";
  headroomPct: number;
  /** The injectors' own ceiling: the lower of the two blend ends. */
  injectorKw: number;
}

/**
 * Stage "ceiling": the system's power ceiling is the lowest of the injectors' (at the design
 * duty, at whichever blend end is lower) and the pump's (with the minimum margin kept); a
 * pump-limited ceiling whose feed line is over its limit is the feed line's.
 */
export function ceilingStage(
  crankPowerKw: number,
  injectorCeilings: { lean: number; rich: number },
  pumpCeilingKw: number,
  feed: LineResult | null,
): Ceiling {
  const injectorKw = Math.min(injectorCeilings.lean, injectorCeilings.rich);
  const pumpLimited = pumpCeilingKw < injectorKw;
  const kw = Math.min(injectorKw, pumpCeilingKw);
  const limitedBy: Ceiling["limitedBy"] = pumpLimited
    ? feed && !feed.withinLimit
      ? "feed-line"
      : "pump"
    : "injectors";
  return { kw, limitedBy, headroomPct: (kw / crankPowerKw - 1) * 100, injectorKw };
}
