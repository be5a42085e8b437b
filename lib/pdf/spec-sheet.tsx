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
  AN_SIZES,
  ASPIRATION_LABELS,
  BSFC_SOURCE_LABELS,
  DEFAULT_DRIVETRAIN_LOSS_PCT,
  DRIVE_TYPE_LABELS,
  dutyAcrossRpm,
  fillTemplate,
  formatTraceStep,
  formatValue,
  formatWarning,
  fuelPressureChart,
  LIMIT_LABELS,
  LIMITED_BY_LABELS,
  pumpBoostChart,
  pumpSupplyCurve,
  REGULATOR_LABELS,
  SEVERITY_LABELS,
  toShown,
  unitOf,
  type FuelSystemResult,
  type ParsedFuelSystemInput,
  type PullAnalysis,
  type Quantity,
  type UnitSystem,
} from "@/lib/calc";
import { KIT_ROLE_LABELS, type ChosenPart } from "@/lib/domain/builds";
import { PDF_PAGE_SIZE, type PaperSize } from "@/lib/domain/documents";
import { formatDate } from "@/lib/format/dates";
import { SAFETY_POINTS, SAFETY_TITLE } from "@/lib/safety";
import type { SheetSession } from "@/lib/tune/tune-session";

import { PdfBoostChart } from "./boost-charts";
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
  /** The build's tune session: best pull per fuel against the prediction, what stopped the climb. */
  tune?: SheetSession | null;
}

/** The tune session: the best pull per fuel, measured against predicted, and the limits met. */
function TuneSummary({
  t,
  q,
  units,
}: {
  t: SheetSession;
  q: (quantity: Quantity, x: number, decimals?: number) => string;
  units: UnitSystem;
}) {
  const cell = { width: "20%" } as const;
  return (
    <View wrap={false}>
      <Text style={s.h2}>Tune session</Text>
      <Text style={s.muted}>
        {pdfText(
          "The best pull on each fuel (power at the crank), measured beside what the sizing predicts at that power, boost and fuel.",
        )}
      </Text>
      <View style={[s.row, { fontWeight: 700, marginTop: 3 }]}>
        <Text style={cell}>Pull and fuel</Text>
        <Text style={cell}>Power at the crank</Text>
        <Text style={cell}>Boost</Text>
        <Text style={cell}>BSFC predicted / measured</Text>
        <Text style={cell}>Duty predicted / measured</Text>
      </View>
      {t.best.map((b) => (
        <View style={s.row} key={b.position}>
          <Text style={cell}>{pdfText(`#${b.position}, ${q("ethanol", b.ethanolPct)}`)}</Text>
          <Text style={cell}>{pdfText(`${q("power", b.crankKw)} at ${q("speed", b.rpm)}`)}</Text>
          <Text style={cell}>{b.boostKpa === null ? "not logged" : q("pressure", b.boostKpa)}</Text>
          <Text style={cell}>
            {pdfText(
              `${q("bsfc", b.predicted.bsfcGPerKwh)} / ${b.measured.bsfcGPerKwh === null ? "not logged" : q("bsfc", b.measured.bsfcGPerKwh)}`,
            )}
          </Text>
          <Text style={cell}>
            {pdfText(
              `${q("percent", b.predicted.dutyPct)} / ${b.measured.dutyPct === null ? "not logged" : q("percent", b.measured.dutyPct)}`,
            )}
          </Text>
        </View>
      ))}
      {t.stoppedBy ? (
        <>
          <Text style={{ fontWeight: 700, marginTop: 3 }}>
            {pdfText(`What stopped the climb (pull #${t.stoppedBy.position})`)}
          </Text>
          {t.stoppedBy.checks.map((c) => (
            <Text key={c.key}>
              {pdfText(
                `${c.status === "over" ? "Over" : "Near"} — ${LIMIT_LABELS[c.key]}: ${fillTemplate(c.message, c.params, units)}`,
              )}
            </Text>
          ))}
        </>
      ) : (
        <Text style={s.muted}>The last pull stayed inside every limit logged.</Text>
      )}
    </View>
  );
}

