import type { StepTarget } from "@/lib/calc/tune";

/** The next step asked for: a boost or crank power, else `by` the build's boost or power target. */
export interface StepAsked {
  boostKpa?: number;
  crankKw?: number;
  by?: "boost" | "power";
}

/**
 * Where the next step's target came from: asked for, exactly the build's boost target, the
 * build's power target (at the crank), or 20 kPa more than the pull's peak boost.
 */
export type StepBasis =
  "asked-boost" | "asked-power" | "build-boost" | "build-power" | "more-boost";

/**
 * The step's target (pure): what was asked, else by the build's boost target (exactly it) or its
 * power target; none asked, the build's power target while it is above the pull's, else 20 kPa
 * more boost.
 * @example stepTarget({ aspiration: "turbo", maxBoostKpa: 150, wantedKw: 900 }, { crankKw: 600, boostKpa: 100 }, { by: "boost" }) // { target: { boostKpa: 150 }, basis: "build-boost" }
 */
export function stepTarget(
  build: { aspiration: string; maxBoostKpa: number; wantedKw: number },
  last: { crankKw: number; boostKpa: number },
  step: StepAsked = {},
): { target: StepTarget; basis: StepBasis } {
  if (step.boostKpa !== undefined)
    return { target: { boostKpa: step.boostKpa }, basis: "asked-boost" };
  if (step.crankKw !== undefined)
    return { target: { crankKw: step.crankKw }, basis: "asked-power" };
  const na = build.aspiration === "na";
  if (step.by === "boost" && !na && build.maxBoostKpa > 0)
    return { target: { boostKpa: build.maxBoostKpa }, basis: "build-boost" };
  if (step.by === "power" || step.by === "boost")
    return { target: { crankKw: build.wantedKw }, basis: "build-power" };
  return build.wantedKw > last.crankKw * 1.01 || na
    ? { target: { crankKw: Math.max(build.wantedKw, last.crankKw * 1.05) }, basis: "build-power" }
    : { target: { boostKpa: Math.min(500, last.boostKpa + 20) }, basis: "more-boost" };
}
