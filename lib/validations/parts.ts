import { z } from "zod";

import { DeadTimeTableSchema, PumpCurvesSchema, REGULATOR_TYPES } from "@/lib/calc";
import {
  CSV_COLUMNS,
  formatDeadTime,
  formatPumpCurve,
  parseDeadTime,
  parsePumpCurve,
  type FlatPart,
} from "@/lib/catalog/flat-part";
import { minorToPlain, parseMoney } from "@/lib/catalog/money";
import type { FieldIssue } from "@/lib/domain/errors";
import { PART_CATEGORIES, type PartCategory } from "@/lib/domain/parts";

import { calendarDate, editVersion, INT4_MAX } from "./column-bounds";
import { searchText } from "./search";

export {
  CSV_COLUMNS,
  flatOf,
  formatDeadTime,
  formatPumpCurve,
  parseDeadTime,
  parsePumpCurve,
  type FlatPart,
} from "@/lib/catalog/flat-part";

/** The specification each category carries (canonical units, as lib/calc uses them). */
export const SPEC_SCHEMAS = {
  injector: z.object({
    ratedFlowCcPerMin: z.number().min(20).max(10000),
    ratedPressureKpa: z.number().min(100).max(1000),
    minPulseWidthMs: z.number().min(0.1).max(10).optional(),
    /** Density of the fluid the rating was measured with (n-heptane 0.684 kg/L); §3.10. */
    ratingFluidDensityKgPerL: z.number().min(0.6).max(1.1).optional(),
    impedance: z.enum(["high", "low"]).optional(),
    connector: z.string().max(40).optional(),
    ethanolOk: z.boolean(),
    deadTime: DeadTimeTableSchema.optional(),
  }),
  pump: z.object({
    curves: PumpCurvesSchema,
    currentA: z.number().min(0).max(80).optional(),
    mounting: z.enum(["in-tank", "inline"]),
    ethanolOk: z.boolean(),
  }),
  regulator: z
    .object({
      type: z.enum(REGULATOR_TYPES),
      minPressureKpa: z.number().min(50).max(1000),
      maxPressureKpa: z.number().min(50).max(1500),
      dash: z.number().int().min(4).max(16).optional(),
    })
    .refine((r) => r.minPressureKpa <= r.maxPressureKpa, {
      path: ["maxPressureKpa"],
      message: "The highest pressure must not be below the lowest",
    }),
  line: z.object({
    dash: z.number().int().min(3).max(20),
    insideDiameterMm: z.number().min(2).max(40),
    material: z.string().max(40).optional(),
    ethanolOk: z.boolean(),
  }),
  fitting: z.object({ dash: z.number().int().min(3).max(20).optional() }),
  filter: z.object({
    micron: z.number().min(1).max(500),
    dropKpa: z.number().min(0).max(100),
    dash: z.number().int().min(3).max(20).optional(),
    ethanolOk: z.boolean(),
  }),
  sensor: z.object({ kind: z.literal("ethanol").default("ethanol") }),
  other: z.object({}),
} satisfies Record<PartCategory, z.ZodType>;

const blank = (v: string | undefined) => v === undefined || v.trim() === "";
/**
 * A flat field given as a JSON number (`"stock": 1` through the API) reads as the text it would
 * be in a form or a CSV cell (`"1"`), so the same checks and messages apply to both.
 */
const numberAsText = <T extends z.ZodType>(schema: T) =>
  z.preprocess((v) => (typeof v === "number" && Number.isFinite(v) ? String(v) : v), schema);
const intText = (label: string) =>
  numberAsText(
    z
      .string({ error: `${label} is required` })
      .trim()
      .regex(/^\d{1,7}$/, `${label} must be a whole number of 0 or more`)
      .transform(Number),
  );

const money = (label: string, required: boolean) =>
  numberAsText(
    z
      .string({ error: `${label} must be an amount like 349.00` })
      .optional()
      .transform((v, ctx) => {
        if (blank(v)) {
          if (required) ctx.addIssue({ code: "custom", message: `${label} is required` });
          return 0;
        }
        const m = parseMoney(v!);
        if (m === null) {
          ctx.addIssue({ code: "custom", message: `${label} must be an amount like 349.00` });
          return 0;
        }
        if (m > INT4_MAX) {
          ctx.addIssue({
            code: "custom",
            message: `${label} must be at most ${minorToPlain(INT4_MAX)}`,
          });
          return 0;
        }
        return m;
      }),
  );

