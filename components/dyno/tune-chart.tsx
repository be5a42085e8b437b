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

const COLOURS = ["#b3592c", "#1f5f8b", "#1f7a5a", "#7a3f8f", "#44505c", "#a1431b"];
const CHANNELS = new Map(CHART_GROUPS.flatMap((g) => [g.left, g.right]).map((c) => [c.id, c]));

/** The axis name with its unit: "power (hp)", "lambda (λ)", "duty (%)". */
export function axisLabel(c: { label: string; quantity: Quantity }, units: UnitSystem) {
  const u = unitOf(c.quantity, units) || converter(c.quantity, units).prefix?.trim() || "";
  return u ? `${c.label} (${u})` : c.label;
}

/** A charted value back to its quantity's own words: "54.1 psi", "λ 0.86" (never 54.149184…). */
export function tooltipValue(shown: unknown, quantity: Quantity, units: UnitSystem) {
  if (typeof shown !== "number" || !Number.isFinite(shown)) return "—";
  return formatValue(quantity, converter(quantity, units).from(shown), units);
}

/**
 * Pulls overlaid against engine speed: one chart per group, each channel on its own axis with
 * its unit, every pull in its own colour, tooltips formatted through the registry, and a mark
 * where a pull crossed a limit.
 */
export function TuneChart({
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
          <LineChart data={data} margin={{ left: 4, right: 4, top: 4, bottom: 4 }}>
            <CartesianGrid stroke="#e6eaee" />
            <XAxis
              dataKey="rpm"
              type="number"
              domain={["dataMin", "dataMax"]}
              tick={{ fontSize: 11 }}
              tickFormatter={(v: number) => formatNumber("speed", v, units)}
              height={40}
              label={{ value: "engine speed (rpm)", position: "insideBottom", fontSize: 11 }}
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
            <Legend wrapperStyle={{ fontSize: 11, paddingTop: 6 }} />
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
      <OverMarks pulls={pulls} units={units} />
    </figure>
  );
}

/**
 * What the dashed marks are, under the chart rather than on it (labels on the marks overlapped at
 * 390 px): per pull and engine speed, the limits crossed there.
 */
export function OverMarks({ pulls, units }: { pulls: ChartPull[]; units: UnitSystem }) {
  const marks = pulls.flatMap((p, i) => {
    const at = new Map<number, string[]>();
    for (const o of p.overAt) at.set(o.rpm, [...(at.get(o.rpm) ?? []), o.label]);
    return [...at.entries()]
      .sort((a, b) => a[0] - b[0])
      .map(([rpm, labels]) => ({ key: `${p.key}-${rpm}`, i, pull: p.label, rpm, labels }));
  });
  if (!marks.length) return null;
  return (
    <ul
      className="mt-2 space-y-0.5 text-xs text-ink-700"
      aria-label="Limits crossed (dashed marks)"
    >
      {marks.map((m) => (
        <li key={m.key} className="flex items-baseline gap-1.5">
          <span
            aria-hidden
            className="inline-block w-4 shrink-0 border-t-2 border-dashed"
            style={{ borderColor: COLOURS[m.i % COLOURS.length] }}
          />
          <span>
            {m.pull} at {formatValue("speed", m.rpm, units)}: over {m.labels.join(", ")}
          </span>
        </li>
      ))}
    </ul>
  );
}
