"use client";

import {
  memo,
  useId,
  useLayoutEffect,
  useMemo,
  useRef,
  useState,
  type KeyboardEvent,
  type PointerEvent,
} from "react";

import type { ChartAxis } from "@/lib/calc/charts";

import { axisTick, NBSP } from "./axis-ticks";

/**
 * A line chart drawn as plain SVG: one `<path>` per series, axes with round ticks in the reader's
 * units, axis titles, reference lines with their labels, a legend, and a readout of the values at
 * a point (pointer, or the keyboard: the plot takes the focus and ← → Home End move a cursor;
 * the readout is a polite live region). The build sheet's charts (components/builds/sizing-charts.tsx)
 * use it; the spec sheet draws the same series with react-pdf (lib/pdf/boost-charts.tsx).
 *
 * The drawing is as wide as its box: the viewBox follows the measured width (a ResizeObserver),
 * so text keeps its size on a phone instead of shrinking with the picture; before a measurement
 * (and on the server) it is drawn 600 wide. Moving the cursor redraws the cursor only.
 */

/** The palette's colours a series or mark may take (Tailwind's theme, tailwind.config.ts). */
export type Tone = "copper" | "ink" | "danger";
const STROKE: Record<Tone, string> = {
  copper: "stroke-copper-500",
  ink: "stroke-ink-600",
  danger: "stroke-danger-600",
};
const FILL: Record<Tone, string> = {
  copper: "fill-copper-500",
  ink: "fill-ink-600",
  danger: "fill-danger-600",
};

export type PlotAxis = ChartAxis;
export interface PlotSeries {
  /** A column of the rows. */
  key: string;
  label: string;
  tone: Tone;
  dashed?: boolean;
  /** A dot on every point (few points). */
  dots?: boolean;
}
/** A reference line across the plot at one value of an axis (a limit, a marked boost). */
export interface PlotMark {
  axis: "x" | "y";
  value: number;
  label?: string;
  tone: Tone;
}
export type PlotRow = { x: number } & Record<string, number>;

export interface LinePlotProps {
  title: string;
  /** One sentence saying what the chart shows (the figure's description). */
  summary: string;
  x: PlotAxis;
  y: PlotAxis;
  series: PlotSeries[];
  rows: PlotRow[];
  marks?: PlotMark[];
}

/** The drawing's height in px (as the charts' box was: Tailwind's h-56). */
export const PLOT_HEIGHT = 224;
const DEFAULT_WIDTH = 600;
const FONT = 11;
/** Rough width of a character of the 11 px tick font, for room and spacing (no measuring). */
const CHAR = 6.4;
const PAD_TOP = 20;
const PAD_BOTTOM = 36;
const DASH = "5 3";
const MARK_DASH = "4 4";

const tickText = (v: number, axis: PlotAxis) => axisTick(axis.unit)(v.toFixed(axis.decimals));
/** A value as read at a point: the figure to one decimal at most, a no-break space, the unit. */
const valueText = (v: number, unit: string) =>
  `${String(+v.toFixed(1))}${unit ? `${NBSP}${unit}` : ""}`;

