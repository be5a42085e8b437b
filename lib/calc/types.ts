/** One worked step of a calculation: what a tuner needs to redo it with a pocket calculator. */
export interface TraceStep {
  id: string;
  label: string;
  /** The formula in words. */
  formula: string;
  inputs: { label: string; value: number; unit: string }[];
  value: number;
  unit: string;
}

export type Severity = "info" | "caution" | "danger";

export interface Warning {
  /** Stable code, e.g. "injector-duty-danger". */
  code: string;
  severity: Severity;
  message: string;
  /** What to change. */
  fix?: string;
}
