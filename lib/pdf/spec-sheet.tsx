import {
  Document,
  Page,
  Polyline,
  renderToBuffer,
  StyleSheet,
  Svg,
  Line as SvgLine,
  Text as SvgText,
  Text,
  View,
} from "@react-pdf/renderer";

import {
  converter,
  dutyAcrossRpm,
  pumpSupplyCurve,
  toShown,
  type FuelSystemResult,
  type ParsedFuelSystemInput,
  type PullAnalysis,
  type Quantity,
  type UnitSystem,
} from "@/lib/calc";
import { type ChosenPart } from "@/lib/domain/builds";
import { PDF_PAGE_SIZE, type PaperSize } from "@/lib/domain/documents";
import { formatDate } from "@/lib/format/dates";
import { SAFETY_POINTS, SAFETY_TITLE } from "@/lib/safety";

import { base, COPPER, Letterhead, MUTED, pdfText, type PdfShop } from "./common";

const s = {
  ...base,
  ...StyleSheet.create({
    fig: { width: "33%", marginBottom: 4 },
    figValue: { fontWeight: 700, fontSize: 11 },
  }),
};

export interface SpecSheetData {
  shop: PdfShop;
  build: {
    title: string;
    vehicle: string | null;
    customerName: string;
    version: number;
    savedAt: Date;
    tunerName: string | null;
  };
  input: ParsedFuelSystemInput;
  result: FuelSystemResult;
  parts: ChosenPart[];
  units: UnitSystem;
  /** The shop's paper and time zone (every date printed is a day in that zone). */
  paper: PaperSize;
  timeZone: string;
  /** On a verified revision: the dyno log it was verified with, and what that log measured. */
  verification?: {
    fileName: string;
    verifiedAt: Date;
    analysis: PullAnalysis & {
      ethanolPct: number;
      targetLambda: number;
      predictedPeakDutyPct: number;
    };
  } | null;
}

/** Measured on the dyno beside the sizing's prediction. */
function Verification({
  v,
  r,
  q,
  n,
  timeZone,
}: {
  v: NonNullable<SpecSheetData["verification"]>;
  r: FuelSystemResult;
  q: (quantity: Quantity, x: number) => string;
  n: (x: number, dp?: number) => string;
  timeZone: string;
}) {
  const a = v.analysis;
  const cell = { width: "33%" } as const;
  const rows: [string, string, string][] = [
    [
      "Peak injector duty",
      `${n(a.predictedPeakDutyPct, 1)} % at redline`,
      a.peakDuty ? `${n(a.peakDuty.pct, 1)} % at ${n(a.peakDuty.rpm)} rpm` : "not logged",
    ],
    [
      "Fuel flow at peak duty",
      q("volumeFlow", r.fuelVolumeFlowLPerH),
      a.measuredFlow ? q("volumeFlow", (a.measuredFlow.ccPerMin * 60) / 1000) : "not logged",
    ],
    [
      "BSFC",
      `${n(r.blend.rich.bsfcGPerKwh)} g/kWh`,
      a.measuredBsfc
        ? `${n(a.measuredBsfc.gPerKwh)} g/kWh at ${q("power", a.measuredBsfc.powerKw)}`
        : "power not logged",
    ],
    [
      "Lambda under load",
      `target ${n(a.targetLambda, 2)}`,
      a.lambda
        ? `mean error ${n(a.lambda.meanAbsError, 3)}, worst ${a.lambda.worstError >= 0 ? "+" : ""}${n(a.lambda.worstError, 3)} at ${n(a.lambda.worstAtRpm)} rpm`
        : "not logged",
    ],
    [
      "Fuel-pressure differential",
      "held by the regulator",
      a.fuelPressure
        ? `${q("pressure", a.fuelPressure.lowBoostDiffKpa)} falling to ${q("pressure", a.fuelPressure.fullBoostDiffKpa)} at full boost`
        : "not logged",
    ],
    ["Ethanol content", `E${n(r.blend.rich.ethanolVolPct)} (rich end)`, `E${n(a.ethanolPct)}`],
  ];
  return (
    <View wrap={false}>
      <Text style={s.h2}>Measured on the dyno</Text>
      <Text style={s.muted}>
        {pdfText(
          `Verified ${formatDate(v.verifiedAt, { timeZone })} with the log ${v.fileName} (${a.samples} samples).`,
        )}
      </Text>
      <View style={[s.row, { fontWeight: 700, marginTop: 3 }]}>
        <Text style={cell}>Figure</Text>
        <Text style={cell}>Predicted</Text>
        <Text style={cell}>Measured</Text>
      </View>
      {rows.map(([label, predicted, measured]) => (
        <View style={s.row} key={label}>
          <Text style={cell}>{label}</Text>
          <Text style={cell}>{predicted}</Text>
          <Text style={cell}>{pdfText(measured)}</Text>
        </View>
      ))}
      {a.warnings.map((w) => (
        <Text key={w.code}>
          <Text style={{ fontWeight: 700 }}>
            {w.severity === "danger" ? "DANGER" : "Caution"} (log):{" "}
          </Text>
          {pdfText(`${w.message}${w.fix ? ` Fix: ${w.fix}` : ""}`)}
        </Text>
      ))}
    </View>
  );
}