/** A spec column as it arrives: text (a number or yes/no from a JSON client is taken as text). */
const specCell = (col: string, max: number) =>
  z.preprocess(
    (v) => (typeof v === "number" || typeof v === "boolean" ? String(v) : v),
    z
      .string({ error: `${col} must be text or a number` })
      .max(max, `${col} is too long (at most ${max} characters)`),
  );
/** Room for the largest table the schema takes (8 curves of 40 points, 20 × 20 dead times). */
const TABLE_CELL_MAX = 8000;

/** How a spec column becomes a spec key: its kind, and what a blank cell gives (else "not given"). */
interface SpecColumn {
  key: string;
  kind: "number" | "text" | "yesno" | "curves" | "deadTime";
  blank?: unknown;
}
const SPEC_COLUMNS = {
  flow_cc_min: { key: "ratedFlowCcPerMin", kind: "number" },
  rated_kpa: { key: "ratedPressureKpa", kind: "number", blank: 300 },
  min_pulse_ms: { key: "minPulseWidthMs", kind: "number" },
  impedance: { key: "impedance", kind: "text" },
  connector: { key: "connector", kind: "text" },
  ethanol_ok: { key: "ethanolOk", kind: "yesno" },
  dead_time_ms: { key: "deadTime", kind: "deadTime" },
  pump_curve: { key: "curves", kind: "curves" },
  current_a: { key: "currentA", kind: "number" },
  mounting: { key: "mounting", kind: "text" },
  regulator_type: { key: "type", kind: "text" },
  min_kpa: { key: "minPressureKpa", kind: "number" },
  max_kpa: { key: "maxPressureKpa", kind: "number" },
  an_dash: { key: "dash", kind: "number" },
  inside_mm: { key: "insideDiameterMm", kind: "number" },
  material: { key: "material", kind: "text" },
  micron: { key: "micron", kind: "number" },
  drop_kpa: { key: "dropKpa", kind: "number", blank: 0 },
  test_fluid_kg_l: { key: "ratingFluidDensityKgPerL", kind: "number" },
} satisfies Partial<Record<(typeof CSV_COLUMNS)[number], SpecColumn>>;
type SpecColumnName = keyof typeof SPEC_COLUMNS;
const SPEC_COLUMN_NAMES = Object.keys(SPEC_COLUMNS) as SpecColumnName[];

/** The spec keys each category stores (from its schema): injector → ratedFlowCcPerMin … deadTime. */
export const SPEC_KEYS = Object.fromEntries(
  PART_CATEGORIES.map((c) => [c, Object.keys((SPEC_SCHEMAS[c] as z.ZodObject).shape)]),
) as Record<PartCategory, string[]>;

/**
 * What some flat columns say about a part's specs: the values of the keys they give, and every
 * key they speak for (`covered`; a blank cell with no default clears its key). A key no sent
 * column speaks for is left as stored (a file or form without `dead_time_ms` keeps the table).
 */
export interface SpecChange {
  values: Record<string, unknown>;
  covered: string[];
}

type IssueSink = (path: string, message: string) => void;

/** Reads the spec columns present in `row` (every one when `all`: a new part's blanks count). */
function specChangeOf(
  row: Partial<Record<SpecColumnName, string>>,
  issue: IssueSink,
  all: boolean,
): SpecChange {
  const values: Record<string, unknown> = {};
  const covered: string[] = [];
  for (const col of SPEC_COLUMN_NAMES) {
    const raw = row[col];
    if (raw === undefined && !all) continue;
    const spec: SpecColumn = SPEC_COLUMNS[col];
    covered.push(spec.key);
    const cell = (raw ?? "").trim();
    let v: unknown;
    if (cell === "") v = spec.kind === "yesno" ? false : spec.blank;
    else if (spec.kind === "text") v = cell;
    else if (spec.kind === "curves") v = parsePumpCurve(cell);
    else if (spec.kind === "deadTime") v = parseDeadTime(cell);
    else if (spec.kind === "yesno") {
      const t = cell.toLowerCase();
      if (["yes", "y", "true", "1"].includes(t)) v = true;
      else if (["no", "n", "false", "0"].includes(t)) v = false;
      else {
        issue(col, `${col} must be yes or no`);
        v = false;
      }
    } else {
      v = Number(cell.replace(",", "."));
      if (!Number.isFinite(v)) issue(col, `${col} must be a number`);
    }
    if (v !== undefined) values[spec.key] = v;
  }
  return { values, covered };
}

/**
 * A part's specs after a change: the stored specs (of the same category; pass `{}` when the
 * category changes) with each key the change speaks for set to its value or removed, and every
 * other stored key kept exactly as it was.
 */
