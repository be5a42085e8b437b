"use client";

import dynamic from "next/dynamic";

import {
  converter,
  formatNumber,
  formatValue,
  toShown,
  unitOf,
  type Quantity,
} from "@/lib/calc/quantities";
import type { TunePoint } from "@/lib/calc/tune";
import type { UnitSystem } from "@/lib/calc/units";

/** One pull as the chart draws it. */
export interface ChartPull {
  key: string;
  label: string;
  points: TunePoint[];
  /** Engine speeds where a limit was crossed, with the limit's name. */
  overAt: { rpm: number; label: string }[];
}

/** A channel: what it reads, its quantity (axis unit, tooltip), and the side of its axis. */
interface Channel {
  id: string;
  label: string;
  quantity: Quantity;
  read: (p: TunePoint) => number | null;
  dash?: string;
}

/** The groups drawn, each two channels on their own axes (left and right), with units. */
export const CHART_GROUPS: { id: string; title: string; left: Channel; right: Channel }[] = [
  {
    id: "power",
    title: "Power and torque at the crank",
    left: { id: "power", label: "power", quantity: "power", read: (p) => p.powerKw },
    right: {
      id: "torque",
      label: "torque",
      quantity: "torque",
      read: (p) => p.torqueNm,
      dash: "5 3",
    },
  },
  {
    id: "fuel",
    title: "Injector duty and lambda",
    left: { id: "duty", label: "duty", quantity: "percent", read: (p) => p.dutyPct },
    right: {
      id: "lambda",
      label: "lambda",
      quantity: "lambda",
      read: (p) => p.lambda,
      dash: "5 3",
    },
  },
  {
    id: "pressure",
    title: "Boost and fuel-pressure differential",
    left: { id: "boost", label: "boost", quantity: "pressure", read: (p) => p.boostKpa },
    right: {
      id: "fuelDiff",
      label: "fuel ΔP",
      quantity: "pressure",
      read: (p) => p.fuelDiffKpa,
      dash: "5 3",
    },
  },
];

/** The axis name with its unit: "power (hp)", "lambda (λ)", "duty (%)". */
export function axisLabel(c: { label: string; quantity: Quantity }, units: UnitSystem) {
  const u = unitOf(c.quantity, units) || converter(c.quantity, units).prefix?.trim() || "";
  return u ? `${c.label} (${u})` : c.label;
}

/**
 * An axis tick at the quantity's precision in the reader's units ("8.7", "0.86", "1742"): never a
 * float's tail such as 0.8200000000000001. The unit is in the axis's label.
 */
export function tickText(quantity: Quantity, units: UnitSystem) {
  const d = converter(quantity, units).decimals;
  return (v: number | string) => {
    const n = Number(v);
    return Number.isFinite(n) ? String(Number(n.toFixed(d))) : "";
  };
}

/** A charted value back to its quantity's own words: "54.1 psi", "λ 0.86" (never 54.149184…). */
export function tooltipValue(shown: unknown, quantity: Quantity, units: UnitSystem) {
  if (typeof shown !== "number" || !Number.isFinite(shown)) return "—";
  return formatValue(quantity, converter(quantity, units).from(shown), units);
}

/**
 * Pulls overlaid against engine speed (tune-chart-plot.tsx): the charting library loads after
 * the page is usable, not with it.
 */
export const TuneChart = dynamic(() => import("./tune-chart-plot").then((m) => m.TuneChartPlot), {
  ssr: false,
  loading: () => (
    <div className="h-64 rounded-lg border border-dashed border-ink-200 bg-white" aria-hidden />
  ),
});
