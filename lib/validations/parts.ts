import { z } from "zod";

import { type Part } from "@/db/schema/catalog";
import { DeadTimeTableSchema, PumpCurveSchema, REGULATOR_TYPES } from "@/lib/calc";
import { minorToPlain, parseMoney } from "@/lib/catalog/money";
import { PART_CATEGORIES, type PartCategory } from "@/lib/domain/parts";

/** The specification each category carries (canonical units, as lib/calc uses them). */
export const SPEC_SCHEMAS = {
  injector: z.object({
    ratedFlowCcPerMin: z.number().min(20).max(10000),
    ratedPressureKpa: z.number().min(100).max(1000),
    minPulseWidthMs: z.number().min(0.1).max(10).optional(),
    impedance: z.enum(["high", "low"]).optional(),
    connector: z.string().max(40).optional(),
    ethanolOk: z.boolean(),
    deadTime: DeadTimeTableSchema.optional(),
  }),
  pump: z.object({
    curves: z.array(PumpCurveSchema).min(1).max(8),
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
  "flow_cc_min",
  "rated_kpa",
  "min_pulse_ms",
  "impedance",
  "connector",
  "ethanol_ok",
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
] as const;
export type FlatPart = Partial<Record<(typeof CSV_COLUMNS)[number], string>>;

const blank = (v: string | undefined) => v === undefined || v.trim() === "";
const numOf = (v: string | undefined) =>
  blank(v) ? undefined : Number(v!.trim().replace(",", "."));
const intText = (label: string) =>
  z
    .string({ error: `${label} is required` })
    .trim()
    .regex(/^\d{1,7}$/, `${label} must be a whole number of 0 or more`)
    .transform(Number);

/** "13.5V 300:340 500:290 | 12V 300:300" → pump curves (pressure kPa : flow L/h at each voltage). */
export function parsePumpCurve(text: string) {
  return text.split("|").map((seg) => {
    const m = /^\s*(\d+(?:\.\d+)?)\s*V\s+(.+)$/i.exec(seg);
    if (!m) return { voltage: NaN, points: [] };
    const points = m[2]!
      .trim()
      .split(/\s+/)
      .map((p) => {
        const [pk, fl] = p.split(":");
        return { pressureKpa: Number(pk), flowLPerH: Number(fl) };
      });
    return { voltage: Number(m[1]), points };
  });
}
export function formatPumpCurve(
  curves: { voltage: number; points: { pressureKpa: number; flowLPerH: number }[] }[],
): string {
  return curves
    .map((c) => `${c.voltage}V ${c.points.map((p) => `${p.pressureKpa}:${p.flowLPerH}`).join(" ")}`)
    .join(" | ");
}

const money = (label: string, required: boolean) =>
  z
    .string()
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
      return m;
    });