export function mergeSpecs(
  category: PartCategory,
  stored: Record<string, unknown>,
  change: SpecChange,
): Record<string, unknown> {
  const keys = new Set(SPEC_KEYS[category]);
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(stored)) if (keys.has(k)) out[k] = v;
  for (const k of change.covered) {
    if (!keys.has(k)) continue;
    if (change.values[k] === undefined) delete out[k];
    else out[k] = change.values[k];
  }
  return out;
}

/** The spec keys some flat columns speak for (a CSV's header → what its rows may change). */
export function specKeysOfColumns(columns: readonly string[]): string[] {
  return SPEC_COLUMN_NAMES.filter((c) => columns.includes(c)).map((c) => SPEC_COLUMNS[c].key);
}

/** Checks a category's specs; errors name the column the person sees (`flow_cc_min`). */
export function checkSpecs(
  category: PartCategory,
  specs: Record<string, unknown>,
): { ok: true; specs: Record<string, unknown> } | { ok: false; issues: FieldIssue[] } {
  const r = (SPEC_SCHEMAS[category] as z.ZodType).safeParse(specs);
  if (r.success) return { ok: true, specs: r.data as Record<string, unknown> };
  const issues = r.error.issues.map((i) => ({
    path: SPEC_COLUMN[String(i.path[0])] ?? String(i.path[0] ?? "specs"),
    // A curve's own finding (a repeated pressure, a flow rising with pressure) names the curve
    // by its voltage and the point: said as it is, not as the cell's general format.
    message:
      i.path[0] === "curves" && i.code === "custom" && i.path.length > 2
        ? `Flow curve: ${i.message}`
        : specMessage(String(i.path[0]), i.message),
  }));
  // A table's several faults read as one hint, said once.
  const seen = new Set<string>();
  return {
    ok: false,
    issues: issues.filter(
      (i) => !seen.has(`${i.path}\n${i.message}`) && seen.add(`${i.path}\n${i.message}`),
    ),
  };
}

/** The longest lead time a part may state: ten years of days. */
export const LEAD_TIME_MAX_DAYS = 3650;

const requiredText = (label: string, max: number) =>
  z
    .string({ error: `${label} is required` })
    .trim()
    .min(1, `${label} is required`)
    .max(max, `${label} is too long (at most ${max} characters)`);

/** A part's flat fields (the CSV's columns, the part form's fields), as text; blanks are "not given". */
export const PartFieldsSchema = z.object({
  sku: requiredText("SKU", 60),
  category: z.enum(PART_CATEGORIES, {
    error: `Category must be one of ${PART_CATEGORIES.join(", ")}`,
  }),
  brand: requiredText("Brand", 80),
  name: requiredText("Name", 200),
  price: money("Price", true),
  cost: money("Cost", false),
  stock: intText("Stock"),
  reorder_level: numberAsText(
    z
      .string({ error: "Reorder level must be a whole number of 0 or more" })
      .optional()
      .transform((v, ctx) => {
        if (blank(v)) return 0;
        if (!/^\d{1,7}$/.test(v!.trim()))
          ctx.addIssue({
            code: "custom",
            message: "Reorder level must be a whole number of 0 or more",
          });
        return Number(v);
      }),
  ),
  lead_time_days: numberAsText(
    z
      .string({ error: `Lead time must be a whole number of days, 0 to ${LEAD_TIME_MAX_DAYS}` })
      .optional()
      .transform((v, ctx): number | null => {
        if (blank(v)) return null;
        const t = v!.trim();
        if (!/^\d{1,4}$/.test(t) || Number(t) > LEAD_TIME_MAX_DAYS) {
          ctx.addIssue({
            code: "custom",
            message: `Lead time must be a whole number of days, 0 to ${LEAD_TIME_MAX_DAYS}`,
          });
          return null;
        }
        return Number(t);
      }),
  ),
  restock_on: z
    .string()
    .optional()
    .transform((v, ctx): string | null => {
      if (blank(v)) return null;
      const r = calendarDate().safeParse(v!.trim());
      if (!r.success) {
        ctx.addIssue({
          code: "custom",
          message: `Expected restock: ${r.error.issues[0]?.message ?? "give a date as YYYY-MM-DD"}`,
        });
        return null;
      }
      return r.data;
    }),
  ...(Object.fromEntries(
    SPEC_COLUMN_NAMES.map((c) => {
      const tabular = ["curves", "deadTime"].includes(SPEC_COLUMNS[c].kind);
      return [c, specCell(c, tabular ? TABLE_CELL_MAX : 2000).optional()];
    }),
  ) as Record<SpecColumnName, z.ZodOptional<ReturnType<typeof specCell>>>),
});

