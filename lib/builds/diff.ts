import {
  formatInput,
  formatResult,
  INPUT_FIELDS,
  KEY_FIGURES,
  labelOf,
  resultField,
  type FuelSystemResult,
  type UnitSystem,
} from "@/lib/calc";

/** Every leaf of a JSON value by dotted path ("pumps.0.curves.0.voltage"). */
export function flatten(
  value: unknown,
  path = "",
  out: Record<string, string | number | boolean | null> = {},
) {
  if (Array.isArray(value))
    value.forEach((v, i) => flatten(v, path ? `${path}.${i}` : String(i), out));
  else if (value && typeof value === "object")
    for (const [k, v] of Object.entries(value)) flatten(v, path ? `${path}.${k}` : k, out);
  else if (value !== undefined) out[path] = value as string | number | boolean | null;
  return out;
}

/** JSON with sorted keys, so that two equal objects compare equal whatever their key order. */
export function stableJson(value: unknown): string {
  return JSON.stringify(value, (_k, v) =>
    v && typeof v === "object" && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v).sort(([a], [b]) => a.localeCompare(b)))
      : v,
  );
}

export interface InputChange {
  path: string;
  label: string;
  before: string;
  after: string;
}

let inputOrder: Map<string, number> | null = null;
/** Paths in the order of the build sheet (the registry's order), unknown ones last. */
function byRegistryOrder(paths: string[]): string[] {
  inputOrder ??= new Map(Object.keys(INPUT_FIELDS).map((k, i) => [k, i]));
  const rank = (p: string) =>
    inputOrder!.get(p.replace(/(^|\.)\d+(?=\.|$)/g, "$1*")) ?? Number.MAX_SAFE_INTEGER;
  return [...paths].sort(
    (a, b) => rank(a) - rank(b) || a.localeCompare(b, "en", { numeric: true }),
  );
}

/** What changed from `a` to `b` in a build's inputs: labels, values in the person's units. */
export function diffInputs(a: unknown, b: unknown, units: UnitSystem): InputChange[] {
  const fa = flatten(a);
  const fb = flatten(b);
  const paths = byRegistryOrder([...new Set([...Object.keys(fa), ...Object.keys(fb)])]);
  return paths
    .filter((p) => fa[p] !== fb[p])
    .map((p) => ({
      path: p,
      label: labelOf(p),
      before: formatInput(p, fa[p], units),
      after: formatInput(p, fb[p], units),
    }));
}

export type Verdict = "better" | "worse" | "same" | "changed";

export interface KeyFigure {
  path: string;
  label: string;
  before: string;
  after: string;
  changed: boolean;
  /** From the registry's direction for the figure; "changed" where neither way is better. */
  verdict: Verdict;
}

const pick = (r: FuelSystemResult | null, path: string): unknown =>
  r ? path.split(".").reduce<unknown>((o, k) => (o as Record<string, unknown>)?.[k], r) : undefined;

/** The headline figures of two results side by side, each marked better or worse. */
export function compareKeyFigures(
  a: FuelSystemResult | null,
  b: FuelSystemResult | null,
  units: UnitSystem,
): KeyFigure[] {
  return KEY_FIGURES.map((path) => {
    const f = resultField(path)!;
    const va = pick(a, path);
    const vb = pick(b, path);
    const before = formatResult(path, va, units);
    const after = formatResult(path, vb, units);
    const changed = before !== after;
    let verdict: Verdict = changed ? "changed" : "same";
    if (changed && f.better && typeof va === "number" && typeof vb === "number") {
      verdict = (f.better === "higher" ? vb > va : vb < va) ? "better" : "worse";
    }
    return { path, label: f.label, before, after, changed, verdict };
  });
}
