"use client";

import { memo, useEffect, useMemo, useState } from "react";
import { flushSync } from "react-dom";
import {
  CartesianGrid,
  Legend,
  Line,
  LineChart,
  ReferenceLine,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from "recharts";

import { axisTick } from "@/components/charts/axis-ticks";
import {
  converter,
  dutyAcrossEthanol,
  dutyAcrossRpm,
  formatValue,
  fuelPressureChart,
  pumpBoostChart,
  pumpSupplyCurve,
  toShown,
  type BoostChart,
  type FuelSystemResult,
  type ParsedFuelSystemInput,
  type UnitSystem,
} from "@/lib/calc";

// Props the charting library compares by identity: the same objects every drawing, so a redraw
// with new rows does not also re-register every axis, line and legend with it.
const MARGIN = { left: 0, right: 8, top: 4, bottom: 4 };
const TICK = { fontSize: 11 };
const DATA_RANGE: [string, string] = ["dataMin", "dataMax"];
const FROM_ZERO: [number, string] = [0, "dataMax"];
const PERCENT_RANGE: [number, number] = [0, 100];
const ticks = new Map<string, (value: number | string) => string>();
/** The axis tick formatter of a unit, one function per unit. */
function tickOf(unit: string) {
  let f = ticks.get(unit);
  if (!f) ticks.set(unit, (f = axisTick(unit)));
  return f;
}

const INK = "#44505c";
const COPPER = "#b3592c";
const DANGER = "#b42d26";

function Chart({
  title,
  summary,
  children,
}: {
  title: string;
  summary: string;
  children: React.ReactElement;
}) {
  return (
    <figure className="rounded-lg border border-ink-200 bg-white p-4">
      <figcaption className="mb-2 font-semibold">{title}</figcaption>
      <div className="h-56" role="img" aria-label={summary}>
        <ResponsiveContainer width="100%" height="100%">
          {children}
        </ResponsiveContainer>
      </div>
    </figure>
  );
}

/**
 * Pump supply against the engine's demand, with one x marked: the one chart drawn against boost
 * and against outlet pressure. ResponsiveContainer hands its measured size to the chart it wraps;
 * this component stands in that place, so it takes `width`/`height` and passes them on (recharts
 * also reads them from the container's context; passed on, the chart draws outside one too).
 */
export function SupplyDemandChart({
  rows,
  xUnit,
  yUnit,
  marker,
  width,
  height,
}: {
  rows: { x: number; supply: number; demand: number }[];
  xUnit: string;
  yUnit: string;
  marker: { x: number; label: string } | null;
  width?: number;
  height?: number;
}) {
  const markerText = marker?.label;
  const markerLabel = useMemo(() => ({ value: markerText, fontSize: 11 }), [markerText]);
  return (
    <LineChart data={rows} width={width} height={height} margin={MARGIN}>
      <CartesianGrid stroke="#e6eaee" />
      <XAxis
        dataKey="x"
        type="number"
        domain={FROM_ZERO}
        tickFormatter={tickOf(xUnit)}
        tick={TICK}
      />
      <YAxis tickFormatter={tickOf(yUnit)} tick={TICK} width={64} />
      <Tooltip />
      <Legend />
      {marker ? (
        <ReferenceLine x={marker.x} stroke={INK} strokeDasharray="2 2" label={markerLabel} />
      ) : null}
      <Line dataKey="supply" name="supply" stroke={COPPER} dot={false} isAnimationActive={false} />
      <Line
        dataKey="demand"
        name="demand"
        stroke={DANGER}
        strokeDasharray="5 3"
        dot={false}
        isAnimationActive={false}
      />
    </LineChart>
  );
}

/**
 * A chart drawn again only when what it draws changed: its props are plain data (rows, units,
 * labels), compared by content, so a keystroke that moves one curve redraws that chart alone —
 * typing the target power leaves the fuel pressure chart as it is, typing a title redraws none.
 */
function sameContent<P extends object>(a: P, b: P) {
  return a === b || contentOf(a) === contentOf(b);
}

/**
 * Redraws take turns, one chart per task: a chart's redraw (the charting library renders it in
 * several passes that cannot be interrupted) is one short task, and a keystroke that arrives
 * while the charts catch up is handled between two charts instead of after all of them. Each
 * chart keeps only its latest wish; the first drawing of a chart is immediate.
 */
const waiting = new Map<object, () => void>();
let turnTaken = false;
const channel = typeof MessageChannel === "undefined" ? null : new MessageChannel();
function nextTurn() {
  const first = waiting.entries().next();
  if (first.done) {
    turnTaken = false;
    return;
  }
  const [who, draw] = first.value;
  waiting.delete(who);
  flushSync(draw);
  schedule();
}
function schedule() {
  turnTaken = true;
  if (channel) channel.port2.postMessage(null);
  else setTimeout(nextTurn, 0);
}
if (channel) channel.port1.onmessage = nextTurn;
function takeTurn(who: object, draw: () => void) {
  waiting.set(who, draw);
  if (!turnTaken) schedule();
}

/** `props` as last drawn: a change waits for its chart's turn (above). */
function useDrawn<P extends object>(props: P): P {
  const [drawn, setDrawn] = useState(props);
  const [who] = useState(() => ({}));
  useEffect(() => {
    if (props === drawn || sameContent(props, drawn)) return;
    takeTurn(who, () => setDrawn(props));
    return () => {
      waiting.delete(who);
    };
  }, [props, drawn, who]);
  return drawn;
}

/** A chart whose redraws take their turn; `props` compared by content (memo above). */
function inTurn<P extends object>(Draw: (props: P) => React.ReactElement) {
  const Drawn = memo(Draw);
  return memo(function InTurn(props: P) {
    return <Drawn {...useDrawn(props)} />;
  }, sameContent);
}
const contents = new WeakMap<object, string>();
function contentOf(props: object) {
  let c = contents.get(props);
  if (c === undefined) {
    c = JSON.stringify(props);
    contents.set(props, c);
  }
  return c;
}

const DutyRpmChart = inTurn(function DutyRpmChart({
  rows,
  danger,
  summary,
  rich,
  lean,
}: {
  rows: { rpm: number; lean: number; rich: number }[];
  danger: number;
  summary: string;
  rich: string;
  lean: string;
}) {
  const dangerLabel = useMemo(
    () => ({ value: `${danger} %`, fontSize: 11, fill: DANGER }),
    [danger],
  );
  return (
    <Chart title="Duty across engine speed" summary={summary}>
      <LineChart data={rows} margin={MARGIN}>
        <CartesianGrid stroke="#e6eaee" />
        <XAxis
          dataKey="rpm"
          type="number"
          domain={DATA_RANGE}
          tickFormatter={tickOf("rpm")}
          tick={TICK}
        />
        <YAxis tickFormatter={tickOf("%")} tick={TICK} width={48} />
        <Tooltip />
        <Legend />
        <ReferenceLine y={danger} stroke={DANGER} strokeDasharray="4 4" label={dangerLabel} />
        <Line dataKey="rich" name={rich} stroke={COPPER} dot={false} isAnimationActive={false} />
        <Line
          dataKey="lean"
          name={lean}
          stroke={INK}
          strokeDasharray="5 3"
          dot={false}
          isAnimationActive={false}
        />
      </LineChart>
    </Chart>
  );
});

const DutyEthanolChart = inTurn(function DutyEthanolChart({
  rows,
  danger,
  from,
  to,
}: {
  rows: { e: number; duty: number }[];
  danger: number;
  /** The build's blend range, marked. */
  from: number;
  to: number;
}) {
  return (
    <Chart title="Duty across ethanol content" summary="Duty at the target power from E0 to E100">
      <LineChart data={rows} margin={MARGIN}>
        <CartesianGrid stroke="#e6eaee" />
        <XAxis
          dataKey="e"
          type="number"
          domain={PERCENT_RANGE}
          tickFormatter={tickOf("%")}
          tick={TICK}
        />
        <YAxis tickFormatter={tickOf("%")} tick={TICK} width={48} />
        <Tooltip />
        <ReferenceLine y={danger} stroke={DANGER} strokeDasharray="4 4" />
        <ReferenceLine x={from} stroke={INK} strokeDasharray="2 2" />
        <ReferenceLine x={to} stroke={INK} strokeDasharray="2 2" />
        <Line dataKey="duty" name="duty" stroke={COPPER} dot isAnimationActive={false} />
      </LineChart>
    </Chart>
  );
});

const PressureChart = inTurn(function PressureChart({ chart }: { chart: BoostChart }) {
  return (
    <Chart title={chart.title} summary={chart.summary}>
      <LineChart data={chart.rows} margin={MARGIN}>
        <CartesianGrid stroke="#e6eaee" />
        <XAxis
          dataKey="x"
          type="number"
          domain={FROM_ZERO}
          tickFormatter={tickOf(chart.x.unit)}
          tick={TICK}
          name="boost"
        />
        <YAxis tickFormatter={tickOf(chart.y.unit)} tick={TICK} width={64} />
        <Tooltip />
        <Legend />
        <Line dataKey="rail" name="rail" stroke={COPPER} dot={false} isAnimationActive={false} />
        <Line
          dataKey="across"
          name="across the injector"
          stroke={INK}
          dot={false}
          isAnimationActive={false}
        />
        <Line
          dataKey="manifold"
          name="manifold"
          stroke={DANGER}
          strokeDasharray="5 3"
          dot={false}
          isAnimationActive={false}
        />
      </LineChart>
    </Chart>
  );
});

const SupplyDemandCard = inTurn(function SupplyDemandCard({
  title,
  summary,
  ...chart
}: {
  title: string;
  summary: string;
  rows: { x: number; supply: number; demand: number }[];
  xUnit: string;
  yUnit: string;
  marker: { x: number; label: string } | null;
}) {
  return (
    <Chart title={title} summary={summary}>
      <SupplyDemandChart {...chart} />
    </Chart>
  );
});

/** Duty across engine speed and across ethanol content; pump supply against pressure. */
export function SizingCharts({
  input,
  result,
  units = "metric",
}: {
  input: ParsedFuelSystemInput;
  result: FuelSystemResult;
  units?: UnitSystem;
}) {
  const pu = converter("pressure", units).unit;
  const fu = converter("volumeFlow", units).unit;
  const P = (kpa: number) => toShown("pressure", kpa, units);
  const F = (lph: number) => toShown("volumeFlow", lph, units);
  // The series are cheap (a few dozen points); drawing them is not, hence the charts' memo.
  const rpm = dutyAcrossRpm(result, input.engine.idleRpm, input.engine.redlineRpm, 20).map((p) => ({
    rpm: Math.round(p.rpm),
    lean: +p.dutyPctLean.toFixed(1),
    rich: +p.dutyPctRich.toFixed(1),
  }));
  const eth = dutyAcrossEthanol(input, result.crankPowerKw, 11).map((p) => ({
    e: p.ethanolVolPct,
    duty: +p.dutyPct.toFixed(1),
  }));
  const pump = pumpSupplyCurve(input, result, 20).map((p) => ({
    x: P(p.pressureKpa),
    supply: F(p.supplyLPerH),
    demand: F(p.demandLPerH),
  }));
  // The charts against boost: the spec sheet draws the same data (lib/calc/charts.ts).
  const pressure = fuelPressureChart(result, units);
  const staged = pumpBoostChart(result, units);
  const danger = result.limits.dutyDangerPct;
  return (
    <div className="space-y-4" data-testid="sizing-charts">
      <DutyRpmChart
        rows={rpm}
        danger={danger}
        summary={`Duty rises to ${formatValue("percent", result.injector.dutyPct, units, 0)} at ${formatValue("speed", input.engine.redlineRpm, units)}`}
        rich={`E${input.fuel.ethanolMaxVolPct}`}
        lean={`E${input.fuel.ethanolMinVolPct}`}
      />
      <DutyEthanolChart
        rows={eth}
        danger={danger}
        from={input.fuel.ethanolMinVolPct}
        to={input.fuel.ethanolMaxVolPct}
      />
      {pressure.drawable ? <PressureChart chart={pressure} /> : null}
      {staged.drawable ? (
        <SupplyDemandCard
          title={staged.title}
          summary={staged.summary}
          rows={staged.rows as { x: number; supply: number; demand: number }[]}
          xUnit={staged.x.unit}
          yUnit={staged.y.unit}
          marker={staged.marker}
        />
      ) : null}
      <SupplyDemandCard
        title="Pump supply against pressure"
        summary={`Supply ${F(result.pump.supplyLPerH)} ${fu} against demand ${F(result.pump.demandLPerH)} ${fu} at ${P(result.pump.outletPressureKpa)} ${pu}`}
        rows={pump}
        xUnit={pu}
        yUnit={fu}
        marker={{ x: P(result.pump.outletPressureKpa), label: "working" }}
      />
    </div>
  );
}