const sinkOf =
  (ctx: z.RefinementCtx): IssueSink =>
  (path, message) =>
    ctx.addIssue({ code: "custom", path: [path], message });

/** A new part from a flat row: every column counts (a missing one is blank), specs checked. */
export const FlatPartSchema = PartFieldsSchema.transform((row, ctx) => {
  const change = specChangeOf(row, sinkOf(ctx), true);
  const specs = checkSpecs(row.category, mergeSpecs(row.category, {}, change));
  if (!specs.ok) {
    for (const i of specs.issues) sinkOf(ctx)(i.path, i.message);
    return z.NEVER;
  }
  return {
    sku: row.sku,
    category: row.category,
    brand: row.brand,
    name: row.name,
    priceMinor: row.price,
    costMinor: row.cost,
    stock: row.stock,
    reorderLevel: row.reorder_level,
    leadTimeDays: row.lead_time_days,
    restockOn: row.restock_on,
    specs: specs.specs,
  };
});
export type PartValues = z.output<typeof FlatPartSchema>;

/**
 * A change to a part: the `.partial()` of the part's fields, plus its id and, optionally, the
 * `version` the edit started from (the form always sends it; a stale one is 409). Only the fields
 * sent change; the spec columns sent are merged into the stored specs by the command, which
 * knows the stored category and checks the result.
 */
export const PartUpdateSchema = PartFieldsSchema.partial()
  .extend({ id: z.uuid("Unknown part"), version: editVersion() })
  .transform((row, ctx) => {
    const fields: Partial<Omit<PartValues, "specs">> = {
      sku: row.sku,
      category: row.category,
      brand: row.brand,
      name: row.name,
      priceMinor: row.price,
      costMinor: row.cost,
      stock: row.stock,
      reorderLevel: row.reorder_level,
      leadTimeDays: row.lead_time_days,
      restockOn: row.restock_on,
    };
    for (const k of Object.keys(fields) as (keyof typeof fields)[])
      if (fields[k] === undefined) delete fields[k];
    return {
      id: row.id,
      version: row.version,
      fields,
      specs: specChangeOf(row, sinkOf(ctx), false),
    };
  });
export type PartUpdate = z.output<typeof PartUpdateSchema>;

export const PartIdSchema = z.object({ id: z.uuid("Unknown part") });

/** Spec field → the CSV column it comes from, so errors name the column the user sees. */
const SPEC_COLUMN: Record<string, string> = Object.fromEntries(
  Object.entries(SPEC_COLUMNS).map(([col, spec]) => [spec.key, col]),
);
const SPEC_HINT: Record<string, string> = {
  ratedFlowCcPerMin: "flow_cc_min needs the rated flow in cc/min (20 to 10000)",
  ratedPressureKpa: "rated_kpa needs the rating pressure in kPa (100 to 1000)",
  ratingFluidDensityKgPerL:
    "test_fluid_kg_l needs the rating fluid's density in kg/L (0.6 to 1.1), or a blank",
  curves:
    "Flow curve needs curves like “13.5V 300:340 500:290” (kPa:L/h), at least two points each",
  deadTime:
    "dead_time_ms needs a table like “12V 300:0.85 500:0.95 | 14V 300:0.65 500:0.72” (kPa:ms): voltages rising, the same rising pressures for each, 0 to 10 ms",
  mounting: "mounting must be in-tank or inline",
  type: "regulator_type must be boost-referenced or fixed",
  minPressureKpa: "min_kpa needs the lowest setting in kPa",
  maxPressureKpa: "max_kpa needs the highest setting in kPa",
  dash: "an_dash needs the AN dash size (a whole number such as 6 or 8)",
  insideDiameterMm: "inside_mm needs the inside diameter in mm (2 to 40)",
  micron: "micron needs the filter rating in µm",
  impedance: "impedance must be high or low",
};
const specMessage = (field: string, fallback: string) =>
  SPEC_HINT[field] ?? `${SPEC_COLUMN[field] ?? field}: ${fallback}`;

export const PartListQuery = z.object({
  q: searchText().optional(),
  category: z.enum(PART_CATEGORIES, { error: "Unknown category" }).optional(),
  sort: z
    .enum(["name", "sku", "price", "stock"], { error: "Sort by name, sku, price or stock" })
    .default("name"),
  limit: z.coerce.number().int().min(1).max(500).default(200),
});
