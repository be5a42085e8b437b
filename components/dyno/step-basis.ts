import { formatValue } from "@/lib/calc/quantities";
import type { UnitSystem } from "@/lib/calc/units";
import type { StepBasis } from "@/lib/tune/step-target";

/** What the next-step panel asks the session for: a typed figure, else the build's target by kind. */
export interface StepAsk {
  boost?: string;
  power?: string;
  by?: "boost" | "power";
}

/** Where the predicted step's power and boost come from, in words (the figures are shown above). */
export function basisText(basis: StepBasis, pull: number, units: UnitSystem): string {
  switch (basis) {
    case "asked-boost":
      return `At the boost asked; the power is pull ${pull}'s, scaled with manifold absolute pressure.`;
    case "asked-power":
      return `At the power asked; the boost for it is pull ${pull}'s, scaled the same way with manifold absolute pressure.`;
    case "build-boost":
      return `At the build's boost target, exactly; the power is pull ${pull}'s, scaled with manifold absolute pressure.`;
    case "build-power":
      return `At the build's power target (at the crank); the boost for it is pull ${pull}'s, scaled with manifold absolute pressure — not the build's boost target.`;
    case "more-boost":
      return `${formatValue("pressure", 20, units)} more than pull ${pull}'s peak boost; the power is pull ${pull}'s, scaled with manifold absolute pressure.`;
  }
}
