"use client";

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
  type FuelSystemResult,
  type ParsedFuelSystemInput,
  type UnitSystem,
} from "@/lib/calc";

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
  return (
    <LineChart
      data={rows}
      width={width}
      height={height}
      margin={{ left: 0, right: 8, top: 4, bottom: 4 }}
    >
      <CartesianGrid stroke="#e6eaee" />
      <XAxis
        dataKey="x"
        type="number"
        domain={[0, "dataMax"]}
        tickFormatter={axisTick(xUnit)}
        tick={{ fontSize: 11 }}
      />
      <YAxis tickFormatter={axisTick(yUnit)} tick={{ fontSize: 11 }} width={64} />
      <Tooltip />
      <Legend />
      {marker ? (
        <ReferenceLine
          x={marker.x}
          stroke={INK}
          strokeDasharray="2 2"
          label={{ value: marker.label, fontSize: 11 }}
        />
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
      <Chart
        title="Duty across engine speed"
        summary={`Duty rises to ${formatValue("percent", result.injector.dutyPct, units, 0)} at ${formatValue("speed", input.engine.redlineRpm, units)}`}
      >
        <LineChart data={rpm} margin={{ left: 0, right: 8, top: 4, bottom: 4 }}>
          <CartesianGrid stroke="#e6eaee" />
          <XAxis
            dataKey="rpm"
            type="number"
            domain={["dataMin", "dataMax"]}
            tickFormatter={axisTick("rpm")}
            tick={{ fontSize: 11 }}
          />
          <YAxis tickFormatter={axisTick("%")} tick={{ fontSize: 11 }} width={48} />
          <Tooltip />
          <Legend />
          <ReferenceLine
            y={danger}
            stroke={DANGER}
            strokeDasharray="4 4"
            label={{ value: `${danger} %`, fontSize: 11, fill: DANGER }}
          />
          <Line
            dataKey="rich"
            name={`E${input.fuel.ethanolMaxVolPct}`}
            stroke={COPPER}
            dot={false}
            isAnimationActive={false}
          />
          <Line
            dataKey="lean"
            name={`E${input.fuel.ethanolMinVolPct}`}
            stroke={INK}
            strokeDasharray="5 3"
            dot={false}
            isAnimationActive={false}
          />
        </LineChart>
      </Chart>
      <Chart title="Duty across ethanol content" summary="Duty at the target power from E0 to E100">
        <LineChart data={eth} margin={{ left: 0, right: 8, top: 4, bottom: 4 }}>
          <CartesianGrid stroke="#e6eaee" />
          <XAxis
            dataKey="e"
            type="number"
            domain={[0, 100]}
            tickFormatter={axisTick("%")}
            tick={{ fontSize: 11 }}
          />
          <YAxis tickFormatter={axisTick("%")} tick={{ fontSize: 11 }} width={48} />
          <Tooltip />
          <ReferenceLine y={danger} stroke={DANGER} strokeDasharray="4 4" />
          <ReferenceLine x={input.fuel.ethanolMinVolPct} stroke={INK} strokeDasharray="2 2" />
          <ReferenceLine x={input.fuel.ethanolMaxVolPct} stroke={INK} strokeDasharray="2 2" />
          <Line dataKey="duty" name="duty" stroke={COPPER} dot isAnimationActive={false} />
        </LineChart>
      </Chart>
      {pressure.drawable ? (
        <Chart title={pressure.title} summary={pressure.summary}>
          <LineChart data={pressure.rows} margin={{ left: 0, right: 8, top: 4, bottom: 4 }}>
            <CartesianGrid stroke="#e6eaee" />
            <XAxis
              dataKey="x"
              type="number"
              domain={[0, "dataMax"]}
              tickFormatter={axisTick(pressure.x.unit)}
              tick={{ fontSize: 11 }}
              name="boost"
            />
            <YAxis tickFormatter={axisTick(pressure.y.unit)} tick={{ fontSize: 11 }} width={64} />
            <Tooltip />
            <Legend />
            <Line
              dataKey="rail"
              name="rail"
              stroke={COPPER}
              dot={false}
              isAnimationActive={false}
            />
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
      ) : null}
      {staged.drawable ? (
        <Chart title={staged.title} summary={staged.summary}>
          <SupplyDemandChart
            rows={staged.rows as { x: number; supply: number; demand: number }[]}
            xUnit={staged.x.unit}
            yUnit={staged.y.unit}
            marker={staged.marker}
          />
        </Chart>
      ) : null}
      <Chart
        title="Pump supply against pressure"
        summary={`Supply ${F(result.pump.supplyLPerH)} ${fu} against demand ${F(result.pump.demandLPerH)} ${fu} at ${P(result.pump.outletPressureKpa)} ${pu}`}
      >
        <SupplyDemandChart
          rows={pump}
          xUnit={pu}
          yUnit={fu}
          marker={{ x: P(result.pump.outletPressureKpa), label: "working" }}
        />
      </Chart>
    </div>
  );
}
