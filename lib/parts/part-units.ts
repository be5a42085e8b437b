import { parseNumberText } from "@/lib/calc/number-text";
import {
  converter,
  formatNumber,
  formatValue,
  fromShown,
  toShown,
  type Quantity,
} from "@/lib/calc/quantities";
import type { UnitSystem } from "@/lib/calc/units";
import type { FlatPart } from "@/lib/catalog/flat-part";

/**
 * The part form in the viewer's units. A part's columns are canonical (kPa, cc/min, L/h, mm,
 * kg/L: the catalog CSV's, a file format that never changes with the reader); the form shows and
 * takes them in the viewer's units and sends canonical text. A field left as it was shown sends
 * back exactly the text it was loaded from, and a table cell left as shown its exact number, so
 * an unchanged save writes nothing and no value drifts through a unit round trip.
 */

/** The single-number columns that carry a unit, and the quantity that shows them. */
export const PART_NUMBER_QUANTITY = {
  flow_cc_min: "injectorFlow",
  rated_kpa: "pressure",
  min_kpa: "pressure",
  max_kpa: "pressure",
  drop_kpa: "pressureDrop",
  inside_mm: "diameter",
  test_fluid_kg_l: "density",
} as const satisfies Partial<Record<keyof FlatPart, Quantity>>;
type NumberColumn = keyof typeof PART_NUMBER_QUANTITY;

/** The table columns: each cell "a:b" at a voltage, with the quantities of a and b (none: as is). */
const TABLES = {
  dead_time_ms: ["pressure", null],
  pump_curve: ["pressure", "volumeFlow"],
} as const satisfies Partial<Record<keyof FlatPart, readonly [Quantity, Quantity | null]>>;
type TableColumn = keyof typeof TABLES;

/** The canonical bounds of the number columns (lib/validations/parts.ts#SPEC_SCHEMAS). */
const BOUNDS: Record<NumberColumn, { what: string; min: number; max: number; blank?: boolean }> = {
  flow_cc_min: { what: "Rated flow", min: 20, max: 10000 },
  rated_kpa: { what: "Rating pressure", min: 100, max: 1000 },
  min_kpa: { what: "Lowest setting", min: 50, max: 1000 },
  max_kpa: { what: "Highest setting", min: 50, max: 1500 },
  drop_kpa: { what: "Pressure drop", min: 0, max: 100 },
  inside_mm: { what: "Inside diameter", min: 2, max: 40 },
  test_fluid_kg_l: { what: "Rating fluid density", min: 0.6, max: 1.1, blank: true },
};

const isNumberColumn = (k: string): k is NumberColumn => Object.hasOwn(PART_NUMBER_QUANTITY, k);
const isTableColumn = (k: string): k is TableColumn => Object.hasOwn(TABLES, k);

/** The unit a column is shown in ("lb/h", "psi"). */
export const partUnit = (k: NumberColumn, units: UnitSystem) =>
  converter(PART_NUMBER_QUANTITY[k], units).unit;

/** A table's cells "V a:b a:b | V …" → segments of [voltage text, [a, b] texts]; null if unreadable. */
function cellsOf(text: string): { volts: string; cells: [string, string][] }[] | null {
  const out: { volts: string; cells: [string, string][] }[] = [];
  for (const seg of text.split("|")) {
    const m = /^\s*(\d+(?:\.\d+)?\s*V)\s+(.+?)\s*$/i.exec(seg);
    if (!m) return null;
    const cells = m[2]!.split(/\s+/).map((c) => c.split(":"));
    if (cells.some((c) => c.length !== 2)) return null;
    out.push({ volts: m[1]!, cells: cells as [string, string][] });
  }
  return out;
}
const tableText = (t: { volts: string; cells: [string, string][] }[]) =>
  t.map((s) => `${s.volts} ${s.cells.map(([a, b]) => `${a}:${b}`).join(" ")}`).join(" | ");

const numberOf = (t: string | undefined) => {
  if (t === undefined || t.trim() === "") return NaN;
  return parseNumberText(t);
};

/** A canonical number as shown (unreadable text stays as it is: the server says what is wrong). */
function shownCell(q: Quantity | null, text: string, units: UnitSystem): string {
  const n = numberOf(text);
  if (q === null || !Number.isFinite(n)) return text;
  return String(toShown(q, n, units));
}

/** A shown number back in canonical units; the cell's loaded text when it is shown unchanged. */
function canonicalCell(
  q: Quantity | null,
  shown: string,
  loaded: string | undefined,
  units: UnitSystem,
): string {
  if (q === null) return shown;
  if (loaded !== undefined && shownCell(q, loaded, units) === shown.trim()) return loaded;
  const n = numberOf(shown);
  if (!Number.isFinite(n)) return shown;
  const original = numberOf(loaded);
  return String(fromShown(q, n, units, Number.isFinite(original) ? original : undefined));
}

/** A part's flat row as the form shows it in `units` (metric: the canonical text itself). */
export function partShown(flat: FlatPart, units: UnitSystem): FlatPart {
  if (units === "metric") return flat;
  const out: FlatPart = { ...flat };
  for (const [k, v] of Object.entries(flat) as [keyof FlatPart, string | undefined][]) {
    if (v === undefined) continue;
    if (isNumberColumn(k)) out[k] = shownCell(PART_NUMBER_QUANTITY[k], v, units);
    else if (isTableColumn(k)) {
      const t = cellsOf(v);
      if (!t) continue;
      const [qa, qb] = TABLES[k];
      out[k] = tableText(
        t.map((s) => ({
          volts: s.volts,
          cells: s.cells.map(([a, b]) => [shownCell(qa, a, units), shownCell(qb, b, units)]),
        })),
      );
    }
  }
  return out;
}

