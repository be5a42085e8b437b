// Reference: docs/calculations.md §6.5 (exhaust-to-boost ratio).
import type { DatalogMapping } from "./log-mapping";
import { backPressurePoints, type TunePoint } from "./tune";
import type { Warning } from "./types";

/** A column's name as plain text inside a note's template (no braces to be read as figures). */
const named = (column: string) => `"${column.replace(/[{}]/g, "")}"`;

/**
 * What a pull's notes say about its pressures: which reading (gauge or absolute) the boost and
 * the exhaust manifold columns were taken as, that the ratio compares both as gauge pressures,
 * and — a turbo engine's exhaust manifold runs above its boost under load — a caution where the
 * exhaust reads below the boost at boost (one of the two is likely on the other reference).
 * @example pressureReadingNotes({ boost: { column: "Boost", kind: "gauge", unit: "kPa" }, … }, points)[0].code // "pull-pressure-reference"
 */
export function pressureReadingNotes(m: DatalogMapping, points: TunePoint[]): Warning[] {
  const notes: Warning[] = [];
  if (!m.exhaustPressure) return notes;
  const e = m.exhaustPressure;
  const said = (kind: "gauge" | "absolute") =>
    kind === "gauge" ? "gauge" : "absolute (the atmosphere taken off)";
  notes.push({
    code: "pull-pressure-reference",
    severity: "info",
    message: m.boost
      ? `Exhaust manifold pressure ${named(e.column)} was read as ${said(e.kind)} and boost ${named(m.boost.column)} as ${said(m.boost.kind)}: the exhaust-to-boost ratio compares both as gauge pressures.`
      : `Exhaust manifold pressure ${named(e.column)} was read as ${said(e.kind)}; no boost was logged, so no exhaust-to-boost ratio.`,
    fix: "If a column reads the other way, choose gauge or absolute for it in the mapping and add the log again.",
    params: {},
  });
  const judged = backPressurePoints(points);
  const below = judged.filter((p) => p.exhaustKpa! < p.boostKpa!);
  if (below.length) {
    const worst = below.reduce((a, b) =>
      b.exhaustKpa! / b.boostKpa! < a.exhaustKpa! / a.boostKpa! ? b : a,
    );
    notes.push({
      code: "pull-exhaust-below-boost",
      severity: "caution",
      message:
        "At {rpm} the exhaust manifold read {exhaust} against {boost} boost, {ratio}: below 1:1 at boost is not plausible on a turbo engine (the turbine needs more pressure before it than the compressor makes).",
      fix: "One of the two columns is likely on the other reference (gauge or absolute) or mislabelled: check the mapping before trusting the ratio.",
      params: {
        rpm: { value: worst.rpm, quantity: "speed" },
        exhaust: { value: worst.exhaustKpa!, quantity: "pressure" },
        boost: { value: worst.boostKpa!, quantity: "pressure" },
        ratio: { value: worst.exhaustKpa! / worst.boostKpa!, quantity: "pressureRatio" },
      },
    });
  }
  return notes;
}
