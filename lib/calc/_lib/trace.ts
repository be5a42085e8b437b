// Reference: docs/calculations.md §7.
import type { TraceStep } from "../types";

/** Collects the worked steps of a calculation, in order. */
export class Tracer {
  readonly steps: TraceStep[] = [];
  add(step: TraceStep): number {
    this.steps.push(step);
    return step.value;
  }
}