/**
 * The form's row back in canonical text for the action: each field shown in other units is
 * converted back; one left as it was shown is the text it was loaded from (`loaded`, canonical),
 * and so is each table cell left as shown.
 */
export function partCanonical(shown: FlatPart, loaded: FlatPart, units: UnitSystem): FlatPart {
  if (units === "metric") return shown;
  const before = partShown(loaded, units);
  const out: FlatPart = { ...shown };
  for (const [k, v] of Object.entries(shown) as [keyof FlatPart, string | undefined][]) {
    if (v === undefined || (!isNumberColumn(k) && !isTableColumn(k))) continue;
    if (v === before[k] && loaded[k] !== undefined) {
      out[k] = loaded[k];
      continue;
    }
    if (v.trim() === "") continue;
    if (isNumberColumn(k)) {
      out[k] = canonicalCell(PART_NUMBER_QUANTITY[k], v, loaded[k], units);
      continue;
    }
    const t = cellsOf(v);
    if (!t) continue; // unreadable: sent as typed, the server names what is wrong
    const was = loaded[k] ? cellsOf(loaded[k]!) : null;
    const [qa, qb] = TABLES[k];
    out[k] = tableText(
      t.map((s, i) => ({
        volts: s.volts,
        cells: s.cells.map(([a, b], j) => {
          const w = was?.[i]?.cells[j];
          return [canonicalCell(qa, a, w?.[0], units), canonicalCell(qb, b, w?.[1], units)];
        }),
      })),
    );
  }
  return out;
}

/** A figure of a hint, in `units`: the number alone or with its unit. */
const n = (q: Quantity, x: number, units: UnitSystem) => formatNumber(q, x, units);

/** The hints of the unit-bearing fields, in the viewer's units. */
export function partHints(units: UnitSystem) {
  const p = (x: number) => n("pressure", x, units);
  const f = (x: number) => n("volumeFlow", x, units);
  const pu = converter("pressure", units).unit;
  const fu = converter("volumeFlow", units).unit;
  return {
    rated_kpa: `${formatValue("pressure", 300, units)} is the usual rating pressure`,
    test_fluid_kg_l: `e.g. ${n("density", 0.684, units)} for n-heptane; blank: rated with the fuel itself`,
    dead_time_ms: `e.g. 12V ${p(300)}:0.85 ${p(500)}:0.95 | 14V ${p(300)}:0.65 ${p(500)}:0.72 (${pu}:ms); blank clears it`,
    pump_curve: `e.g. 13.5V ${p(300)}:${f(340)} ${p(500)}:${f(290)} | 12V ${p(300)}:${f(300)} (${pu}:${fu})`,
  } satisfies Partial<Record<keyof FlatPart, string>>;
}

/** Port sizes by category (lib/validations/parts.ts#SPEC_SCHEMAS: a regulator's 4 to 16). */
const dashMessage = (category?: string) =>
  category === "regulator" || category === "filter"
    ? `Port size must be a whole AN dash size from ${category === "regulator" ? "4 to 16" : "3 to 20"}`
    : "AN dash size must be a whole number from 3 to 20";

/**
 * The columns without a unit to convert, said by the field's label (the server's messages name
 * the CSV column, which the import keeps): every message for them reads as the one rule.
 */
const PLAIN_MESSAGES = {
  min_pulse_ms: "Minimum pulse width must be between 0.1 and 10 ms",
  current_a: "Current draw must be between 0 and 80 A",
  micron: "Rating must be between 1 and 500 µm",
  an_dash: dashMessage,
  impedance: "Impedance must be high or low",
  mounting: "Mounting must be in-tank or inline",
  regulator_type: "Type must be boost-referenced or fixed",
  ethanol_ok: "Rated for ethanol must be yes or no",
  connector: "Connector must be at most 40 characters",
  material: "Material must be at most 40 characters",
} satisfies Partial<Record<keyof FlatPart, string | ((category?: string) => string)>>;

/**
 * A field error of the part form as the viewer reads it: the server's messages for the
 * unit-bearing columns name the CSV column and canonical units, so the form says the field's
 * bounds or table shape in the viewer's units instead; any other message is kept.
 */
export function partFieldMessage(
  k: string,
  message: string,
  units: UnitSystem,
  category?: string,
): string {
  const plain = PLAIN_MESSAGES[k as keyof typeof PLAIN_MESSAGES];
  if (plain) return typeof plain === "function" ? plain(category) : plain;
  const says = /kPa|cc\/min|L\/h|\bmm\b|kg\/L|must be a number|needs/.test(message);
  if (isNumberColumn(k) && says) {
    const b = BOUNDS[k];
    const q = PART_NUMBER_QUANTITY[k];
    return `${b.what} must be a number between ${n(q, b.min, units)} and ${formatValue(q, b.max, units)}${b.blank ? ", or blank" : ""}`;
  }
  if (isTableColumn(k) && says) {
    const h = partHints(units);
    return k === "dead_time_ms"
      ? `Dead time table: one row per voltage, voltages rising, the same rising pressures in each row, 0 to 10 ms — ${h.dead_time_ms.replace(/; blank clears it$/, "")}`
      : `Flow curve: one curve per voltage, at least two points each — ${h.pump_curve}`;
  }
  return message;
}
