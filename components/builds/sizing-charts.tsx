"use client";

import { memo } from "react";

import {
  LinePlot,
  type LinePlotProps,
  type PlotAxis,
  type PlotRow,
  type Tone,
} from "@/components/charts/line-plot";
import {
  dutyAcrossEthanol,
  dutyAcrossRpm,
  formatValue,
  fuelPressureChart,
  niceTicks,
  pumpBoostChart,
  pumpSupplyCurve,
  toShown,
  unitOf,
  type BoostChart,
  type FuelSystemResult,
  type ParsedFuelSystemInput,
  type UnitSystem,
} from "@/lib/calc";

/** Each line's colour by its key: the spec sheet's (lib/pdf/boost-charts.tsx) in the palette. */
const TONES: Record<string, Tone> = {
  rail: "copper",
  across: "ink",
  manifold: "danger",
  supply: "copper",
  demand: "danger",
};

/**
 * A chart drawn again only when what it draws changed: its props are plain data (rows, axes,
 * labels), compared by content, so a keystroke that moves one curve redraws that chart alone —
 * typing the target power leaves the fuel pressure chart as it is, typing a title redraws none.
 */
const Chart = memo(LinePlot, (a, b) => a === b || contentOf(a) === contentOf(b));
const contents = new WeakMap<object, string>();
function contentOf(props: object) {
  let c = contents.get(props);
  if (c === undefined) {
    c = JSON.stringify(props);
    contents.set(props, c);
  }
  return c;
}

/** An axis over `min`…`max` with round ticks inside it. */
function axisOver(label: string, unit: string, min: number, max: number): PlotAxis {
  const t = niceTicks(min, max);
  return { label, unit, min, max: max > min ? max : min + 1, ticks: t.ticks, decimals: t.decimals };
}
/** An axis from 0 up to the round tick at or above the largest of `values`. */
function axisUpTo(label: string, unit: string, values: number[]): PlotAxis {
  const t = niceTicks(0, Math.max(0, ...values.filter(Number.isFinite)), 5, true);
  return { label, unit, min: 0, max: t.ticks.at(-1)!, ticks: t.ticks, decimals: t.decimals };
}

/** A chart against boost (lib/calc/charts.ts, the spec sheet's data) as the plot draws it. */
function boostPlot(chart: BoostChart): LinePlotProps {
  return {
    title: chart.title,
    summary: chart.summary,
    x: chart.x,
    y: chart.y,
    series: chart.lines.map((l) => ({
      key: l.key,
      label: l.label,
      tone: TONES[l.key] ?? "ink",
      dashed: l.dashed,
    })),
    rows: chart.rows,
    marks: chart.marker
      ? [{ axis: "x", value: chart.marker.x, label: chart.marker.label, tone: "ink" }]
      : [],
  };
}

/**
 * Duty across engine speed and across ethanol content, fuel pressure and pump supply against
 * boost, pump supply against pressure: plain SVG (components/charts/line-plot.tsx).
 */
export function SizingCharts({
  input,
  result,
  units = "metric",
}: {
  input: ParsedFuelSystemInput;
  result: FuelSystemResult;
  units?: UnitSystem;
}) {
  const pu = unitOf("pressure", units);
  const fu = unitOf("volumeFlow", units);
  const rpmUnit = unitOf("speed", units);
  const P = (kpa: number) => toShown("pressure", kpa, units);
  const F = (lph: number) => toShown("volumeFlow", lph, units);
  const danger = result.limits.dutyDangerPct;
  const dangerMark = {
    axis: "y",
    value: danger,
    label: `danger ${danger}${"\u00a0"}%`,
    tone: "danger",
  } as const;

  // The series are cheap (a few dozen points); each chart is drawn only when its content changes.
  const rpmRows: PlotRow[] = dutyAcrossRpm(
    result,
    input.engine.idleRpm,
    input.engine.redlineRpm,
    20,
  ).map((p) => ({
    x: Math.round(p.rpm),
    lean: +p.dutyPctLean.toFixed(1),
    rich: +p.dutyPctRich.toFixed(1),
  }));
  const rich = `E${input.fuel.ethanolMaxVolPct}`;
  const lean = `E${input.fuel.ethanolMinVolPct}`;
  const dutyRpm: LinePlotProps = {
    title: "Duty across engine speed",
    summary: `Duty rises to ${formatValue("percent", result.injector.dutyPct, units, 0)} at ${formatValue("speed", input.engine.redlineRpm, units)}`,
    x: axisOver("engine speed", rpmUnit, input.engine.idleRpm, input.engine.redlineRpm),
    y: axisUpTo("injector duty", "%", [...rpmRows.flatMap((r) => [r.lean!, r.rich!]), danger]),
    series:
      rich === lean
        ? [{ key: "rich", label: rich, tone: "copper" }]
        : [
            { key: "rich", label: rich, tone: "copper" },
            { key: "lean", label: lean, tone: "ink", dashed: true },
          ],
    rows: rpmRows,
    marks: [dangerMark],
  };

  const ethRows: PlotRow[] = dutyAcrossEthanol(input, result.crankPowerKw, 11).map((p) => ({
    x: p.ethanolVolPct,
    duty: +p.dutyPct.toFixed(1),
  }));
  const from = input.fuel.ethanolMinVolPct;
  const to = input.fuel.ethanolMaxVolPct;
  const dutyEthanol: LinePlotProps = {
    title: "Duty across ethanol content",
    summary: "Duty at the target power from E0 to E100",
    x: axisOver("ethanol content", "%", 0, 100),
    y: axisUpTo("injector duty", "%", [...ethRows.map((r) => r.duty!), danger]),
    series: [{ key: "duty", label: "duty", tone: "copper", dots: true }],
    rows: ethRows,
    marks: [
      dangerMark,
      { axis: "x", value: from, label: `E${from}`, tone: "ink" },
      ...(from === to ? [] : [{ axis: "x", value: to, label: `E${to}`, tone: "ink" } as const]),
    ],
  };

  const pumpRows: PlotRow[] = pumpSupplyCurve(input, result, 20).map((p) => ({
    x: P(p.pressureKpa),
    supply: F(p.supplyLPerH),
    demand: F(p.demandLPerH),
  }));
  const working = P(result.pump.outletPressureKpa);
  const pumpPressure: LinePlotProps = {
    title: "Pump supply against pressure",
    summary: `Supply ${F(result.pump.supplyLPerH)} ${fu} against demand ${F(result.pump.demandLPerH)} ${fu} at ${working} ${pu}`,
    x: axisOver("pump outlet pressure", pu, 0, Math.max(0, ...pumpRows.map((r) => r.x))),
    y: axisUpTo(
      "fuel flow",
      fu,
      pumpRows.flatMap((r) => [r.supply!, r.demand!]),
    ),
    series: [
      { key: "supply", label: "supply", tone: "copper" },
      { key: "demand", label: "demand", tone: "danger", dashed: true },
    ],
    rows: pumpRows,
    marks: [{ axis: "x", value: working, label: "working", tone: "ink" }],
  };

  // The charts against boost: the spec sheet draws the same data (lib/calc/charts.ts).
  const pressure = fuelPressureChart(result, units);
  const staged = pumpBoostChart(result, units);
  return (
    <div className="space-y-4" data-testid="sizing-charts">
      <Chart {...dutyRpm} />
      <Chart {...dutyEthanol} />
      {pressure.drawable ? <Chart {...boostPlot(pressure)} /> : null}
      {staged.drawable ? <Chart {...boostPlot(staged)} /> : null}
      <Chart {...pumpPressure} />
    </div>
  );
}