/** Measured on the dyno beside the sizing's prediction. */
function Verification({
  v,
  r,
  q,
  units,
  timeZone,
}: {
  v: NonNullable<SpecSheetData["verification"]>;
  r: FuelSystemResult;
  q: (quantity: Quantity, x: number, decimals?: number) => string;
  units: UnitSystem;
  timeZone: string;
}) {
  const a = v.analysis;
  const cell = { width: "33%" } as const;
  const rows: [string, string, string][] = [
    [
      "Peak injector duty",
      `${q("percent", a.predictedPeakDutyPct)} at redline`,
      a.peakDuty
        ? `${q("percent", a.peakDuty.pct)} at ${q("speed", a.peakDuty.rpm)}`
        : "not logged",
    ],
    [
      "Fuel flow at peak duty",
      q("volumeFlow", r.fuelVolumeFlowLPerH),
      a.measuredFlow ? q("volumeFlow", (a.measuredFlow.ccPerMin * 60) / 1000) : "not logged",
    ],
    [
      "BSFC",
      q("bsfc", r.blend.rich.bsfcGPerKwh),
      a.measuredBsfc
        ? `${q("bsfc", a.measuredBsfc.gPerKwh)} at ${q("power", a.measuredBsfc.powerKw)}`
        : "power not logged",
    ],
    [
      "Lambda under load",
      `target ${q("lambda", a.targetLambda)}`,
      a.lambda
        ? `mean error ${q("ratio", a.lambda.meanAbsError, 3)}, worst ${a.lambda.worstError >= 0 ? "+" : ""}${q("ratio", a.lambda.worstError, 3)} at ${q("speed", a.lambda.worstAtRpm)}`
        : "not logged",
    ],
    [
      "Fuel-pressure differential",
      "held by the regulator",
      a.fuelPressure
        ? `${q("pressure", a.fuelPressure.lowBoostDiffKpa)} falling to ${q("pressure", a.fuelPressure.fullBoostDiffKpa)} at full boost`
        : "not logged",
    ],
    [
      "Ethanol content",
      `${q("ethanol", r.blend.rich.ethanolVolPct)} (rich end)`,
      q("ethanol", a.ethanolPct),
    ],
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
      {a.warnings.map((raw) => {
        const w = formatWarning(raw, units);
        return (
          <Text key={w.code}>
            <Text style={{ fontWeight: 700 }}>
              {w.severity === "danger" ? "DANGER" : SEVERITY_LABELS[w.severity]} (log):{" "}
            </Text>
            {pdfText(`${w.message}${w.fix ? ` Fix: ${w.fix}` : ""}`)}
          </Text>
        );
      })}
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

function SpecSheet({ d }: { d: SpecSheetData }) {
  const { input, result: r, units } = d;
  const q = (quantity: Quantity, v: number, decimals?: number) =>
    pdfText(formatValue(quantity, v, units, decimals)).replace("—", "-");
  const dash = (d: number | null) =>
    q("anDash", d ?? AN_SIZES[AN_SIZES.length - 1]!.dash).replace(/^/, d ? "" : "larger than ");
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
                ? ` (${q("percent", input.target.drivetrainLossPct ?? DEFAULT_DRIVETRAIN_LOSS_PCT, 0)} drivetrain loss, ${q("power", r.crankPowerKw)} crank)`
                : ""}
            </Text>
            <Text>
              {q("count", input.engine.cylinders)} cylinders,{" "}
              {q("displacement", input.engine.displacementL)},{" "}
              {input.engine.aspiration === "na"
                ? ASPIRATION_LABELS.na.toLowerCase()
                : `${ASPIRATION_LABELS[input.engine.aspiration].toLowerCase()}, ${q("pressure", input.engine.maxBoostKpa)} boost`}
              ; redline {q("speed", input.engine.redlineRpm)}
            </Text>
            <Text>
              {pdfText(
                `Idle: ${q("speed", input.engine.idleRpm)}, manifold ${q("pressureAbs", input.engine.idleManifoldKpaAbs)}, volumetric efficiency ${q("ratio", input.engine.idleVolumetricEfficiency)}; intake air ${q("temperature", input.engine.intakeTempC)}, ambient ${q("pressureAbs", input.engine.ambientKpaAbs)}`,
              )}
            </Text>
          </View>
          <View style={s.col}>
            <Text style={s.h2}>Fuel and blend range</Text>
            <Text>
              {q("ethanol", input.fuel.ethanolMinVolPct)} to{" "}
              {q("ethanol", input.fuel.ethanolMaxVolPct)}; BSFC{" "}
              {q("bsfc", r.blend.rich.bsfcGPerKwh)} at the rich end (
              {BSFC_SOURCE_LABELS[r.blend.rich.bsfcSource]}), stoichiometric AFR{" "}
              {q("afr", r.blend.rich.stoichAfr)}
            </Text>
            <Text>
              Regulator: {REGULATOR_LABELS[input.regulator.type].toLowerCase()}, base{" "}
              {q("pressure", input.regulator.basePressureKpa)}
              {r.regulator.risingRateRatio !== 1
                ? `, rising rate ${q("risingRate", r.regulator.risingRateRatio)}`
                : ""}
              ; rail {q("pressure", r.pump.railPressureKpa)} at full boost
            </Text>
          </View>
        </View>
        <Text style={[s.muted, { marginTop: 3 }]}>
          {pdfText(
            `Sized for ${q("percent", r.limits.designDutyPct, 0)} injector duty (caution above ${q("percent", r.limits.dutyCautionPct, 0)}, danger above ${q("percent", r.limits.dutyDangerPct, 0)}), a pump margin of at least ${q("percent", r.limits.minPumpMarginPct, 0)} and line drops of at most ${q("pressure", r.limits.maxLineDropKpa)}; ${DRIVE_TYPE_LABELS[input.target.driveType ?? "manual"].toLowerCase()}.`,
          )}
        </Text>

        <Text style={s.h2}>Key figures</Text>
        <View style={[s.row, { flexWrap: "wrap", gap: 0 }]}>
          {fig("Fuel required (worse end)", q("volumeFlow", r.fuelVolumeFlowLPerH))}
          {fig(
            `Injector duty at ${q("ethanol", input.fuel.ethanolMaxVolPct)}`,
            q("percent", r.blend.rich.dutyPct),
          )}
          {fig(
            `Injector duty at ${q("ethanol", input.fuel.ethanolMinVolPct)}`,
            q("percent", r.blend.lean.dutyPct),
          )}
          {fig("Smallest injector rating", q("injectorFlow", r.injector.requiredRatedFlowCcPerMin))}
          {fig(
            "Pulse width at redline",
            q(
              "time",
              r.injector.pulseWidthRedline.commandedMs ?? r.injector.pulseWidthRedline.effectiveMs,
            ),
          )}
          {fig("Pulse width at idle (open)", q("time", r.injector.pulseWidthIdle.effectiveMs))}
          {fig(
            "Pump supply / demand",
            `${q("volumeFlow", r.pump.supplyLPerH)} / ${q("volumeFlow", r.pump.demandLPerH)}`,
          )}
          {fig("Pump margin", q("percent", r.pump.marginPct, 0))}
          {fig("Rail pressure at full boost", q("pressure", r.pump.railPressureKpa))}
          {fig(
            "Feed / return line",
            `${dash(r.lines.recommendedFeedDash)} / ${dash(r.lines.recommendedReturnDash)}`,
          )}
          {fig("Power ceiling (crank)", q("power", r.powerCeiling.kw))}
          {fig(
            "Limited by",
            `${LIMITED_BY_LABELS[r.powerCeiling.limitedBy]} (${r.powerCeiling.headroomPct >= 0 ? "+" : ""}${q("percent", r.powerCeiling.headroomPct, 0)})${r.powerCeiling.severity === "caution" || r.powerCeiling.severity === "danger" ? `, ${r.powerCeiling.severity}` : ""}`,
          )}
        </View>

        <View style={[s.row, { marginTop: 6 }]}>
          <Chart
            title="Injector duty across engine speed"
            xLabel={unitOf("speed", units)}
            yLabel={`duty ${unitOf("percent", units)}`}
            refY={r.limits.dutyDangerPct}
            series={[
              {
                name: q("ethanol", input.fuel.ethanolMaxVolPct),
                color: COPPER,
                points: rpm.map((p) => [p.rpm, p.dutyPctRich]),
              },
              {
                name: q("ethanol", input.fuel.ethanolMinVolPct),
                color: MUTED,
                points: rpm.map((p) => [p.rpm, p.dutyPctLean]),
              },
            ]}
          />
          <Chart
            title="Pump supply against demand"
            xLabel={`pressure (${unitOf("pressure", units)})`}
            yLabel={`flow (${unitOf("volumeFlow", units)})`}
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

        <View style={[s.row, { marginTop: 6 }]} wrap={false}>
          <PdfBoostChart chart={fuelPressureChart(r, units)} />
          <PdfBoostChart chart={pumpBoostChart(r, units)} />
        </View>

        {d.verification ? (
          <Verification v={d.verification} r={r} q={q} units={units} timeZone={d.timeZone} />
        ) : null}

        {d.tune ? <TuneSummary t={d.tune} q={q} units={units} /> : null}

        <Text style={s.h2}>Chosen parts</Text>
        {d.parts.length === 0 ? (
          <Text style={s.muted}>No parts chosen from the catalog yet.</Text>
        ) : (
          d.parts.map((p) => (
            <Text key={p.role + p.partId}>
              {q("count", p.quantity)} × {p.name} ({p.sku}) — {KIT_ROLE_LABELS[p.role]}
            </Text>
          ))
        )}

        <Text style={s.h2}>Warnings</Text>
        {r.warnings.length === 0 ? (
          <Text>None.</Text>
        ) : (
          r.warnings.map((raw) => {
            const w = formatWarning(raw, units);
            return (
              <Text key={w.code}>
                <Text style={{ fontWeight: 700 }}>
                  {w.severity === "danger" ? "DANGER" : SEVERITY_LABELS[w.severity]}:{" "}
                </Text>
                {pdfText(`${w.message}${w.fix ? ` Fix: ${w.fix}` : ""}`)}
              </Text>
            );
          })
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
          {r.trace.map((raw) => {
            const t = formatTraceStep(raw, units);
            return (
              <Text key={t.id}>
                <Text style={{ fontWeight: 700 }}>{pdfText(`${t.label} = ${t.value}`)}</Text>
                {pdfText(`: ${t.formula}; ${t.inputs.join(", ")}`)}
              </Text>
            );
          })}
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
