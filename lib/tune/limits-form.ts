import { parseNumberText } from "@/lib/calc/number-text";
import {
  converter,
  formatValue,
  fromShown,
  shownText,
  unitOf,
  type Quantity,
} from "@/lib/calc/quantities";
import type { TuneLimitKey, TuneLimits } from "@/lib/calc/tune";
import type { UnitSystem } from "@/lib/calc/units";

/** The limits' single figures, in the editors' order, with the quantity each is shown in. */
export const LIMIT_FIELDS: {
  key: Exclude<TuneLimitKey, "lambdaTargets">;
  label: string;
  q: Quantity;
  /** The schema's bounds (lib/calc/tune.ts#TuneLimitsSchema), canonical. */
  min: number;
  max: number;
  /** Blank means "not checked" (null). */
  blankIsNone?: boolean;
}[] = [
  {
    key: "lambdaLeanAllowance",
    label: "Leaner than the target allowed by",
    q: "ratio",
    min: 0,
    max: 0.2,
  },
  { key: "maxDutyPct", label: "Maximum injector duty", q: "percent", min: 50, max: 100 },
  { key: "maxEgtC", label: "Maximum EGT", q: "temperature", min: 300, max: 1200 },
  {
    key: "maxEgtSpreadC",
    label: "Maximum EGT spread between cylinders",
    q: "temperatureDiff",
    min: 5,
    max: 400,
  },
  {
    key: "maxBackPressureRatio",
    label: "Maximum exhaust-to-boost pressure ratio",
    q: "pressureRatio",
    min: 1,
    max: 4,
  },
  {
    key: "maxTurboRpm",
    label: "Maximum turbo speed (blank: not checked)",
    q: "turboSpeed",
    min: 10000,
    max: 400000,
    blankIsNone: true,
  },
  { key: "nearPct", label: "Near: within this much of a maximum", q: "percent", min: 0, max: 25 },
];
const ROW_BOUNDS = {
  boost: { q: "pressure" as const, label: "Boost", min: 0, max: 500 },
  lambda: { q: "lambda" as const, label: "Target lambda", min: 0.6, max: 1.3 },
};

/** The unit a limit field is typed in: "psi", "°F", "λ", ":1", "%" (the lean allowance: λ). */
export function limitUnit(q: Quantity, units: UnitSystem): string {
  if (q === "lambda" || q === "ratio") return "λ";
  return unitOf(q, units) || converter(q, units).prefix?.trim() || "";
}

/**
 * The editor's field errors in the reader's units, before anything is sent (the schema's own
 * messages state canonical units): `{ "limits.maxEgtC": "Maximum EGT must be between 572 °F
 * and 2192 °F" }`, paths as the action answers them.
 */
export function limitsTextErrors(text: LimitsText, units: UnitSystem): Record<string, string> {
  const out: Record<string, string> = {};
  const check = (
    path: string,
    b: { q: Quantity; label: string; min: number; max: number },
    t: string,
  ) => {
    const n = parseNumberText(t);
    if (!t.trim()) out[path] = `Enter the ${b.label.toLowerCase()}`;
    else if (!Number.isFinite(n)) out[path] = `${b.label} must be a number`;
    else {
      const c = fromShown(b.q, n, units);
      // A hair of rounding at the bounds is the bound (1200 °C shows as 2192 °F).
      const tol = Math.max(Math.abs(b.max), 1) * 1e-4;
      if (c < b.min - tol || c > b.max + tol)
        out[path] =
          `${b.label} must be between ${formatValue(b.q, b.min, units)} and ${formatValue(b.q, b.max, units)}`;
    }
  };
  text.rows.forEach((r, i) => {
    check(`limits.lambdaTargets.${i}.boostKpa`, ROW_BOUNDS.boost, r.boost);
    check(`limits.lambdaTargets.${i}.lambda`, ROW_BOUNDS.lambda, r.lambda);
  });
  for (const f of LIMIT_FIELDS) {
    const t = text.single[f.key] ?? "";
    if (f.blankIsNone && !t.trim()) continue;
    check(`limits.${f.key}`, { ...f, label: f.label.replace(/ \(blank.*\)$/, "") }, t);
  }
  return out;
}

/** The limits as an editor's text fields hold them, in the reader's units. */
export interface LimitsText {
  rows: { boost: string; lambda: string }[];
  single: Record<string, string>;
}

/** The limits as the editor shows them: converted and rounded to the registry's precision. */
export function limitsText(limits: TuneLimits, units: UnitSystem): LimitsText {
  return {
    rows: limits.lambdaTargets.map((r) => ({
      boost: shownText("pressure", r.boostKpa, units),
      lambda: shownText("lambda", r.lambda, units),
    })),
    single: Object.fromEntries(
      LIMIT_FIELDS.map((f) => [f.key, shownText(f.q, limits[f.key], units)]),
    ),
  };
}

/** A typed figure in canonical units; a field left as shown is the loaded value exactly. */
function canonical(q: Quantity, text: string, units: UnitSystem, original?: number | null) {
  const n = parseNumberText(text);
  // Not a number: sent as typed, so the schema names the field.
  return Number.isFinite(n) ? fromShown(q, n, units, original) : text;
}

/**
 * The editor's text back in canonical units, for the save. A figure left as it was shown is
 * exactly what was loaded (60 kPa shown as 8.7 psi is 60, never 59.98), so an unchanged save
 * sends what is stored and writes nothing; a typed one keeps one digit more than metric shows.
 */
export function limitsFromText(
  text: LimitsText,
  units: UnitSystem,
  loaded: TuneLimits,
): Record<string, unknown> {
  return {
    lambdaTargets: text.rows.map((r, i) => {
      const was = loaded.lambdaTargets[i];
      return {
        boostKpa: canonical("pressure", r.boost, units, was?.boostKpa),
        lambda: canonical("lambda", r.lambda, units, was?.lambda),
      };
    }),
    ...Object.fromEntries(
      LIMIT_FIELDS.map((f) => {
        const t = text.single[f.key] ?? "";
        if (f.blankIsNone && !t.trim()) return [f.key, null];
        return [f.key, canonical(f.q, t, units, loaded[f.key])];
      }),
    ),
  };
}

/** Has the person changed anything since the editor was filled? */
export function limitsTextChanged(a: LimitsText, b: LimitsText): boolean {
  return JSON.stringify(a) !== JSON.stringify(b);
}
