// Reference: docs/calculations.md §7.2 (stage "ceiling" of §7).
import type { DutyBand } from "../injectors";
import type { Severity } from "../types";
import type { LineResult } from "./result";

/** How the limiting figure stands in its own bands (what its own warning says, if any). */
export interface LimiterBands {
  dutyBand: DutyBand;
  /** Supply below demand where the margin is worst (§4.4). */
  pumpShort: boolean;
  /** Margin below the minimum. */
  pumpMarginLow: boolean;
}

/**
 * One severity for the ceiling (calc-spec §7): a ceiling below the target takes the severity
 * of the figure that limits it — the duty band, the pump's shortfall or margin, the feed line's
 * drop — so it never says more or less than that figure's own warning. A limiter within its
 * bands leaves a ceiling below the target as a note ("info"); at or above the target, "ok".
 * @example ceilingSeverity({ kw: 500, crankPowerKw: 520, limitedBy: "injectors", feed: null, bands: { dutyBand: "caution", pumpShort: false, pumpMarginLow: false } }) // "caution"
 */
export function ceilingSeverity(q: {
  kw: number;
  crankPowerKw: number;
  limitedBy: Ceiling["limitedBy"];
  feed: LineResult | null;
  bands: LimiterBands;
}): CeilingSeverity {
  if (q.kw >= q.crankPowerKw) return "ok";
  const own: CeilingSeverity =
    q.limitedBy === "injectors"
      ? q.bands.dutyBand === "static" || q.bands.dutyBand === "danger"
        ? "danger"
        : q.bands.dutyBand === "caution"
          ? "caution"
          : "ok"
      : q.limitedBy === "pump"
        ? q.bands.pumpShort
          ? "danger"
          : q.bands.pumpMarginLow
            ? "caution"
            : "ok"
        : q.feed !== null && !q.feed.withinLimit
          ? "caution"
          : "ok";
  return own === "ok" ? "info" : own;
}

/** The ceiling's one severity: its limiting figure's (docs/calculations.md §7.2). */
export type CeilingSeverity = "ok" | Severity;

export interface Ceiling {
  kw: number;
  limitedBy: "injectors" | "pump" | "feed-line";
  headroomPct: number;
  severity: CeilingSeverity;
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
  bands: LimiterBands,
): Ceiling {
  const injectorKw = Math.min(injectorCeilings.lean, injectorCeilings.rich);
  const pumpLimited = pumpCeilingKw < injectorKw;
  const kw = Math.min(injectorKw, pumpCeilingKw);
  const limitedBy: Ceiling["limitedBy"] = pumpLimited
    ? feed && !feed.withinLimit
      ? "feed-line"
      : "pump"
    : "injectors";
  return {
    kw,
    limitedBy,
    headroomPct: (kw / crankPowerKw - 1) * 100,
    severity: ceilingSeverity({ kw, crankPowerKw, limitedBy, feed, bands }),
    injectorKw,
  };
}
