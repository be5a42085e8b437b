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
    p: P(p.pressureKpa),
    supply: F(p.supplyLPerH),
    demand: F(p.demandLPerH),
  }));
  const boost = result.regulator.pressureVsBoost.map((p) => ({
    boost: P(p.boostKpa),
    rail: P(p.railKpa),
    manifold: P(p.boostKpa),
    across: P(p.differentialKpa),
  }));
  const top = result.regulator.pressureVsBoost.at(-1);
  const staged = result.pump.supplyVsBoost.map((p) => ({
    boost: P(p.boostKpa),
    supply: F(p.supplyLPerH),
    demand: F(p.demandLPerH),
  }));
  const regulatorName =
    result.regulator.type === "fixed"
      ? "fixed regulator"
      : result.regulator.risingRateRatio === 1
        ? "1:1 boost-referenced regulator"
        : `rising-rate regulator ${formatValue("risingRate", result.regulator.risingRateRatio, units)}`;
  const danger = result.limits.dutyDangerPct;
  return (
    <div className="space-y-4" data-testid="sizing-charts">
      <Chart
        title="Duty across engine speed"
        summary={`Duty rises to ${result.injector.dutyPct.toFixed(0)} % at ${input.engine.redlineRpm} rpm`}
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
      {boost.length > 1 && top ? (
        <Chart
          title="Fuel pressure against boost"
          summary={`With a ${regulatorName}, at ${formatValue("pressure", top.boostKpa, units)} boost the rail holds ${formatValue("pressure", top.railKpa, units)} and the injectors see ${formatValue("pressure", top.differentialKpa, units)} across them`}
        >
          <LineChart data={boost} margin={{ left: 0, right: 8, top: 4, bottom: 4 }}>
            <CartesianGrid stroke="#e6eaee" />
            <XAxis
              dataKey="boost"
              type="number"
              domain={[0, "dataMax"]}
              tickFormatter={axisTick(pu)}
              tick={{ fontSize: 11 }}
              name="boost"
            />
            <YAxis tickFormatter={axisTick(pu)} tick={{ fontSize: 11 }} width={64} />
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
      {staged.length > 1 ? (
        <Chart
          title="Pump supply and demand against boost"
          summary={`The pump margin is at its lowest, ${formatValue("percent", result.pump.marginPct, units, 0)}, at ${formatValue("pressure", result.pump.worstMarginBoostKpa, units)} boost`}
        >
          <LineChart data={staged} margin={{ left: 0, right: 8, top: 4, bottom: 4 }}>
            <CartesianGrid stroke="#e6eaee" />
            <XAxis
              dataKey="boost"
              type="number"
              domain={[0, "dataMax"]}
              tickFormatter={axisTick(pu)}
              tick={{ fontSize: 11 }}
            />
            <YAxis tickFormatter={axisTick(fu)} tick={{ fontSize: 11 }} width={64} />
            <Tooltip />
            <Legend />
            <ReferenceLine
              x={P(result.pump.worstMarginBoostKpa)}
              stroke={INK}
              strokeDasharray="2 2"
              label={{ value: "least margin", fontSize: 11 }}
            />
            <Line
              dataKey="supply"
              name="supply"
              stroke={COPPER}
              dot={false}
              isAnimationActive={false}
            />
            <Line
              dataKey="demand"
              name="demand"
              stroke={DANGER}
              strokeDasharray="5 3"
              dot={false}
              isAnimationActive={false}
            />
          </LineChart>
        </Chart>
      ) : null}
      <Chart
        title="Pump supply against pressure"
        summary={`Supply ${F(result.pump.supplyLPerH)} ${fu} against demand ${F(result.pump.demandLPerH)} ${fu} at ${P(result.pump.outletPressureKpa)} ${pu}`}
      >
        <LineChart data={pump} margin={{ left: 0, right: 8, top: 4, bottom: 4 }}>
          <CartesianGrid stroke="#e6eaee" />
          <XAxis
            dataKey="p"
            type="number"
            domain={[0, "dataMax"]}
            tickFormatter={axisTick(pu)}
            tick={{ fontSize: 11 }}
          />
          <YAxis tickFormatter={axisTick(fu)} tick={{ fontSize: 11 }} width={64} />
          <Tooltip />
          <Legend />
          <ReferenceLine
            x={P(result.pump.outletPressureKpa)}
            stroke={INK}
            strokeDasharray="2 2"
            label={{ value: "working", fontSize: 11 }}
          />
          <Line
            dataKey="supply"
            name="supply"
            stroke={COPPER}
            dot={false}
            isAnimationActive={false}
          />
          <Line
            dataKey="demand"
            name="demand"
            stroke={DANGER}
            strokeDasharray="5 3"
            dot={false}
            isAnimationActive={false}
          />
        </LineChart>
      </Chart>
    </div>
  );
}
