import type { FuelSystemResult, UnitSystem } from "@/lib/calc";
import { CEILING_SEVERITY_LABELS, DUTY_BAND_LABELS } from "@/lib/calc/code-labels";
import { formatWarning, SEVERITY_LABELS } from "@/lib/calc/messages";
import { formatNumber, formatValue, ownDecimals, unitOf } from "@/lib/calc/quantities";
import { resultField } from "@/lib/calc/registry";

export type Level = "ok" | "info" | "caution" | "danger";

export interface KeyFigure {
  /** Stable key: what the announcer compares between two results. */
  key: "duty" | "margin" | "ceiling" | "warning";
  label: string;
  /** The figure with its unit, in the reader's units ("81 %", "412 kW crank"). */
  text: string;
  /** What the figure's signal says, in words ("Caution: high duty"); null when nothing to say. */
  verdict: string | null;
  /** The worst warning's severity in words ("Caution"), said before its text. */
  badge?: string;
  level: Level;
}

const RANK: Record<Level, number> = { ok: 0, info: 1, caution: 2, danger: 3 };

/** A result figure through the registry: its number in the reader's units, and the unit. */
function figure(path: string, value: number, units: UnitSystem) {
  const f = resultField(path);
  const q = f?.quantity ?? "ratio";
  return `${formatNumber(q, value, units, ownDecimals(q, units, f?.decimals))} ${unitOf(q, units)}`.trim();
}

/**
 * The four figures a tuner watches while typing — duty at the worse end of the blend, pump
 * margin, power ceiling and the worst warning — formatted for the pinned summary and the
 * screen-reader announcement. Pure; cheap enough for every keystroke.
 */
export function keyFigures(r: FuelSystemResult, units: UnitSystem): KeyFigure[] {
  const band = { ok: "ok", caution: "caution", danger: "danger", static: "danger" } as const;
  const end = r.blend[r.blend.worstEnd];
  const dutyLevel = band[r.injector.dutyBand];
  const margin = r.pump.marginPct;
  const ceilingLevel: Level = r.powerCeiling.severity ?? "ok";
  const worst = [...r.warnings].sort((a, b) => RANK[b.severity] - RANK[a.severity])[0];
  const w = worst ? formatWarning(worst, units) : null;
  const more = r.warnings.length > 1 ? ` (+${r.warnings.length - 1} more)` : "";
  return [
    {
      key: "duty",
      label: `Duty at ${formatValue("ethanol", end.ethanolVolPct, units)}`,
      text: figure(`blend.${r.blend.worstEnd}.dutyPct`, end.dutyPct, units),
      verdict: dutyLevel === "ok" ? null : DUTY_BAND_LABELS[r.injector.dutyBand],
      level: dutyLevel,
    },
    {
      key: "margin",
      label: "Pump margin",
      text: figure("pump.marginPct", margin, units),
      verdict: margin < 0 ? "Pump short of demand" : null,
      level: margin < 0 ? "danger" : "ok",
    },
    {
      key: "ceiling",
      label: "Power ceiling",
      text: `${figure("powerCeiling.kw", r.powerCeiling.kw, units)} crank`,
      verdict: r.powerCeiling.severity ? CEILING_SEVERITY_LABELS[r.powerCeiling.severity] : null,
      level: ceilingLevel,
    },
    {
      key: "warning",
      label: "Worst warning",
      text: w ? `${w.message}${more}` : "None",
      badge: w ? SEVERITY_LABELS[w.severity] : undefined,
      verdict: null,
      level: w ? w.severity : "ok",
    },
  ];
}

/**
 * What to announce after an edit: the key figures whose text changed since the last
 * announcement, "label text" joined with "; " ("" when none did).
 */
export function changedFigures(before: KeyFigure[] | null, after: KeyFigure[]): string {
  const old = new Map((before ?? []).map((f) => [f.key, `${f.badge ?? ""}${f.text}`]));
  return after
    .filter((f) => old.get(f.key) !== `${f.badge ?? ""}${f.text}`)
    .map(
      (f) =>
        `${f.label}: ${f.badge ? `${f.badge}, ` : ""}${f.text}${f.verdict ? ` (${f.verdict})` : ""}`,
    )
    .join("; ");
}