/** A flat row → the part's columns and validated specs, with field-named errors. */
export const FlatPartSchema = z
  .object({
    sku: z
      .string({ error: "SKU is required" })
      .trim()
      .min(1, "SKU is required")
      .max(60, "SKU is too long (at most 60 characters)"),
    category: z.enum(PART_CATEGORIES, {
      error: `Category must be one of ${PART_CATEGORIES.join(", ")}`,
    }),
    brand: z.string({ error: "Brand is required" }).trim().min(1, "Brand is required").max(80),
    name: z.string({ error: "Name is required" }).trim().min(1, "Name is required").max(200),
    price: money("Price", true),
    cost: money("Cost", false),
    stock: intText("Stock"),
    reorder_level: z
      .string()
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
  })
  .passthrough()
  .transform((row, ctx) => {
    const r = row as unknown as FlatPart & { category: PartCategory };
    const n = (col: keyof FlatPart) => {
      const v = numOf(r[col]);
      if (v !== undefined && !Number.isFinite(v))
        ctx.addIssue({ code: "custom", path: [col], message: `${col} must be a number` });
      return v;
    };
    const bool = (col: keyof FlatPart) => {
      const v = (r[col] ?? "").trim().toLowerCase();
      if (v === "") return false;
      if (["yes", "y", "true", "1"].includes(v)) return true;
      if (["no", "n", "false", "0"].includes(v)) return false;
      ctx.addIssue({ code: "custom", path: [col], message: `${col} must be yes or no` });
      return false;
    };
    const text = (col: keyof FlatPart) => (blank(r[col]) ? undefined : r[col]!.trim());
    let raw: unknown;
    switch (r.category) {
      case "injector":
        raw = {
          ratedFlowCcPerMin: n("flow_cc_min"),
          ratedPressureKpa: n("rated_kpa") ?? 300,
          minPulseWidthMs: n("min_pulse_ms"),
          impedance: text("impedance"),
          connector: text("connector"),
          ethanolOk: bool("ethanol_ok"),
        };
        break;
      case "pump":
        raw = {
          curves: blank(r.pump_curve) ? undefined : parsePumpCurve(r.pump_curve!),
          currentA: n("current_a"),
          mounting: text("mounting"),
          ethanolOk: bool("ethanol_ok"),
        };
        break;
      case "regulator":
        raw = {
          type: text("regulator_type"),
          minPressureKpa: n("min_kpa"),
          maxPressureKpa: n("max_kpa"),
          dash: n("an_dash"),
        };
        break;
      case "line":
        raw = {
          dash: n("an_dash"),
          insideDiameterMm: n("inside_mm"),
          material: text("material"),
          ethanolOk: bool("ethanol_ok"),
        };
        break;
      case "fitting":
        raw = { dash: n("an_dash") };
        break;
      case "filter":
        raw = {
          micron: n("micron"),
          dropKpa: n("drop_kpa") ?? 0,
          dash: n("an_dash"),
          ethanolOk: bool("ethanol_ok"),
        };
        break;
      case "sensor":
        raw = { kind: "ethanol" };
        break;
      default:
        raw = {};
    }
    const specs = (SPEC_SCHEMAS[r.category] as z.ZodType).safeParse(raw);
    if (!specs.success) {
      for (const i of specs.error.issues)
        ctx.addIssue({
          code: "custom",
          path: [SPEC_COLUMN[String(i.path[0])] ?? String(i.path[0])],
          message: specMessage(String(i.path[0]), i.message),
        });
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
      specs: specs.data as Record<string, unknown>,
    };
  });
export type PartValues = z.output<typeof FlatPartSchema>;

/** Spec field → the CSV column it comes from, so errors name the column the user sees. */
const SPEC_COLUMN: Record<string, string> = {
  ratedFlowCcPerMin: "flow_cc_min",
  ratedPressureKpa: "rated_kpa",
  minPulseWidthMs: "min_pulse_ms",
  impedance: "impedance",
  connector: "connector",
  ethanolOk: "ethanol_ok",
  curves: "pump_curve",
  currentA: "current_a",
  mounting: "mounting",
  type: "regulator_type",
  minPressureKpa: "min_kpa",
  maxPressureKpa: "max_kpa",
  dash: "an_dash",
  insideDiameterMm: "inside_mm",
  material: "material",
  micron: "micron",
  dropKpa: "drop_kpa",
};
const SPEC_HINT: Record<string, string> = {
  ratedFlowCcPerMin: "flow_cc_min needs the rated flow in cc/min (20 to 10000)",
  ratedPressureKpa: "rated_kpa needs the rating pressure in kPa (100 to 1000)",
  curves:
    "pump_curve needs curves like “13.5V 300:340 500:290” (kPa:L/h), at least two points each",
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

/** A stored part → a flat row (CSV export, the edit form). */
export function flatOf(
  p: Pick<
    Part,
    | "sku"
    | "category"
    | "brand"
    | "name"
    | "priceMinor"
    | "costMinor"
    | "stock"
    | "reorderLevel"
    | "specs"
  >,
): FlatPart {
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
    flow_cc_min: str(s.ratedFlowCcPerMin),
    rated_kpa: str(s.ratedPressureKpa),
    min_pulse_ms: str(s.minPulseWidthMs),
    impedance: str(s.impedance),
    connector: str(s.connector),
    ethanol_ok: yn(s.ethanolOk),
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
  };
}

export const PartListQuery = z.object({
  q: z.string().trim().max(100, "Search is too long").optional(),
  category: z.enum(PART_CATEGORIES, { error: "Unknown category" }).optional(),
  sort: z
    .enum(["name", "sku", "price", "stock"], { error: "Sort by name, sku, price or stock" })
    .default("name"),
  limit: z.coerce.number().int().min(1).max(500).default(200),
});