/** A small vector line chart: series of [x, y] in data units, drawn into a w × h box. */
function Chart({
  title,
  series,
  xLabel,
  yLabel,
  refY,
}: {
  title: string;
  series: { name: string; color: string; points: [number, number][]; dash?: string }[];
  xLabel: string;
  yLabel: string;
  refY?: number;
}) {
  const W = 250;
  const H = 110;
  const pad = { l: 30, r: 6, t: 6, b: 18 };
  const all = series.flatMap((x) => x.points);
  const xs = all.map((p) => p[0]);
  const ys = [...all.map((p) => p[1]), ...(refY !== undefined ? [refY] : [])];
  const [x0, x1] = [Math.min(...xs), Math.max(...xs)];
  const [y0, y1] = [0, Math.max(...ys) * 1.1 || 1];
  const X = (x: number) => pad.l + ((x - x0) / (x1 - x0 || 1)) * (W - pad.l - pad.r);
  const Y = (y: number) => H - pad.b - ((y - y0) / (y1 - y0 || 1)) * (H - pad.t - pad.b);
  const fmt = (v: number) => (Math.abs(v) >= 100 ? v.toFixed(0) : v.toFixed(1));
  return (
    <View style={s.col}>
      <Text style={{ fontWeight: 700 }}>{title}</Text>
      <Svg width={W} height={H}>
        <SvgLine
          x1={pad.l}
          y1={H - pad.b}
          x2={W - pad.r}
          y2={H - pad.b}
          stroke={MUTED}
          strokeWidth={0.5}
        />
        <SvgLine x1={pad.l} y1={pad.t} x2={pad.l} y2={H - pad.b} stroke={MUTED} strokeWidth={0.5} />
        {refY !== undefined ? (
          <SvgLine
            x1={pad.l}
            y1={Y(refY)}
            x2={W - pad.r}
            y2={Y(refY)}
            stroke="#b42d26"
            strokeWidth={0.6}
            strokeDasharray="3 2"
          />
        ) : null}
        {series.map((x) => (
          <Polyline
            key={x.name}
            points={x.points.map(([a, b]) => `${X(a).toFixed(1)},${Y(b).toFixed(1)}`).join(" ")}
            stroke={x.color}
            strokeWidth={1.2}
            fill="none"
            strokeDasharray={x.dash}
          />
        ))}
        <SvgText x={pad.l} y={H - 4} style={{ fontSize: 6 }} fill={MUTED}>
          {fmt(x0)}
        </SvgText>
        <SvgText x={W - pad.r - 20} y={H - 4} style={{ fontSize: 6 }} fill={MUTED}>
          {fmt(x1)}
        </SvgText>
        <SvgText x={2} y={pad.t + 6} style={{ fontSize: 6 }} fill={MUTED}>
          {fmt(y1)}
        </SvgText>
        <SvgText x={2} y={H - pad.b} style={{ fontSize: 6 }} fill={MUTED}>
          0
        </SvgText>
      </Svg>
      <Text style={s.muted}>
        {xLabel} across, {yLabel} up.{" "}
        {series.map((x) => `${x.name}: ${x.color === COPPER ? "solid copper" : "grey"}`).join("; ")}
        .
      </Text>
    </View>
  );
}

const DRIVE_LABELS = { manual: "manual", automatic: "automatic", awd: "all-wheel-drive" } as const;