/** The geometry of a drawing `width` wide: scales, padding, the ticks that fit. */
function layout(width: number, x: PlotAxis, y: PlotAxis) {
  const yLabels = y.ticks.map((v) => tickText(v, y));
  const left = Math.ceil(Math.max(3, ...yLabels.map((t) => t.length)) * CHAR) + 10;
  const xLabels = x.ticks.map((v) => tickText(v, x));
  const widest = Math.max(3, ...xLabels.map((t) => t.length)) * CHAR;
  const right = Math.max(12, Math.ceil(widest / 2) + 2);
  const plotW = Math.max(40, width - left - right);
  const plotH = PLOT_HEIGHT - PAD_TOP - PAD_BOTTOM;
  const spanX = x.max - x.min || 1;
  const spanY = y.max - y.min || 1;
  const X = (v: number) => left + ((v - x.min) / spanX) * plotW;
  const Y = (v: number) => PAD_TOP + plotH - ((v - y.min) / spanY) * plotH;
  // Every n-th x tick, so the labels never run into each other on a narrow screen.
  const every = Math.max(1, Math.ceil(((widest + 12) * x.ticks.length) / plotW));
  const xTicks = x.ticks
    .map((v, i) => ({ v, text: xLabels[i]! }))
    .filter((t, i) => i % every === 0 && t.v >= x.min - 1e-9 && t.v <= x.max + 1e-9);
  const yTicks = y.ticks
    .map((v, i) => ({ v, text: yLabels[i]! }))
    .filter((t) => t.v >= y.min - 1e-9 && t.v <= y.max + 1e-9);
  return { left, right, plotW, plotH, X, Y, xTicks, yTicks, spanX };
}
type Layout = ReturnType<typeof layout>;

/** The path of one series through its finite points (a gap where a value is missing). */
function pathOf(rows: PlotRow[], key: string, g: Layout) {
  let d = "";
  let pen = false;
  for (const r of rows) {
    const v = r[key];
    if (!Number.isFinite(r.x) || v === undefined || !Number.isFinite(v)) {
      pen = false;
      continue;
    }
    d += `${pen ? "L" : "M"}${g.X(r.x).toFixed(1)},${g.Y(v).toFixed(1)}`;
    pen = true;
  }
  return d;
}

/** Everything but the cursor: drawn again only when the data or the width change. */
const PlotBody = memo(function PlotBody({
  width,
  g,
  x,
  y,
  series,
  rows,
  marks,
}: {
  width: number;
  g: Layout;
  x: PlotAxis;
  y: PlotAxis;
  series: PlotSeries[];
  rows: PlotRow[];
  marks: PlotMark[];
}) {
  const top = PAD_TOP;
  const bottom = PAD_TOP + g.plotH;
  const right = g.left + g.plotW;
  return (
    <>
      <g className="stroke-ink-100" strokeWidth={1}>
        {g.yTicks.map((t) => (
          <line key={`gy${t.v}`} x1={g.left} x2={right} y1={g.Y(t.v)} y2={g.Y(t.v)} />
        ))}
        {g.xTicks.map((t) => (
          <line key={`gx${t.v}`} x1={g.X(t.v)} x2={g.X(t.v)} y1={top} y2={bottom} />
        ))}
      </g>
      <g className="stroke-ink-400" strokeWidth={1}>
        <line x1={g.left} x2={right} y1={bottom} y2={bottom} />
        <line x1={g.left} x2={g.left} y1={top} y2={bottom} />
      </g>
      <g className="fill-ink-600" fontSize={FONT}>
        {g.yTicks.map((t) => (
          <text
            key={`ty${t.v}`}
            className="plot-y-tick"
            x={g.left - 5}
            y={g.Y(t.v)}
            dy="0.32em"
            textAnchor="end"
          >
            {t.text}
          </text>
        ))}
        {g.xTicks.map((t) => (
          <text
            key={`tx${t.v}`}
            className="plot-x-tick"
            x={g.X(t.v)}
            y={bottom + 14}
            textAnchor="middle"
          >
            {t.text}
          </text>
        ))}
        <text className="plot-y-title" x={2} y={11} fontWeight={600}>
          {`${y.label} (${y.unit})`}
        </text>
        <text
          className="plot-x-title"
          x={g.left + g.plotW / 2}
          y={PLOT_HEIGHT - 4}
          textAnchor="middle"
          fontWeight={600}
        >
          {`${x.label} (${x.unit})`}
        </text>
      </g>
      {marks.map((m, i) => {
        const inside =
          m.axis === "x"
            ? m.value >= x.min - 1e-9 && m.value <= x.max + 1e-9
            : m.value >= y.min - 1e-9 && m.value <= y.max + 1e-9;
        if (!Number.isFinite(m.value) || !inside) return null;
        const at = m.axis === "x" ? g.X(m.value) : g.Y(m.value);
        // A limit's label sits at the plot's right end, above its line. A marked x's sits above
        // the plot, right of its line (left of it near the right end), or just inside the plot
        // where the y axis's title takes that room.
        const chars = m.label?.length ?? 0;
        const flip = m.axis === "x" && at + chars * CHAR + 4 > width;
        const start = flip ? at - 4 - chars * CHAR : at + 4;
        const yTitleEnd = (y.label.length + y.unit.length + 3) * CHAR + 8;
        return (
          <g key={`m${i}`} className="plot-mark">
            <line
              className={STROKE[m.tone]}
              strokeDasharray={MARK_DASH}
              strokeWidth={1.2}
              x1={m.axis === "x" ? at : g.left}
              x2={m.axis === "x" ? at : right}
              y1={m.axis === "x" ? top : at}
              y2={m.axis === "x" ? bottom : at}
            />
            {m.label ? (
              <text
                className={`plot-mark-label ${FILL[m.tone]}`}
                fontSize={FONT}
                x={m.axis === "x" ? at + (flip ? -4 : 4) : right - 2}
                y={m.axis === "x" ? (start < yTitleEnd ? top + 10 : top - 5) : at - 4}
                textAnchor={m.axis === "x" && !flip ? "start" : "end"}
              >
                {m.label}
              </text>
            ) : null}
          </g>
        );
      })}
      {series.map((s) => (
        <g key={s.key} className={STROKE[s.tone]}>
          <path
            className="plot-line"
            data-series={s.key}
            d={pathOf(rows, s.key, g)}
            fill="none"
            strokeWidth={2}
            strokeDasharray={s.dashed ? DASH : undefined}
            strokeLinejoin="round"
          />
          {s.dots
            ? rows.map((r) =>
                Number.isFinite(r[s.key]) ? (
                  <circle
                    key={r.x}
                    className={`fill-white ${STROKE[s.tone]}`}
                    cx={g.X(r.x)}
                    cy={g.Y(r[s.key]!)}
                    r={3}
                    strokeWidth={1.5}
                  />
                ) : null,
              )
            : null}
        </g>
      ))}
    </>
  );
});

