// Reference: docs/calculations.md §7.3.
import {
  fillTemplate,
  formatLabelled,
  formatValue,
  ownDecimals,
  type FigureParams,
} from "./quantities";
import { inputField } from "./registry";
import type { Severity, TraceStep, Warning } from "./types";
import type { UnitSystem } from "./units";

/**
 * Warnings, working steps and validation messages as a person reads them: the figures they
 * carry as data, formatted at the edge in the reader's unit system through the registry.
 */

export const SEVERITY_LABELS: Record<Severity, string> = {
  info: "Note",
  caution: "Caution",
  danger: "Danger",
};

/** A warning's text: its message and what to change, with the figures in the reader's units. */
export function formatWarning(
  w: Warning,
  system: UnitSystem,
): { code: string; severity: Severity; message: string; fix: string | null } {
  // Results saved before warnings carried their figures hold the finished text.
  const params = (w as Partial<Warning>).params;
  return {
    code: w.code,
    severity: w.severity,
    message: params ? fillTemplate(w.message, params, system) : w.message,
    fix: w.fix ? (params ? fillTemplate(w.fix, params, system) : w.fix) : null,
  };
}

export interface FormattedStep {
  id: string;
  label: string;
  /** The result with its unit ("65.5 lb/h"). */
  value: string;
  formula: string;
  /** The numbers put in, each with its unit: "crank power 503 hp". */
  inputs: string[];
}

interface LegacyStep {
  id: string;
  label: string;
  formula: string;
  inputs: { label: string; value: number; unit: string }[];
  value: number;
  unit: string;
}

const legacyNumber = (v: number, d: number) =>
  Number.isFinite(v) ? (Number.isInteger(v) ? String(v) : v.toFixed(d)) : "—";

/** One working step in the reader's units, ready to print. */
export function formatTraceStep(step: TraceStep, system: UnitSystem): FormattedStep {
  if (!("quantity" in step)) {
    // Saved before steps carried quantities: the numbers as they were, in their units.
    const old = step as unknown as LegacyStep;
    // A unit the label already names ("reference lambda" in λ) is not said again.
    const u = (unit: string, label = "") =>
      unit && !(unit === "λ" && /lambda$/i.test(label.trim())) ? ` ${unit}` : "";
    return {
      id: old.id,
      label: old.label,
      value: `${legacyNumber(old.value, 2)}${u(old.unit)}`,
      formula: old.formula,
      inputs: old.inputs.map((i) => `${i.label} ${legacyNumber(i.value, 3)}${u(i.unit, i.label)}`),
    };
  }
  return {
    id: step.id,
    label: fillTemplate(step.label, step.params, system),
    value: formatValue(
      step.quantity,
      step.value,
      system,
      ownDecimals(step.quantity, system, step.decimals),
    ),
    formula: system === "imperial" && step.formulaImperial ? step.formulaImperial : step.formula,
    inputs: step.inputs
      .filter((i) => !i.only || i.only === system)
      .map((i) =>
        formatLabelled(
          // Saved before it was renamed: the BSFC, not the lambda (a figure in g/kWh or lb/hp/h).
          i.label === "at reference lambda" ? "rule-of-thumb BSFC" : i.label,
          i.quantity,
          i.value,
          system,
          ownDecimals(i.quantity, system, i.decimals),
        ),
      ),
  };
}
