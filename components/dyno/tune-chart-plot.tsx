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
} from "@/lib/calc/quantities";
import type { TunePoint } from "@/lib/calc/tune";
import type { UnitSystem } from "@/lib/calc/units";

import { axisLabel, CHART_GROUPS, tickText, tooltipValue, type ChartPull } from "./tune-chart";

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
  // No pull shown logged either channel: say so rather than draw empty axes.
  const logged = data.some((r) => Object.entries(r).some(([k, v]) => k !== "rpm" && v !== null));
  if (!logged)
    return (
      <figure
        className="rounded-lg border border-ink-200 bg-white p-3"
        data-testid={`tune-chart-${group.id}`}
      >
        <figcaption className="text-sm font-semibold">{group.title}</figcaption>
        <p className="mt-1 text-sm text-ink-600">
          Not logged in the pulls shown: no {group.left.label} or {group.right.label} column.
        </p>
      </figure>
    );
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
              tickFormatter={tickText(group.left.quantity, units)}
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
              tickFormatter={tickText(group.right.quantity, units)}
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
            <Legend verticalAlign="top" wrapperStyle={{ fontSize: 11, paddingBottom: 4 }} />
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
                />
              )),
            )}
          </LineChart>
        </ResponsiveContainer>
      </div>
      {/* The marks' words below the plot: inside it, two limits near one speed wrote over each other. */}
      {pulls.some((p) => p.overAt.length) ? (
        <ul className="mt-1 space-y-0.5 text-xs text-ink-700" aria-label="Limits crossed">
          {pulls.flatMap((p, i) =>
            p.overAt.map((o) => (
              <li key={`${p.key}-${o.label}-${o.rpm}`} className="flex items-center gap-1.5">
                <span
                  aria-hidden
                  className="inline-block w-4 border-t-2 border-dashed"
                  style={{ borderColor: COLOURS[i % COLOURS.length] }}
                />
                {p.label} at {formatValue("speed", o.rpm, units)}: over {o.label}
              </li>
            )),
          )}
        </ul>
      ) : null}
    </figure>
  );
}