/** The legend: a sample of each line and its name, wrapping on a narrow screen. */
const Legend = memo(function Legend({ series }: { series: PlotSeries[] }) {
  return (
    <ul className="plot-legend mt-1 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-700">
      {series.map((s) => (
        <li key={s.key} className="flex items-center gap-1.5">
          <svg width="20" height="8" aria-hidden="true" className={STROKE[s.tone]}>
            <line
              x1="0"
              x2="20"
              y1="4"
              y2="4"
              strokeWidth={2}
              strokeDasharray={s.dashed ? DASH : undefined}
            />
          </svg>
          <span className="plot-legend-text">{s.label}</span>
        </li>
      ))}
    </ul>
  );
});

/** The row nearest an x value (rows in rising x). */
function nearest(rows: PlotRow[], v: number) {
  let best = 0;
  for (let i = 1; i < rows.length; i++)
    if (Math.abs(rows[i]!.x - v) < Math.abs(rows[best]!.x - v)) best = i;
  return best;
}

/** The chart: a figure named by its title, described by its summary, with a legend and a readout. */
export function LinePlot({ title, summary, x, y, series, rows, marks = NO_MARKS }: LinePlotProps) {
  const box = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(DEFAULT_WIDTH);
  const [at, setAt] = useState<number | null>(null);
  const id = useId();
  useLayoutEffect(() => {
    const el = box.current;
    if (!el) return;
    const measure = (w: number) => {
      if (w > 0) setWidth(Math.round(w));
    };
    measure(el.clientWidth);
    if (typeof ResizeObserver === "undefined") return;
    const ro = new ResizeObserver((entries) => measure(entries[0]!.contentRect.width));
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  // PlotBody's memo keeps the drawing when only the cursor moves: the same geometry object.
  const geometry = useMemo(() => layout(width, x, y), [width, x, y]);
  const point = at === null ? null : (rows[Math.min(at, rows.length - 1)] ?? null);

  const fromPointer = (e: PointerEvent<SVGSVGElement>) => {
    const r = e.currentTarget.getBoundingClientRect();
    if (r.width <= 0 || rows.length === 0) return;
    const px = ((e.clientX - r.left) * width) / r.width;
    setAt(nearest(rows, x.min + ((px - geometry.left) / geometry.plotW) * geometry.spanX));
  };
  const onKey = (e: KeyboardEvent<HTMLDivElement>) => {
    if (rows.length === 0) return;
    const last = rows.length - 1;
    const now = at ?? -1;
    const to =
      e.key === "ArrowRight" || e.key === "ArrowUp"
        ? Math.min(last, now + 1)
        : e.key === "ArrowLeft" || e.key === "ArrowDown"
          ? Math.max(0, now < 0 ? 0 : now - 1)
          : e.key === "Home"
            ? 0
            : e.key === "End"
              ? last
              : e.key === "Escape"
                ? null
                : undefined;
    if (to === undefined) return;
    e.preventDefault();
    setAt(to);
  };
  const readout = point
    ? `${valueText(point.x, x.unit)}: ${series
        .filter((s) => Number.isFinite(point[s.key]))
        .map((s) => `${s.label} ${valueText(point[s.key]!, y.unit)}`)
        .join(", ")}`
    : "";

  return (
    <figure
      className="plot rounded-lg border border-ink-200 bg-white p-4"
      aria-describedby={`${id}-summary`}
    >
      <figcaption className="font-semibold">{title}</figcaption>
      <p id={`${id}-summary`} className="plot-summary mb-2 text-sm text-ink-600">
        {summary}
      </p>
      <div
        ref={box}
        tabIndex={0}
        role="group"
        aria-label={`${title}: values at a point (arrow keys)`}
        aria-describedby={`${id}-readout`}
        className="plot-box rounded"
        onKeyDown={onKey}
        onBlur={() => setAt(null)}
      >
        <svg
          className="block h-56 w-full touch-pan-y print:h-auto"
          viewBox={`0 0 ${width} ${PLOT_HEIGHT}`}
          aria-hidden="true"
          onPointerMove={fromPointer}
          onPointerDown={fromPointer}
          onPointerLeave={(e) => {
            if (document.activeElement !== e.currentTarget.parentElement) setAt(null);
          }}
        >
          <PlotBody
            width={width}
            g={geometry}
            x={x}
            y={y}
            series={series}
            rows={rows}
            marks={marks}
          />
          {point ? (
            <g className="plot-cursor" pointerEvents="none">
              <line
                className="stroke-ink-500"
                x1={geometry.X(point.x)}
                x2={geometry.X(point.x)}
                y1={PAD_TOP}
                y2={PAD_TOP + geometry.plotH}
                strokeWidth={1}
              />
              {series.map((s) =>
                Number.isFinite(point[s.key]) ? (
                  <circle
                    key={s.key}
                    className={`${FILL[s.tone]} stroke-white`}
                    cx={geometry.X(point.x)}
                    cy={geometry.Y(point[s.key]!)}
                    r={4}
                    strokeWidth={1.5}
                  />
                ) : null,
              )}
            </g>
          ) : null}
        </svg>
      </div>
      <Legend series={series} />
      <p className="figure mt-1 min-h-4 text-xs text-ink-700 print:hidden">
        <span id={`${id}-readout`} className="plot-readout" aria-live="polite" aria-atomic="true">
          {readout}
        </span>
        {readout ? null : (
          <span className="text-ink-500" aria-hidden="true">
            Point at the chart, or focus it and use ← →, to read its values
          </span>
        )}
      </p>
    </figure>
  );
}
const NO_MARKS: PlotMark[] = [];
