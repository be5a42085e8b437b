import type { Part } from "@/db/schema/catalog";
import { minorToPlain } from "@/lib/catalog/money";

/*
 * The flat row of a part (the catalog CSV's columns, the part form's fields) and its table
 * cells, without the schemas (lib/validations/parts.ts checks the rows and re-exports these):
 * the part form loads this, not the schema library.
 */

/**
 * A part as one flat row: the columns of the catalog CSV and the fields of the part form.
 * Everything arrives as text; blanks are "not given".
 */
export const CSV_COLUMNS = [
  "sku",
  "category",
  "brand",
  "name",
  "price",
  "cost",
  "stock",
  "reorder_level",
  "lead_time_days",
  "restock_on",
  "flow_cc_min",
  "rated_kpa",
  "min_pulse_ms",
  "impedance",
  "connector",
  "ethanol_ok",
  "dead_time_ms",
  "pump_curve",
  "current_a",
  "mounting",
  "regulator_type",
  "min_kpa",
  "max_kpa",
  "an_dash",
  "inside_mm",
  "material",
  "micron",
  "drop_kpa",
  "test_fluid_kg_l",
] as const;
export type FlatPart = Partial<Record<(typeof CSV_COLUMNS)[number], string>>;

/** A number written in a table cell; anything else (a blank included) is NaN, which the schema refuses. */
const cellNumber = (t: string | undefined) =>
  t !== undefined && /^\s*[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?\s*$/.test(t) ? Number(t) : NaN;

/** "13.5V 300:340 500:290 | 12V 300:300" → pump curves (pressure kPa : flow L/h at each voltage). */
/**
 * The segments of a per-voltage cell ("13.5V 300:340 500:290 | 12V 300:300"), each its voltage
 * and its `a:b` pairs as numbers (a pair of any other shape: [NaN, NaN]); a segment that does
 * not start with a voltage is null. The pump curve and dead-time cells are both written so.
 */
function voltageSegments(text: string) {
  return text.split("|").map((seg) => {
    const m = /^\s*(\d+(?:\.\d+)?)\s*V\s+(.+)$/i.exec(seg);
    if (!m) return null;
    const points = m[2]!
      .trim()
      .split(/\s+/)
      .map((p): [number, number] => {
        const [a, b, extra] = p.split(":");
        return extra === undefined ? [cellNumber(a), cellNumber(b)] : [NaN, NaN];
      });
    return { voltage: Number(m[1]), points };
  });
}

export function parsePumpCurve(text: string) {
  return voltageSegments(text).map((seg) =>
    seg
      ? {
          voltage: seg.voltage,
          points: seg.points.map(([pressureKpa, flowLPerH]) => ({ pressureKpa, flowLPerH })),
        }
      : { voltage: NaN, points: [] },
  );
}
/**
 * "12V 300:0.85 500:0.95 | 14V 300:0.65 500:0.72" → an injector's dead-time table: one segment
 * per voltage (rising), each with `pressure kPa : dead time ms` at the same pressures (rising).
 * A cell that does not have that shape gives a table the schema refuses (with the hint below).
 */
export function parseDeadTime(text: string) {
  const rows = voltageSegments(text);
  const first = rows[0]?.points.map(([p]) => p!) ?? [];
  const same = rows.every(
    (r) => r && r.points.length === first.length && r.points.every(([p], i) => p === first[i]),
  );
  if (!same) return { voltages: [], pressuresKpa: [], deadTimeMs: [] };
  return {
    voltages: rows.map((r) => r!.voltage),
    pressuresKpa: first,
    deadTimeMs: rows.map((r) => r!.points.map(([, ms]) => ms!)),
  };
}
export function formatDeadTime(t: {
  voltages: number[];
  pressuresKpa: number[];
  deadTimeMs: number[][];
}): string {
  return t.voltages
    .map(
      (v, i) =>
        `${v}V ${t.pressuresKpa.map((p, j) => `${p}:${t.deadTimeMs[i]?.[j] ?? ""}`).join(" ")}`,
    )
    .join(" | ");
}

export function formatPumpCurve(
  curves: { voltage: number; points: { pressureKpa: number; flowLPerH: number }[] }[],
): string {
  return curves
    .map((c) => `${c.voltage}V ${c.points.map((p) => `${p.pressureKpa}:${p.flowLPerH}`).join(" ")}`)
    .join(" | ");
}

const isDeadTime = (v: unknown): v is Parameters<typeof formatDeadTime>[0] =>
  Boolean(v) && typeof v === "object" && Array.isArray((v as { voltages?: unknown }).voltages);

/** What of a stored part its flat row is made from (the CSV export, the edit form). */
export type StoredPartFields = Pick<
  Part,
  | "sku"
  | "category"
  | "brand"
  | "name"
  | "priceMinor"
  | "costMinor"
  | "stock"
  | "reorderLevel"
  | "leadTimeDays"
  | "restockOn"
  | "specs"
>;

/** A stored part → a flat row (CSV export, the edit form). */
export function flatOf(p: StoredPartFields): FlatPart {
  const s = p.specs as Record<string, unknown>;
  const str = (v: unknown) => (v === undefined || v === null ? "" : String(v));
  const yn = (v: unknown) => (v === undefined ? "" : v ? "yes" : "no");
  return {
    sku: p.sku,
    category: p.category,
    brand: p.brand,
    name: p.name,
    price: minorToPlain(p.priceMinor),
    cost: minorToPlain(p.costMinor),
    stock: String(p.stock),
    reorder_level: String(p.reorderLevel),
    lead_time_days: p.leadTimeDays === null ? "" : String(p.leadTimeDays),
    restock_on: p.restockOn ?? "",
    flow_cc_min: str(s.ratedFlowCcPerMin),
    rated_kpa: str(s.ratedPressureKpa),
    min_pulse_ms: str(s.minPulseWidthMs),
    impedance: str(s.impedance),
    connector: str(s.connector),
    ethanol_ok: yn(s.ethanolOk),
    dead_time_ms: isDeadTime(s.deadTime) ? formatDeadTime(s.deadTime) : "",
    pump_curve: Array.isArray(s.curves) ? formatPumpCurve(s.curves as never) : "",
    current_a: str(s.currentA),
    mounting: str(s.mounting),
    regulator_type: p.category === "regulator" ? str(s.type) : "",
    min_kpa: str(s.minPressureKpa),
    max_kpa: str(s.maxPressureKpa),
    an_dash: str(s.dash),
    inside_mm: str(s.insideDiameterMm),
    material: str(s.material),
    micron: str(s.micron),
    drop_kpa: str(s.dropKpa),
    test_fluid_kg_l: str(s.ratingFluidDensityKgPerL),
  };
}
