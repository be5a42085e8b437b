// Reference: docs/calculations.md §2.4.
import type { Aspiration } from "./power";

/**
 * The shop's own BSFC, learnt from verified builds: each verified build with a logged power
 * gives one measured BSFC, grouped by fuel class and by aspiration.
 */

/** Fuel classes by ethanol content (% by volume). */
export type FuelClass = "gasoline" | "mid-blend" | "e85";
export const FUEL_CLASS_LABELS: Record<FuelClass, string> = {
  gasoline: "Gasoline (E0–E15)",
  "mid-blend": "Mid blend (E16–E50)",
  e85: "E85 class (E51–E100)",
};
/** Breathing classes, the split the rule-of-thumb BSFC anchors use. */
export type AspirationClass = "na" | "boosted";
export const ASPIRATION_CLASS_LABELS: Record<AspirationClass, string> = {
  na: "Naturally aspirated",
  boosted: "Boosted",
};

/**
 * E15 is the highest blend sold as gasoline in the US (EPA E15 partial waiver); ASTM D5798
 * sets ethanol fuel blends at 51–83 % ethanol, so from E51 up a log counts as E85 class.
 */
export function fuelClassOf(ethanolVolPct: number): FuelClass {
  if (ethanolVolPct <= 15) return "gasoline";
  if (ethanolVolPct <= 50) return "mid-blend";
  return "e85";
}

export const aspirationClassOf = (a: Aspiration): AspirationClass =>
  a === "na" ? "na" : "boosted";

/** One verified build's measured figure. */
export interface BsfcPoint {
  buildId: string;
  ethanolVolPct: number;
  aspiration: Aspiration;
  gPerKwh: number;
}

export interface ShopBsfcRow {
  fuel: FuelClass;
  aspiration: AspirationClass;
  /** Verified builds behind the figure. */
  builds: number;
  meanGPerKwh: number;
  /** Mean ethanol content of those builds: the fuel the figure belongs to (calc-spec §2). */
  meanEthanolVolPct: number;
  minGPerKwh: number;
  maxGPerKwh: number;
}

/** Measured BSFC outside this range is a mapping or logging mistake, not an engine (the sizing's own input range). */
export const MEASURED_BSFC_RANGE = { min: 150, max: 1200 } as const;

/** Groups the points (one per build: a build's later point replaces its earlier one) into the shop's table. */
export function shopBsfcTable(points: readonly BsfcPoint[]): ShopBsfcRow[] {
  const perBuild = new Map<string, BsfcPoint>();
  for (const p of points) {
    if (
      !Number.isFinite(p.gPerKwh) ||
      p.gPerKwh < MEASURED_BSFC_RANGE.min ||
      p.gPerKwh > MEASURED_BSFC_RANGE.max
    )
      continue;
    if (!Number.isFinite(p.ethanolVolPct) || p.ethanolVolPct < 0 || p.ethanolVolPct > 100) continue;
    perBuild.set(p.buildId, p);
  }
  const groups = new Map<
    string,
    { fuel: FuelClass; aspiration: AspirationClass; xs: number[]; es: number[] }
  >();
  for (const p of perBuild.values()) {
    const fuel = fuelClassOf(p.ethanolVolPct);
    const aspiration = aspirationClassOf(p.aspiration);
    const key = `${fuel}/${aspiration}`;
    const g = groups.get(key) ?? { fuel, aspiration, xs: [], es: [] };
    g.xs.push(p.gPerKwh);
    g.es.push(p.ethanolVolPct);
    groups.set(key, g);
  }
  const order: FuelClass[] = ["gasoline", "mid-blend", "e85"];
  return [...groups.values()]
    .map((g) => ({
      fuel: g.fuel,
      aspiration: g.aspiration,
      builds: g.xs.length,
      meanGPerKwh: g.xs.reduce((a, b) => a + b, 0) / g.xs.length,
      meanEthanolVolPct: g.es.reduce((a, b) => a + b, 0) / g.es.length,
      minGPerKwh: Math.min(...g.xs),
      maxGPerKwh: Math.max(...g.xs),
    }))
    .sort(
      (a, b) =>
        order.indexOf(a.fuel) - order.indexOf(b.fuel) || a.aspiration.localeCompare(b.aspiration),
    );
}

/** The shop's row for a sizing at this ethanol content and aspiration, or null when it has none. */
export function shopBsfcFor(
  table: readonly ShopBsfcRow[],
  ethanolVolPct: number,
  aspiration: Aspiration,
): ShopBsfcRow | null {
  if (!Number.isFinite(ethanolVolPct)) return null;
  const fuel = fuelClassOf(ethanolVolPct);
  const asp = aspirationClassOf(aspiration);
  return table.find((r) => r.fuel === fuel && r.aspiration === asp) ?? null;
}
