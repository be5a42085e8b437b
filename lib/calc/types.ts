// Reference: docs/calculations.md §7.
import type { FigureParams, Quantity } from "./quantities";
import type { UnitSystem } from "./units";

/**
 * One worked step of a calculation: what a tuner needs to redo it with a pocket calculator.
 * Numbers are data (value and quantity), formatted at the edge in the reader's unit system
 * (`formatTraceStep` in lib/calc/messages.ts).
 */
export interface TraceStep {
  id: string;
  /** What the step works out; `{name}` places are filled from `params` ("Injector duty at {ethanol}"). */
  label: string;
  params?: FigureParams;
  /** The formula in words, for the canonical (metric) units. */
  formula: string;
  /** The same where imperial units need other constants (lb/h, gal/h, hp). */
  formulaImperial?: string;
  inputs: {
    label: string;
    value: number;
    quantity: Quantity;
    decimals?: number;
    /** Shown only in this unit system (a constant only its formula needs). */
    only?: UnitSystem;
  }[];
  value: number;
  quantity: Quantity;
  decimals?: number;
}

export type Severity = "info" | "caution" | "danger";

/**
 * A finding of the sizing or of a dyno log. `message` and `fix` are templates whose `{name}`
 * places are the figures in `params`, formatted at the edge in the reader's unit system
 * (`formatWarning` in lib/calc/messages.ts).
 */
export interface Warning {
  /** Stable code, e.g. "injector-duty-danger". */
  code: string;
  severity: Severity;
  message: string;
  /** What to change. */
  fix?: string;
  params: FigureParams;
}
