import { Line, Polyline, Svg, Text as SvgText, Text, View } from "@react-pdf/renderer";

import type { BoostChart } from "@/lib/calc";

import { COPPER, INK, MUTED, pdfText, base as s } from "./common";

const DANGER = "#b42d26";
const GRID = "#e6eaee";
/** Each line's colour by its key, as the build sheet draws it. */
const COLOURS: Record<string, string> = {
  rail: COPPER,
  across: INK,
  manifold: DANGER,
  supply: COPPER,
  demand: DANGER,
};
const DASH = "4 2";

/**
 * One chart of the spec sheet drawn with react-pdf's vector primitives from a chart's data
 * (`lib/calc/charts.ts`: `fuelPressureChart`, `pumpBoostChart`, the build sheet's own series),
 * already in the reader's units: ticks with their unit on both axes, a marker line where there is
 * one, and a legend of line samples and names under it. A chart with nothing to draw (no boost
 * range) prints its one-sentence summary instead.
 */
export function PdfBoostChart({ chart, width = 250 }: { chart: BoostChart; width?: number }) {
  const W = width;
  const H = 112;
  const pad = { l: 36, r: 8, t: 6, b: 16 };
  const { x, y } = chart;
  const X = (v: number) => pad.l + ((v - x.min) / (x.max - x.min || 1)) * (W - pad.l - pad.r);
  const Y = (v: number) => H - pad.b - ((v - y.min) / (y.max - y.min || 1)) * (H - pad.t - pad.b);
  const tick = (v: number, decimals: number, unit: string) => `${v.toFixed(decimals)} ${unit}`;
  const colour = (key: string) => COLOURS[key] ?? INK;
  return (
    <View style={s.col} wrap={false}>
      <Text style={{ fontWeight: 700 }}>{chart.title}</Text>
      {chart.drawable ? (
        <>
          <Svg width={W} height={H}>
            {y.ticks.map((v) => (
              <Line
                key={`gy${v}`}
                x1={pad.l}
                y1={Y(v)}
                x2={W - pad.r}
                y2={Y(v)}
                stroke={GRID}
                strokeWidth={0.5}
              />
            ))}
            <Line
              x1={pad.l}
              y1={H - pad.b}
              x2={W - pad.r}
              y2={H - pad.b}
              stroke={MUTED}
              strokeWidth={0.5}
            />
            <Line
              x1={pad.l}
              y1={pad.t}
              x2={pad.l}
              y2={H - pad.b}
              stroke={MUTED}
              strokeWidth={0.5}
            />
            {chart.marker ? (
              <Line
                x1={X(chart.marker.x)}
                y1={pad.t}
                x2={X(chart.marker.x)}
                y2={H - pad.b}
                stroke={INK}
                strokeWidth={0.5}
                strokeDasharray="2 2"
              />
            ) : null}
            {chart.lines.map((l) => (
              <Polyline
                key={l.key}
                points={chart.rows
                  .map((r) => `${X(r.x).toFixed(1)},${Y(r[l.key]!).toFixed(1)}`)
                  .join(" ")}
                stroke={colour(l.key)}
                strokeWidth={1.2}
                fill="none"
                strokeDasharray={l.dashed ? DASH : undefined}
              />
            ))}
            {y.ticks.map((v) => (
              <SvgText
                key={`ty${v}`}
                x={pad.l - 2}
                y={Y(v) + 2}
                textAnchor="end"
                style={{ fontSize: 6 }}
                fill={MUTED}
              >
                {tick(v, y.decimals, y.unit)}
              </SvgText>
            ))}
            {x.ticks.map((v, i) => (
              <SvgText
                key={`tx${v}`}
                x={X(v)}
                y={H - 5}
                textAnchor={i === 0 ? "start" : "middle"}
                style={{ fontSize: 6 }}
                fill={MUTED}
              >
                {tick(v, x.decimals, x.unit)}
              </SvgText>
            ))}
          </Svg>
          <View style={{ flexDirection: "row", flexWrap: "wrap", gap: 8, marginTop: 1 }}>
            {chart.lines.map((l) => (
              <View key={l.key} style={{ flexDirection: "row", alignItems: "center", gap: 2 }}>
                <Svg width={14} height={5}>
                  <Line
                    x1={0}
                    y1={2.5}
                    x2={14}
                    y2={2.5}
                    stroke={colour(l.key)}
                    strokeWidth={1.2}
                    strokeDasharray={l.dashed ? DASH : undefined}
                  />
                </Svg>
                <Text>{l.label}</Text>
              </View>
            ))}
            {chart.marker ? (
              <Text style={s.muted}>{pdfText(`dotted: ${chart.marker.label}`)}</Text>
            ) : null}
          </View>
          <Text style={s.muted}>
            {pdfText(`${x.label} (${x.unit}) across, ${y.label} (${y.unit}) up. ${chart.summary}.`)}
          </Text>
        </>
      ) : (
        <Text style={s.muted}>{pdfText(`${chart.summary}.`)}</Text>
      )}
    </View>
  );
}
