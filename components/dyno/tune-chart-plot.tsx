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

import {
  converter,
  formatNumber,
  formatValue,
  toShown,
  unitOf,
  type Quantity,
  type TunePoint,
  type UnitSystem,
} from "@/lib/calc";

import { axisLabel, CHART_GROUPS, tooltipValue, type ChartPull } from "./tune-chart";

const COLOURS = ["#b3592c", "#1f5f8b", "#1f7a5a", "#7a3f8f", "#44505c", "#a1431b"];
const CHANNELS = new Map(CHART_GROUPS.flatMap((g) => [g.left, g.right]).map((c) => [c.id, c]));

/**
 * Pulls overlaid against engine speed: one chart per group, each channel on its own axis with
 * its unit, every pull in its own colour, tooltips formatted through the registry, and a mark
 * where a pull crossed a limit.
 */
export function TuneChartPlot({
  pulls,
  group,
  units,
}: {
  pulls: ChartPull[];
  group: (typeof CHART_GROUPS)[number];
  units: UnitSystem;
}) {
  const rows = new Map<number, Record<string, number | null>>();
  pulls.forEach((p, i) => {
    for (const pt of p.points)
      for (const c of [group.left, group.right]) {
        const v = c.read(pt);
        const row = rows.get(pt.rpm) ?? { rpm: pt.rpm };
        row[`${i}:${c.id}`] = v === null ? null : toShown(c.quantity, v, units);
        rows.set(pt.rpm, row);
      }
  });
  const data = [...rows.values()].sort((a, b) => a.rpm! - b.rpm!);
  const quantityOf = (key: string) => CHANNELS.get(key.split(":")[1] ?? "")?.quantity ?? "ratio";
  return (
    <figure
      className="rounded-lg border border-ink-200 bg-white p-3"
      data-testid={`tune-chart-${group.id}`}
    >
      <figcaption className="mb-2 text-sm font-semibold">{group.title}</figcaption>
      <div
        className="h-64"
        role="img"
        aria-label={`${group.title} against engine speed, ${pulls.map((p) => p.label).join(", ")}`}
      >
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={{ left: 4, right: 4, top: 4, bottom: 16 }}>
            <CartesianGrid stroke="#e6eaee" />
            <XAxis
              dataKey="rpm"
              type="number"
              domain={["dataMin", "dataMax"]}
              tick={{ fontSize: 11 }}
              tickFormatter={(v: number) => formatNumber("speed", v, units)}
              label={{
                value: "engine speed (rpm)",
                position: "insideBottom",
                offset: -10,
                fontSize: 11,
              }}
            />
            <YAxis
              yAxisId="left"
              tick={{ fontSize: 11 }}
              width={52}
              domain={["auto", "auto"]}
              label={{
                value: axisLabel(group.left, units),
                angle: -90,
                position: "insideLeft",
                fontSize: 11,
              }}
            />
            <YAxis
              yAxisId="right"
              orientation="right"
              tick={{ fontSize: 11 }}
              width={52}
              domain={["auto", "auto"]}
              label={{
                value: axisLabel(group.right, units),
                angle: 90,
                position: "insideRight",
                fontSize: 11,
              }}
            />
            <Tooltip
              labelFormatter={(rpm) => formatValue("speed", Number(rpm), units)}
              formatter={(value, name, item) => [
                tooltipValue(value, quantityOf(String(item.dataKey)), units),
                name,
              ]}
            />
            <Legend wrapperStyle={{ fontSize: 11 }} />
            {pulls.flatMap((p, i) =>
              [group.left, group.right].map((c, side) => (
                <Line
                  key={`${p.key}-${c.id}`}
                  yAxisId={side === 0 ? "left" : "right"}
                  dataKey={`${i}:${c.id}`}
                  name={`${p.label} ${c.label}`}
                  stroke={COLOURS[i % COLOURS.length]}
                  strokeDasharray={c.dash}
                  dot={false}
                  connectNulls
                  isAnimationActive={false}
                />
              )),
            )}
            {pulls.flatMap((p, i) =>
              p.overAt.map((o) => (
                <ReferenceLine
                  key={`${p.key}-${o.label}-${o.rpm}`}
                  yAxisId="left"
                  x={o.rpm}
                  stroke={COLOURS[i % COLOURS.length]}
                  strokeDasharray="2 2"
                  label={{ value: `over: ${o.label}`, fontSize: 10, position: "insideTop" }}
                />
              )),
            )}
          </LineChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
