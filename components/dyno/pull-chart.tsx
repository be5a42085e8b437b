"use client";

import {
  CartesianGrid,
  Legend,
  Line,
  LineChart,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from "recharts";

import { axisTick } from "@/components/charts/axis-ticks";
import { formatValue, toShown, unitOf } from "@/lib/calc/quantities";
import type { UnitSystem } from "@/lib/calc/units";

import type { Point } from "./dyno-workbench";
import { axisLabel, tooltipValue } from "./tune-chart";

const COPPER = "#b3592c";
const INK = "#44505c";
const TEAL = "#1f7a5a";

export function PullChart({ points, units }: { points: Point[]; units: UnitSystem }) {
  const shown = points.map((p) => ({
    ...p,
    fuelDiff: p.fuelDiffKpa === null ? null : toShown("pressure", p.fuelDiffKpa, units),
  }));
  return (
    <figure className="rounded-lg border border-ink-200 bg-white p-4" data-testid="pull-chart">
      <figcaption className="mb-2 font-semibold">
        The pull: duty measured and predicted, lambda and its target, fuel-pressure differential
      </figcaption>
      <div className="h-72" role="img" aria-label="Chart of the pull against engine speed">
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={shown} margin={{ left: 0, right: 8, top: 4, bottom: 4 }}>
            <CartesianGrid stroke="#e6eaee" />
            <XAxis
              dataKey="rpm"
              type="number"
              domain={["dataMin", "dataMax"]}
              tickFormatter={axisTick("rpm")}
              tick={{ fontSize: 11 }}
            />
            <YAxis
              yAxisId="duty"
              tick={{ fontSize: 11 }}
              width={48}
              label={{ value: "duty (%)", angle: -90, position: "insideLeft", fontSize: 11 }}
            />
            <YAxis
              yAxisId="lambda"
              orientation="right"
              domain={[0.6, 1.1]}
              tick={{ fontSize: 11 }}
              width={44}
              label={{ value: "lambda (λ)", angle: 90, position: "insideRight", fontSize: 11 }}
            />
            {/* Fuel ΔP on an axis of its own, in the reader's pressure unit (never the duty axis). */}
            <YAxis
              yAxisId="kpa"
              orientation="right"
              domain={[0, "dataMax"]}
              tick={{ fontSize: 11 }}
              width={52}
              label={{
                value: axisLabel({ label: "fuel ΔP", quantity: "pressure" }, units),
                angle: 90,
                position: "insideRight",
                fontSize: 11,
              }}
            />
            <Tooltip
              labelFormatter={(rpm) => formatValue("speed", Number(rpm), units)}
              formatter={(value, name, item) => [
                tooltipValue(
                  value,
                  String(item.dataKey) === "fuelDiff"
                    ? "pressure"
                    : String(item.dataKey).startsWith("lambda")
                      ? "lambda"
                      : "percent",
                  units,
                ),
                name,
              ]}
            />
            <Legend />
            <Line
              yAxisId="duty"
              dataKey="dutyMeasured"
              name="duty measured"
              stroke={COPPER}
              dot={false}
              isAnimationActive={false}
            />
            <Line
              yAxisId="duty"
              dataKey="dutyPredicted"
              name="duty predicted"
              stroke={COPPER}
              strokeDasharray="5 3"
              dot={false}
              isAnimationActive={false}
            />
            <Line
              yAxisId="lambda"
              dataKey="lambda"
              name="lambda"
              stroke={INK}
              dot={false}
              isAnimationActive={false}
            />
            <Line
              yAxisId="lambda"
              dataKey="lambdaTarget"
              name="lambda target"
              stroke={INK}
              strokeDasharray="2 2"
              dot={false}
              isAnimationActive={false}
            />
            <Line
              yAxisId="kpa"
              dataKey="fuelDiff"
              name={`fuel ΔP (${unitOf("pressure", units)})`}
              stroke={TEAL}
              dot={false}
              isAnimationActive={false}
            />
          </LineChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