function SpecSheet({ d }: { d: SpecSheetData }) {
  const { input, result: r, units } = d;
  const q = (quantity: Quantity, v: number) =>
    `${Number.isFinite(v) ? toShown(quantity, v, units) : "-"} ${converter(quantity, units).unit}`;
  const n = (v: number, dp = 0) => (Number.isFinite(v) ? v.toFixed(dp) : "-");
  const fig = (label: string, value: string) => (
    <View style={s.fig} key={label}>
      <Text style={s.muted}>{label}</Text>
      <Text style={s.figValue}>{value}</Text>
    </View>
  );
  const rpm = dutyAcrossRpm(r, input.engine.idleRpm, input.engine.redlineRpm, 20);
  const pump = pumpSupplyCurve(input, r, 20);
  const P = (kpa: number) => toShown("pressure", kpa, units);
  const F = (lph: number) => toShown("volumeFlow", lph, units);
  return (
    <Document
      title={`${d.build.title} — fuel system spec sheet`}
      author={d.shop.name}
      subject="Fuel system spec sheet"
      creator="Fuelwright"
    >
      <Page size={PDF_PAGE_SIZE[d.paper]} style={s.page}>
        <Letterhead
          shop={d.shop}
          title="Fuel system spec sheet"
          lines={[
            `Revision ${d.build.version} · ${formatDate(d.build.savedAt, { timeZone: d.timeZone })}`,
            `Tuner: ${d.build.tunerName ?? "-"}`,
          ]}
        />
        <Text style={[s.h1, { fontSize: 14, marginTop: 8 }]}>{d.build.title}</Text>
        <Text>
          {d.build.customerName}
          {d.build.vehicle ? ` · ${d.build.vehicle}` : ""}
        </Text>

        <View style={s.row}>
          <View style={s.col}>
            <Text style={s.h2}>Targets</Text>
            <Text>
              {q("power", input.target.powerKw)} at the{" "}
              {input.target.measuredAt === "wheel" ? "wheels" : "crank"}
              {input.target.measuredAt === "wheel"
                ? ` (${input.target.drivetrainLossPct} % drivetrain loss, ${q("power", r.crankPowerKw)} crank)`
                : ""}
            </Text>
            <Text>
              {input.engine.cylinders} cylinders, {input.engine.displacementL} L,{" "}
              {input.engine.aspiration === "na"
                ? "naturally aspirated"
                : `${input.engine.aspiration}, ${q("pressure", input.engine.maxBoostKpa)} boost`}
              ; redline {input.engine.redlineRpm} rpm
            </Text>
          </View>
          <View style={s.col}>
            <Text style={s.h2}>Fuel and blend range</Text>
            <Text>
              E{input.fuel.ethanolMinVolPct} to E{input.fuel.ethanolMaxVolPct}; BSFC{" "}
              {n(r.blend.rich.bsfcGPerKwh)} g/kWh at the rich end (
              {r.blend.rich.bsfcSource === "given" ? "given" : "rule of thumb"}), stoichiometric AFR{" "}
              {n(r.blend.rich.stoichAfr, 1)}
            </Text>
            <Text>
              Regulator: {input.regulator.type === "fixed" ? "fixed" : "boost-referenced"}, base{" "}
              {q("pressure", input.regulator.basePressureKpa)}
            </Text>
          </View>
        </View>
        <Text style={[s.muted, { marginTop: 3 }]}>
          {pdfText(
            `Sized for ${n(r.limits.designDutyPct)} % injector duty (caution above ${n(r.limits.dutyCautionPct)} %, danger above ${n(r.limits.dutyDangerPct)} %), a pump margin of at least ${n(r.limits.minPumpMarginPct)} % and line drops of at most ${q("pressure", r.limits.maxLineDropKpa)}; ${DRIVE_LABELS[input.target.driveType ?? "manual"]} drivetrain.`,
          )}
        </Text>

        <Text style={s.h2}>Key figures</Text>
        <View style={[s.row, { flexWrap: "wrap", gap: 0 }]}>
          {fig("Fuel required (rich end)", q("volumeFlow", r.fuelVolumeFlowLPerH))}
          {fig(
            `Injector duty at E${input.fuel.ethanolMaxVolPct}`,
            `${n(r.blend.rich.dutyPct, 1)} %`,
          )}
          {fig(
            `Injector duty at E${input.fuel.ethanolMinVolPct}`,
            `${n(r.blend.lean.dutyPct, 1)} %`,
          )}
          {fig("Smallest injector rating", q("injectorFlow", r.injector.requiredRatedFlowCcPerMin))}
          {fig(
            "Pulse width at redline",
            `${n(r.injector.pulseWidthRedline.commandedMs ?? r.injector.pulseWidthRedline.effectiveMs, 2)} ms`,
          )}
          {fig("Pulse width at idle (open)", `${n(r.injector.pulseWidthIdle.effectiveMs, 2)} ms`)}
          {fig(
            "Pump supply / demand",
            `${q("volumeFlow", r.pump.supplyLPerH)} / ${q("volumeFlow", r.pump.demandLPerH)}`,
          )}
          {fig("Pump margin", `${n(r.pump.marginPct)} %`)}
          {fig("Rail pressure at full boost", q("pressure", r.pump.railPressureKpa))}
          {fig(
            "Feed / return line",
            `${r.lines.recommendedFeedDash ? `-${r.lines.recommendedFeedDash}` : "> -12"} / ${r.lines.recommendedReturnDash ? `-${r.lines.recommendedReturnDash}` : "> -12"} AN`,
          )}
          {fig("Power ceiling (crank)", q("power", r.powerCeiling.kw))}
          {fig(
            "Limited by",
            `the ${r.powerCeiling.limitedBy} (${r.powerCeiling.headroomPct >= 0 ? "+" : ""}${n(r.powerCeiling.headroomPct)} %)`,
          )}
        </View>

        <View style={[s.row, { marginTop: 6 }]}>
          <Chart
            title="Injector duty across engine speed"
            xLabel="rpm"
            yLabel="duty %"
            refY={r.limits.dutyDangerPct}
            series={[
              {
                name: `E${input.fuel.ethanolMaxVolPct}`,
                color: COPPER,
                points: rpm.map((p) => [p.rpm, p.dutyPctRich]),
              },
              {
                name: `E${input.fuel.ethanolMinVolPct}`,
                color: MUTED,
                points: rpm.map((p) => [p.rpm, p.dutyPctLean]),
              },
            ]}
          />
          <Chart
            title="Pump supply against demand"
            xLabel={`pressure (${converter("pressure", units).unit})`}
            yLabel={`flow (${converter("volumeFlow", units).unit})`}
            series={[
              {
                name: "supply",
                color: COPPER,
                points: pump.map((p) => [P(p.pressureKpa), F(p.supplyLPerH)]),
              },
              {
                name: "demand",
                color: MUTED,
                points: pump.map((p) => [P(p.pressureKpa), F(p.demandLPerH)]),
              },
            ]}
          />
        </View>

        {d.verification ? (
          <Verification v={d.verification} r={r} q={q} n={n} timeZone={d.timeZone} />
        ) : null}

        <Text style={s.h2}>Chosen parts</Text>
        {d.parts.length === 0 ? (
          <Text style={s.muted}>No parts chosen from the catalog yet.</Text>
        ) : (
          d.parts.map((p) => (
            <Text key={p.role + p.partId}>
              {p.quantity} × {p.name} ({p.sku}) — {p.role.replace("-", " ")}
            </Text>
          ))
        )}

        <Text style={s.h2}>Warnings</Text>
        {r.warnings.length === 0 ? (
          <Text>None.</Text>
        ) : (
          r.warnings.map((w) => (
            <Text key={w.code}>
              <Text style={{ fontWeight: 700 }}>
                {w.severity === "danger" ? "DANGER" : w.severity === "caution" ? "Caution" : "Note"}
                :{" "}
              </Text>
              {pdfText(`${w.message}${w.fix ? ` Fix: ${w.fix}` : ""}`)}
            </Text>
          ))
        )}

        <View style={s.caution} wrap={false}>
          <Text style={{ fontWeight: 700 }}>{SAFETY_TITLE}</Text>
          {SAFETY_POINTS.map((p) => (
            <Text key={p}>- {p}</Text>
          ))}
        </View>

        <Text style={s.h2} break={false}>
          How these numbers were worked out
        </Text>
        <View style={{ fontSize: 7 }}>
          {r.trace.map((t) => (
            <Text key={t.id}>
              <Text style={{ fontWeight: 700 }}>
                {pdfText(`${t.label} = ${n(t.value, 2)} ${t.unit}`)}
              </Text>
              {pdfText(
                `: ${t.formula}; ${t.inputs.map((i) => `${i.label} ${n(i.value, 3)} ${i.unit}`).join(", ")}`,
              )}
            </Text>
          ))}
        </View>
        <Text
          style={[s.muted, { position: "absolute", bottom: 16, left: 32, right: 32, fontSize: 7 }]}
          fixed
          render={({ pageNumber, totalPages }) =>
            `${d.build.title} · revision ${d.build.version} · page ${pageNumber} of ${totalPages} · figures by Fuelwright calculation library ${r.calcVersion}`
          }
        />
      </Page>
    </Document>
  );
}

/** The spec sheet as PDF bytes. */
export async function renderSpecSheet(d: SpecSheetData): Promise<Buffer> {
  return renderToBuffer(<SpecSheet d={d} />);
}
