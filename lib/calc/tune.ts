// Reference: docs/calculations.md §6.5.
import { z } from "zod";

import { CalcInputError, requirePositive, requireRange } from "./_lib/input-error";
import { ATMOSPHERE_KPA } from "./constants";
import {
  analyzePull,
  sampleDutyPct,
  type PullAnalysis,
  type PullContext,
  type PullSample,
} from "./dyno";
import { crankPowerFromWheel } from "./power";
import type { Figure, FigureParams } from "./quantities";
import type { ParsedFuelSystemInput } from "./schema";
import { sizeParsedFuelSystem } from "./size";
import { LIMIT_KEYS, LIMIT_LABELS, type LimitKey, type LimitStatus } from "./tune-labels";
import type { Warning } from "./types";

/**
 * A tune session: the pulls of one build in order, each judged against the shop's limits
 * (lambda target following boost, duty, EGT, EGT spread, exhaust-to-boost pressure ratio,
 * turbo speed), and the next step predicted from what the last pull measured.
 */

/** Where the dyno measured the power: at the hubs, the wheels, or (an engine dyno) the crank. */
export const POWER_MEASURED_AT = ["crank", "wheel", "hub"] as const;
export type PowerMeasuredAt = (typeof POWER_MEASURED_AT)[number];

const n = (label: string, min: number, max: number, unit = "") =>
  z
    .number({ error: `${label} must be a number` })
    .min(min, `${label} must be between ${min} and ${max}${unit}`)
    .max(max, `${label} must be between ${min} and ${max}${unit}`);

/** One row of the lambda table: the target at a boost (kPa gauge), straight lines between rows. */
export const LambdaTargetSchema = z.object({
  boostKpa: n("Boost", 0, 500, " kPa"),
  lambda: n("Target lambda", 0.6, 1.3),
});

/** The limits a pull is judged against, field by field (the lambda table is one field). */
const TuneLimitsShape = z.object({
  lambdaTargets: z
    .array(LambdaTargetSchema)
    .min(1, "Give at least one lambda target")
    .max(12, "At most 12 rows in the lambda table"),
  /** How much leaner than the target a pull may run before it is "over". */
  lambdaLeanAllowance: n("Lean allowance", 0, 0.2),
  maxDutyPct: n("Maximum duty", 50, 100, " %"),
  maxEgtC: n("Maximum EGT", 300, 1200, " °C"),
  maxEgtSpreadC: n("Maximum EGT spread", 5, 400, " °C"),
  maxBackPressureRatio: n("Maximum exhaust-to-boost pressure ratio", 1, 4),
  /** The compressor map's limit; null: not known, not checked. */
  maxTurboRpm: n("Maximum turbo speed", 10000, 400000, " rpm").nullable(),
  /** Within this share below a maximum, a pull is "near" it. */
  nearPct: n("Near band", 0, 25, " %"),
});

function distinctBoosts(rows: { boostKpa: number }[] | undefined, ctx: z.RefinementCtx) {
  const seen = new Set<number>();
  rows?.forEach((r, i) => {
    if (seen.has(r.boostKpa))
      ctx.addIssue({
        code: "custom",
        path: ["lambdaTargets", i, "boostKpa"],
        message: "Each row of the lambda table needs its own boost",
      });
    seen.add(r.boostKpa);
  });
}

/** The limits a pull is judged against: the shop's defaults, or a build's own. */
export const TuneLimitsSchema = TuneLimitsShape.superRefine((l, ctx) =>
  distinctBoosts(l.lambdaTargets, ctx),
);
/**
 * A build's own limits: only the fields it sets apart from the shop's (the rest follow the
 * shop's defaults, and change with them).
 */
export const TuneLimitsOverrideSchema = TuneLimitsShape.partial().superRefine((l, ctx) =>
  distinctBoosts(l.lambdaTargets, ctx),
);
export type TuneLimitsOverride = z.output<typeof TuneLimitsOverrideSchema>;
export type TuneLimitKey = keyof z.output<typeof TuneLimitsShape>;
/** Every field of the limits, in the editor's order. */
export const TUNE_LIMIT_KEYS = Object.keys(TuneLimitsShape.shape) as TuneLimitKey[];
export type TuneLimits = z.output<typeof TuneLimitsSchema>;

/**
 * The limits a shop starts with (common practice, no source): λ 0.90 off boost richening to
 * 0.86 at 60 kPa, 0.80 at 150 kPa and 0.78 at 250 kPa; 0.03 leaner allowed; 90 % duty;
 * 950 °C EGT and 80 °C between cylinders; exhaust manifold pressure at most 2.0 times the
 * boost, both gauge (the trade's "2:1 drive pressure"); turbo speed not checked until the shop names its compressor's limit.
 */
export const DEFAULT_TUNE_LIMITS: TuneLimits = {
  lambdaTargets: [
    { boostKpa: 0, lambda: 0.9 },
    { boostKpa: 60, lambda: 0.86 },
    { boostKpa: 150, lambda: 0.8 },
    { boostKpa: 250, lambda: 0.78 },
  ],
  lambdaLeanAllowance: 0.03,
  maxDutyPct: 90,
  maxEgtC: 950,
  maxEgtSpreadC: 80,
  maxBackPressureRatio: 2,
  maxTurboRpm: null,
  nearPct: 5,
};

/** Do two values of one limit field say the same (the lambda table row by row)? */
export function sameLimit<K extends TuneLimitKey>(a: TuneLimits[K], b: TuneLimits[K]): boolean {
  if (Array.isArray(a) && Array.isArray(b))
    return (
      a.length === b.length &&
      a.every((r, i) => r.boostKpa === b[i]!.boostKpa && r.lambda === b[i]!.lambda)
    );
  return a === b;
}

/**
 * The limits in force: the build's own fields over the base (the shop's defaults, else the
 * library's).
 * @example mergeTuneLimits(DEFAULT_TUNE_LIMITS, { maxDutyPct: 85 }).maxDutyPct // 85
 */
export function mergeTuneLimits(base: TuneLimits, own: TuneLimitsOverride | null): TuneLimits {
  const out = { ...base } as Record<TuneLimitKey, unknown>;
  for (const k of TUNE_LIMIT_KEYS) if (own && own[k] !== undefined) out[k] = own[k];
  return out as TuneLimits;
}

/**
 * A build's own fields after an edit: a field sent as it is in force keeps what the build had
 * (own or the shop's), a changed field is the build's own unless it equals the base again; null
 * when nothing is the build's own.
 * @example nextOverride(DEFAULT_TUNE_LIMITS, null, { maxDutyPct: 85 }) // { maxDutyPct: 85 }
 */
export function nextOverride(
  base: TuneLimits,
  own: TuneLimitsOverride | null,
  sent: TuneLimitsOverride,
): TuneLimitsOverride | null {
  const inForce = mergeTuneLimits(base, own);
  const out: Record<string, unknown> = {};
  for (const k of TUNE_LIMIT_KEYS) {
    const v = sent[k];
    if (v === undefined || sameLimit(v as never, inForce[k] as never)) {
      if (own && own[k] !== undefined) out[k] = own[k];
    } else if (!sameLimit(v as never, base[k] as never)) out[k] = v;
  }
  return Object.keys(out).length ? (out as TuneLimitsOverride) : null;
}

/**
 * Crank power from a power measured at the hubs or wheels, with the build's drivetrain loss
 * (P_crank = P / (1 − loss)); crank power as it is.
 * @example crankPowerKw({ powerKw: 880, measuredAt: "hub", drivetrainLossPct: 12 }) // 1000
 */
export function crankPowerKw(q: {
  powerKw: number;
  measuredAt: PowerMeasuredAt;
  drivetrainLossPct: number;
}): number {
  if (q.measuredAt === "crank") return requireRange("powerKw", q.powerKw, 0, 1e5, "Power");
  return crankPowerFromWheel({ wheelPowerKw: q.powerKw, drivetrainLossPct: q.drivetrainLossPct });
}

/**
 * The lambda target at a boost: the table's rows joined by straight lines, the end rows held
 * beyond the table.
 * @example lambdaTargetAt([{ boostKpa: 0, lambda: 0.9 }, { boostKpa: 100, lambda: 0.8 }], 60) // 0.84
 */
export function lambdaTargetAt(table: TuneLimits["lambdaTargets"], boostKpa: number): number {
  if (!table.length) throw new CalcInputError("lambdaTargets", "Give at least one lambda target");
  // Any logged boost is judged: beyond the table's rows the end rows hold.
  if (!Number.isFinite(boostKpa)) throw new CalcInputError("boostKpa", "Boost must be a number");
  const rows = [...table].sort((a, b) => a.boostKpa - b.boostKpa);
  if (boostKpa <= rows[0]!.boostKpa) return rows[0]!.lambda;
  for (let i = 1; i < rows.length; i++) {
    const a = rows[i - 1]!;
    const b = rows[i]!;
    if (boostKpa <= b.boostKpa)
      return (
        a.lambda + ((b.lambda - a.lambda) * (boostKpa - a.boostKpa)) / (b.boostKpa - a.boostKpa)
      );
  }
  return rows[rows.length - 1]!.lambda;
}

/** One point of a pull as the session keeps it: canonical units, power carried to the crank. */
export interface TunePoint {
  rpm: number;
  dutyPct: number | null;
  lambda: number | null;
  boostKpa: number | null;
  fuelDiffKpa: number | null;
  /** Crank power, kW (logged at the hub or wheels: carried to the crank). */
  powerKw: number | null;
  torqueNm: number | null;
  egtC: (number | null)[] | null;
  exhaustKpa: number | null;
  turboRpm: number | null;
  intakeTempC: number | null;
  timingDeg: number | null;
}

const finite = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);
const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
const meanOf = (xs: (number | null | undefined)[]) => {
  const f = xs.filter(finite);
  return f.length ? mean(f) : null;
};
/** Torque from power and speed: T = P / ω, N·m = kW × 60 000 / (2π · rpm). */
const torqueNm = (kw: number, rpm: number) => (kw * 60000) / (2 * Math.PI * rpm);

/** Most points a pull keeps: more rows are thinned to the worst value of each band of rpm. */
export const MAX_PULL_POINTS = 600;

const CHANNELS: { key: keyof PullSample; label: string }[] = [
  { key: "dutyPct", label: "duty" },
  { key: "lambda", label: "lambda" },
  { key: "boostKpa", label: "boost" },
  { key: "fuelDiffKpa", label: "fuel pressure" },
  { key: "powerKw", label: "power" },
  { key: "exhaustKpa", label: "exhaust pressure" },
  { key: "turboRpm", label: "turbo speed" },
  { key: "intakeTempC", label: "intake air temperature" },
  { key: "timingDeg", label: "ignition timing" },
];

/**
 * A logged pull made ready for judging: rows without an engine speed left out, rows at the same
 * engine speed averaged into one, the rest in rising rpm, power carried to the crank; and notes
 * saying what was done (rows left out, repeats averaged, gaps in rpm, blank cells per channel).
 * @example preparePull([{ rpm: 3000, powerKw: 88 }, { rpm: 3000, powerKw: 92 }], { measuredAt: "crank", drivetrainLossPct: 0 }).points[0].powerKw // 90
 */
export function preparePull(
  samples: PullSample[],
  power: { measuredAt: PowerMeasuredAt; drivetrainLossPct: number },
): { points: TunePoint[]; notes: Warning[] } {
  requireRange("drivetrainLossPct", power.drivetrainLossPct, 0, 60, "Drivetrain loss");
  const notes: Warning[] = [];
  const note = (code: string, message: string, params: FigureParams = {}) =>
    notes.push({ code, severity: "info", message, params });
  const usable = samples.filter((s) => finite(s.rpm) && s.rpm > 0 && s.rpm <= 30000);
  if (usable.length < samples.length)
    note("pull-rows-without-rpm", "{count} rows had no engine speed and were left out.", {
      count: { value: samples.length - usable.length, quantity: "count" },
    });
  for (const c of CHANNELS) {
    const present = usable.filter((s) => s[c.key] !== undefined);
    const blank = present.filter((s) => !finite(s[c.key] as unknown)).length;
    if (present.length && blank && blank < present.length)
      note(
        `pull-blank-${c.key}`,
        `The ${c.label} channel is blank in {count} rows; those rows are judged without it.`,
        { count: { value: blank, quantity: "count" } },
      );
  }
  const byRpm = new Map<number, PullSample[]>();
  for (const s of usable) {
    const group = byRpm.get(s.rpm);
    if (group) group.push(s);
    else byRpm.set(s.rpm, [s]);
  }
  const repeated = usable.length - byRpm.size;
  if (repeated > 0)
    note(
      "pull-repeated-rpm",
      "{count} rows repeated an engine speed already logged; each repeat was averaged with it.",
      { count: { value: repeated, quantity: "count" } },
    );
  const cylinders = usable.reduce((m, s) => Math.max(m, s.egtC?.length ?? 0), 0);
  const points: TunePoint[] = [...byRpm.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([rpm, group]) => {
      const duty = meanOf(group.map((s) => sampleDutyPct(s)));
      const logged = meanOf(group.map((s) => s.powerKw));
      const crank =
        logged === null || logged < 0 ? null : crankPowerKw({ powerKw: logged, ...power });
      return {
        rpm,
        dutyPct: duty,
        lambda: meanOf(group.map((s) => s.lambda)),
        boostKpa: meanOf(group.map((s) => s.boostKpa)),
        fuelDiffKpa: meanOf(group.map((s) => s.fuelDiffKpa)),
        powerKw: crank,
        torqueNm: crank === null ? null : torqueNm(crank, rpm),
        egtC: cylinders
          ? Array.from({ length: cylinders }, (_, i) => meanOf(group.map((s) => s.egtC?.[i])))
          : null,
        exhaustKpa: meanOf(group.map((s) => s.exhaustKpa)),
        turboRpm: meanOf(group.map((s) => s.turboRpm)),
        intakeTempC: meanOf(group.map((s) => s.intakeTempC)),
        timingDeg: meanOf(group.map((s) => s.timingDeg)),
      };
    });
  if (points.length >= 3) {
    const steps = points.slice(1).map((p, i) => p.rpm - points[i]!.rpm);
    const median = [...steps].sort((a, b) => a - b)[Math.floor(steps.length / 2)]!;
    const gap = Math.max(500, 5 * median);
    steps.forEach((d, i) => {
      if (d > gap)
        note("pull-rpm-gap", "Nothing was logged between {from} and {to}.", {
          from: { value: points[i]!.rpm, quantity: "speed" },
          to: { value: points[i + 1]!.rpm, quantity: "speed" },
        });
    });
  }
  return { points: thin(points), notes };
}

/** Thins to MAX_PULL_POINTS: each band of rpm keeps its worst (highest; fuel pressure lowest). */
function thin(points: TunePoint[]): TunePoint[] {
  if (points.length <= MAX_PULL_POINTS) return points;
  const size = Math.ceil(points.length / MAX_PULL_POINTS);
  const out: TunePoint[] = [];
  const max = (xs: (number | null)[]) => {
    const f = xs.filter(finite);
    return f.length ? Math.max(...f) : null;
  };
  for (let i = 0; i < points.length; i += size) {
    const g = points.slice(i, i + size);
    const fuel = g.map((p) => p.fuelDiffKpa).filter(finite);
    const cyl = g[0]!.egtC?.length ?? 0;
    out.push({
      rpm: Math.round(mean(g.map((p) => p.rpm))),
      dutyPct: max(g.map((p) => p.dutyPct)),
      lambda: max(g.map((p) => p.lambda)),
      boostKpa: max(g.map((p) => p.boostKpa)),
      fuelDiffKpa: fuel.length ? Math.min(...fuel) : null,
      powerKw: max(g.map((p) => p.powerKw)),
      torqueNm: max(g.map((p) => p.torqueNm)),
      egtC: cyl
        ? Array.from({ length: cyl }, (_, c) => max(g.map((p) => p.egtC?.[c] ?? null)))
        : null,
      exhaustKpa: max(g.map((p) => p.exhaustKpa)),
      turboRpm: max(g.map((p) => p.turboRpm)),
      intakeTempC: max(g.map((p) => p.intakeTempC)),
      timingDeg: meanOf(g.map((p) => p.timingDeg)),
    });
  }
  return out;
}

/** What a pull measured, for the pull list, the spec sheet and the next step. */
export interface TunePullSummary {
  points: number;
  /** Highest crank power and where, with the figure as logged (hub, wheel or crank). */
  peakPower: { crankKw: number; loggedKw: number; rpm: number } | null;
  peakTorque: { nm: number; rpm: number } | null;
  peakBoostKpa: number | null;
  peakDuty: { pct: number; rpm: number } | null;
  /** Measured at the sample of highest crank power (so a wheel log and its crank twin agree). */
  measuredBsfc: PullAnalysis["measuredBsfc"];
  measuredFlow: PullAnalysis["measuredFlow"];
  fuelPressure: PullAnalysis["fuelPressure"];
  maxEgt: { c: number; rpm: number; cylinder: number } | null;
  maxTurboRpm: number | null;
  maxIntakeTempC: number | null;
  /** Timing at peak power. */
  timingAtPeakDeg: number | null;
  /** Findings of the fuel analysis that no limit covers (fuel pressure falling). */
  warnings: Warning[];
}

/**
 * The figures of one pull: peak crank power and torque, peak boost and duty, measured BSFC and
 * flow (lib/calc/dyno analyzePull on crank power), hottest cylinder, top turbo speed and intake
 * temperature, timing at peak power.
 */
export function summarizePull(
  points: TunePoint[],
  ctx: Omit<PullContext, "targetLambda" | "dutyDangerPct">,
  measuredAt: PowerMeasuredAt,
  drivetrainLossPct: number,
): TunePullSummary {
  // Lambda and duty are judged by the limits (lambda following boost), not by one target.
  const base = analyzePull(points, { ...ctx, targetLambda: 1, dutyDangerPct: 100 });
  const powered = points.filter((p) => finite(p.powerKw));
  const top = powered.length ? powered.reduce((a, b) => (b.powerKw! > a.powerKw! ? b : a)) : null;
  const torqued = points.filter((p) => finite(p.torqueNm));
  const tq = torqued.length ? torqued.reduce((a, b) => (b.torqueNm! > a.torqueNm! ? b : a)) : null;
  let maxEgt: TunePullSummary["maxEgt"] = null;
  for (const p of points)
    p.egtC?.forEach((c, i) => {
      if (finite(c) && (!maxEgt || c > maxEgt.c)) maxEgt = { c, rpm: p.rpm, cylinder: i + 1 };
    });
  const maxOf = (xs: (number | null)[]) => {
    const f = xs.filter(finite);
    return f.length ? Math.max(...f) : null;
  };
  return {
    points: points.length,
    peakPower: top
      ? {
          crankKw: top.powerKw!,
          loggedKw:
            measuredAt === "crank" ? top.powerKw! : top.powerKw! * (1 - drivetrainLossPct / 100),
          rpm: top.rpm,
        }
      : null,
    peakTorque: tq ? { nm: tq.torqueNm!, rpm: tq.rpm } : null,
    peakBoostKpa: maxOf(points.map((p) => p.boostKpa)),
    peakDuty: base.peakDuty,
    measuredBsfc: base.measuredBsfc,
    measuredFlow: base.measuredFlow,
    fuelPressure: base.fuelPressure,
    maxEgt,
    maxTurboRpm: maxOf(points.map((p) => p.turboRpm)),
    maxIntakeTempC: maxOf(points.map((p) => p.intakeTempC)),
    timingAtPeakDeg: top?.timingDeg ?? null,
    warnings: base.warnings.filter((w) => w.code === "log-fuel-pressure-falls"),
  };
}

export { LIMIT_KEYS, LIMIT_LABELS };
export type { LimitKey, LimitStatus };

/** One limit judged on one pull: where the pull came closest (or went furthest past), and why. */
export interface LimitCheck {
  key: LimitKey;
  status: LimitStatus;
  /** Engine speed of the worst point. */
  atRpm: number | null;
  /** The worst measured figure and the limit there; `by`: past the limit (+) or short of it (−). */
  measured: Figure | null;
  allowed: Figure | null;
  by: Figure | null;
  /** The reason as a template with its figures (fillTemplate / formatWarning). */
  message: string;
  params: FigureParams;
}

/** Load: duty above 20 % (the dyno analysis's rule), or boost above 10 kPa where no duty is logged. */
const loaded = (p: TunePoint) =>
  p.dutyPct !== null ? p.dutyPct > 20 : p.boostKpa !== null && p.boostKpa > 10;
/** The exhaust-to-boost ratio is judged from this much boost up: off boost it means nothing. */
export const BACK_PRESSURE_MIN_BOOST_KPA = 20;

/**
 * The points whose exhaust-to-boost ratio is judged: both logged, at least 20 kPa boost and at
 * least half the pull's peak boost (while the turbo spools the exhaust side leads, and a ratio of
 * gauge pressures over a small boost figure means little).
 */
export function backPressurePoints(points: TunePoint[]): TunePoint[] {
  const both = points.filter((p) => finite(p.exhaustKpa) && finite(p.boostKpa));
  const peak = both.reduce((m, p) => Math.max(m, p.boostKpa!), 0);
  const from = Math.max(BACK_PRESSURE_MIN_BOOST_KPA, peak / 2);
  return both.filter((p) => p.boostKpa! >= from);
}

function maximum(
  key: LimitKey,
  worst: { value: number; rpm: number; extra?: FigureParams } | null,
  limit: number | null,
  nearPct: number,
  quantity: Figure["quantity"],
  byQuantity: Figure["quantity"] = quantity,
  wording: { over: string; near: string; within: string },
): LimitCheck {
  if (limit === null)
    return {
      key,
      status: "not-set",
      atRpm: worst?.rpm ?? null,
      measured: worst ? { value: worst.value, quantity } : null,
      allowed: null,
      by: null,
      message: "No limit set.",
      params: {},
    };
  if (!worst)
    return {
      key,
      status: "no-data",
      atRpm: null,
      measured: null,
      allowed: { value: limit, quantity },
      by: null,
      message: "Not logged in this pull.",
      params: {},
    };
  const by = worst.value - limit;
  const status: LimitStatus =
    by > 0 ? "over" : worst.value >= limit * (1 - nearPct / 100) ? "near" : "within";
  const params: FigureParams = {
    measured: { value: worst.value, quantity },
    limit: { value: limit, quantity },
    by: { value: Math.abs(by), quantity: byQuantity },
    rpm: { value: worst.rpm, quantity: "speed" },
    ...worst.extra,
  };
  return {
    key,
    status,
    atRpm: worst.rpm,
    measured: params.measured!,
    allowed: params.limit!,
    by: { value: by, quantity: byQuantity },
    message: wording[status],
    params,
  };
}

/**
 * Each limit judged on a pull: within, near (within `nearPct` below a maximum; for lambda,
 * leaner than the target by more than half the allowance) or over, with where and by how much.
 * Lambda and the EGT spread are judged under load only; the pressure ratio (exhaust over boost,
 * both gauge) from 20 kPa boost and half the pull's peak boost up (`backPressurePoints`).
 * @example checkLimits(points, DEFAULT_TUNE_LIMITS).find((c) => c.key === "duty") // { status: "near", atRpm: 7000, … }
 */
export function checkLimits(points: TunePoint[], limits: TuneLimits): LimitCheck[] {
  const l = TuneLimitsSchema.parse(limits);
  const under = points.filter(loaded);
  const worstOf = <T extends { value: number }>(xs: T[]) =>
    xs.length ? xs.reduce((a, b) => (b.value > a.value ? b : a)) : null;

  // Lambda: how far leaner than the table's target at that point's boost.
  const lean = worstOf(
    under
      .filter((p) => finite(p.lambda))
      .map((p) => {
        const target = lambdaTargetAt(l.lambdaTargets, p.boostKpa ?? 0);
        return {
          value: p.lambda! - target,
          rpm: p.rpm,
          lambda: p.lambda!,
          target,
          boost: p.boostKpa,
        };
      }),
  );
  let lambda: LimitCheck;
  if (!lean)
    lambda = {
      key: "lambda",
      status: "no-data",
      atRpm: null,
      measured: null,
      allowed: null,
      by: null,
      message: "Lambda was not logged under load in this pull.",
      params: {},
    };
  else {
    const allowed = lean.target + l.lambdaLeanAllowance;
    const by = lean.lambda - allowed;
    const status: LimitStatus =
      by > 0 ? "over" : lean.value > l.lambdaLeanAllowance / 2 ? "near" : "within";
    const params: FigureParams = {
      measured: { value: lean.lambda, quantity: "lambda" },
      target: { value: lean.target, quantity: "lambda" },
      limit: { value: allowed, quantity: "lambda" },
      by: { value: Math.abs(by), quantity: "ratio" },
      rpm: { value: lean.rpm, quantity: "speed" },
      boost: { value: lean.boost ?? 0, quantity: "pressure" },
    };
    lambda = {
      key: "lambda",
      status,
      atRpm: lean.rpm,
      measured: params.measured!,
      allowed: params.limit!,
      by: { value: by, quantity: "ratio" },
      message: {
        over: "Ran {measured} at {rpm} where the table asks {target} at {boost}: {by} leaner than the allowed {limit}. Stop and richen before the next pull.",
        near: "Leanest {measured} at {rpm} against {target} at {boost}: within the allowance, {by} short of {limit}.",
        within: "on the table: leanest {measured} at {rpm} against {target} at {boost}.",
        "no-data": "",
        "not-set": "",
      }[status],
      params,
    };
  }

  const duty = maximum(
    "duty",
    worstOf(
      points.filter((p) => finite(p.dutyPct)).map((p) => ({ value: p.dutyPct!, rpm: p.rpm })),
    ),
    l.maxDutyPct,
    l.nearPct,
    "percent",
    "percent",
    {
      over: "Duty reached {measured} at {rpm}, {by} past the {limit} limit: the injectors are out of headroom.",
      near: "Duty reached {measured} at {rpm}, {by} short of the {limit} limit.",
      within: "Peak duty {measured} at {rpm}; the limit is {limit}.",
    },
  );

  let hottest: { value: number; rpm: number; extra: FigureParams } | null = null;
  let spread: { value: number; rpm: number; extra: FigureParams } | null = null;
  for (const p of points) {
    const cyl = (p.egtC ?? [])
      .map((c, i) => ({ c, i: i + 1 }))
      .filter((x): x is { c: number; i: number } => finite(x.c));
    for (const x of cyl)
      if (!hottest || x.c > hottest.value)
        hottest = {
          value: x.c,
          rpm: p.rpm,
          extra: { cylinder: { value: x.i, quantity: "count" } },
        };
    if (cyl.length >= 2 && loaded(p)) {
      const hi = cyl.reduce((a, b) => (b.c > a.c ? b : a));
      const lo = cyl.reduce((a, b) => (b.c < a.c ? b : a));
      if (!spread || hi.c - lo.c > spread.value)
        spread = {
          value: hi.c - lo.c,
          rpm: p.rpm,
          extra: {
            hot: { value: hi.i, quantity: "count" },
            cold: { value: lo.i, quantity: "count" },
          },
        };
    }
  }
  const egt = maximum("egt", hottest, l.maxEgtC, l.nearPct, "temperature", "temperatureDiff", {
    over: "Cylinder {cylinder} reached {measured} at {rpm}, {by} past the {limit} limit.",
    near: "Cylinder {cylinder} reached {measured} at {rpm}, {by} short of the {limit} limit.",
    within: "Hottest: cylinder {cylinder} at {measured} ({rpm}); the limit is {limit}.",
  });
  const egtSpread = maximum(
    "egtSpread",
    spread,
    l.maxEgtSpreadC,
    l.nearPct,
    "temperatureDiff",
    "temperatureDiff",
    {
      over: "Cylinder {hot} ran {measured} hotter than cylinder {cold} at {rpm}, {by} past the {limit} allowed: look at that cylinder's injector, plug and timing.",
      near: "Cylinder {hot} ran {measured} hotter than cylinder {cold} at {rpm}, {by} short of the {limit} allowed.",
      within: "Widest spread {measured} (cylinder {hot} over {cold}) at {rpm}; {limit} allowed.",
    },
  );

  const ratio = worstOf(
    backPressurePoints(points).map((p) => ({
      value: p.exhaustKpa! / p.boostKpa!,
      rpm: p.rpm,
      extra: {
        exhaust: { value: p.exhaustKpa!, quantity: "pressure" },
        boost: { value: p.boostKpa!, quantity: "pressure" },
      } as FigureParams,
    })),
  );
  const backPressure = maximum(
    "backPressure",
    ratio,
    l.maxBackPressureRatio,
    l.nearPct,
    "pressureRatio",
    "ratio",
    {
      over: "Exhaust manifold {exhaust} against {boost} boost (both gauge) at {rpm}: {measured}, past the {limit} limit — the turbine is choking.",
      near: "Exhaust manifold {exhaust} against {boost} boost (both gauge) at {rpm}: {measured}, near the {limit} limit.",
      within:
        "Highest exhaust-to-boost ratio {measured} (exhaust {exhaust} against {boost} boost, both gauge) at {rpm}; the limit is {limit}.",
    },
  );

  const turboSpeed = maximum(
    "turboSpeed",
    worstOf(
      points.filter((p) => finite(p.turboRpm)).map((p) => ({ value: p.turboRpm!, rpm: p.rpm })),
    ),
    l.maxTurboRpm,
    l.nearPct,
    "turboSpeed",
    "turboSpeed",
    {
      over: "The turbo reached {measured} at {rpm}, {by} past the compressor's {limit}.",
      near: "The turbo reached {measured} at {rpm}, {by} short of the compressor's {limit}.",
      within: "Top turbo speed {measured} at {rpm}; the compressor's limit is {limit}.",
    },
  );
  return [lambda, duty, egt, egtSpread, backPressure, turboSpeed];
}

/** Crank power expected at another boost: in proportion to manifold absolute pressure (common practice, no source). */
export function powerAtBoostKw(q: {
  crankKw: number;
  fromBoostKpa: number;
  toBoostKpa: number;
  ambientKpaAbs?: number;
}): number {
  const amb = q.ambientKpaAbs ?? ATMOSPHERE_KPA;
  requirePositive("crankKw", q.crankKw, 1e5, "Power");
  requireRange("fromBoostKpa", q.fromBoostKpa, 0, 500, "Boost");
  requireRange("toBoostKpa", q.toBoostKpa, 0, 500, "Boost");
  return (q.crankKw * (amb + q.toBoostKpa)) / (amb + q.fromBoostKpa);
}

/** The next step asked for: a boost (kPa gauge) or a crank power (kW). */
export type StepTarget = { boostKpa: number } | { crankKw: number };

export interface NextStep {
  crankKw: number;
  boostKpa: number;
  bsfcGPerKwh: number;
  ethanolPct: number;
  dutyPct: number;
  dutyLimitPct: number;
  pumpMarginPct: number;
  minPumpMarginPct: number;
  /** Feed-line drop at the step's flow; null: the build names no feed line. */
  feedDropKpa: number | null;
  maxLineDropKpa: number;
  /** The part that runs out first, and the crank power where it does (the sizing's ceiling). */
  runsOutFirst: {
    part: "injectors" | "pump" | "feed-line";
    ceilingKw: number;
    headroomPct: number;
  };
  warnings: Warning[];
}

/**
 * The next step from the last pull: the measured BSFC (at the crank) and the pull's fuel put
 * into the build's sizing (lib/calc sizeParsedFuelSystem) at the next boost or power target.
 * Power at a boost step scales with manifold absolute pressure, and the boost for a power target
 * the same way back. Duty, pump margin, feed-line drop and which part runs out first are the
 * sizing's own figures.
 * @example predictNextStep(input, { crankKw: 700, boostKpa: 150, bsfcGPerKwh: 505, ethanolPct: 85 }, { crankKw: 1000 }).dutyPct // ≈ 90 on 8 × 1500 cc/min
 */
export function predictNextStep(
  input: ParsedFuelSystemInput,
  last: { crankKw: number; boostKpa: number; bsfcGPerKwh: number; ethanolPct: number },
  step: StepTarget,
  dutyLimitPct: number = DEFAULT_TUNE_LIMITS.maxDutyPct,
): NextStep {
  requirePositive("crankKw", last.crankKw, 1e5, "Measured power");
  requireRange("bsfcGPerKwh", last.bsfcGPerKwh, 150, 1200, "Measured BSFC");
  requireRange("ethanolPct", last.ethanolPct, 0, 100, "Ethanol content");
  const amb = input.engine.ambientKpaAbs;
  const boostNow = Math.max(0, last.boostKpa);
  let crankKw: number;
  let boostKpa: number;
  if ("boostKpa" in step) {
    if (input.engine.aspiration === "na")
      throw new CalcInputError(
        "boostKpa",
        "A naturally aspirated engine has no boost step: give a power target",
      );
    boostKpa = requireRange("boostKpa", step.boostKpa, 0, 500, "Next boost");
    crankKw = powerAtBoostKw({
      crankKw: last.crankKw,
      fromBoostKpa: boostNow,
      toBoostKpa: boostKpa,
      ambientKpaAbs: amb,
    });
  } else {
    crankKw = requireRange("crankKw", step.crankKw, 1, 5000, "Next power target");
    boostKpa =
      input.engine.aspiration === "na"
        ? 0
        : Math.min(500, Math.max(0, ((amb + boostNow) * crankKw) / last.crankKw - amb));
  }
  const sized = sizeParsedFuelSystem({
    ...input,
    engine: { ...input.engine, maxBoostKpa: boostKpa },
    target: { ...input.target, powerKw: crankKw, measuredAt: "crank" },
    fuel: {
      ...input.fuel,
      ethanolMinVolPct: last.ethanolPct,
      ethanolMaxVolPct: last.ethanolPct,
      bsfcGPerKwh: last.bsfcGPerKwh,
      bsfcEthanolVolPct: last.ethanolPct,
    },
  });
  return {
    crankKw,
    boostKpa,
    bsfcGPerKwh: last.bsfcGPerKwh,
    ethanolPct: last.ethanolPct,
    dutyPct: sized.injector.dutyPct,
    dutyLimitPct,
    pumpMarginPct: sized.pump.marginPct,
    minPumpMarginPct: sized.limits.minPumpMarginPct,
    feedDropKpa: sized.lines.feed?.pressureDropKpa ?? null,
    maxLineDropKpa: sized.limits.maxLineDropKpa,
    runsOutFirst: {
      part: sized.powerCeiling.limitedBy,
      ceilingKw: sized.powerCeiling.kw,
      headroomPct: sized.powerCeiling.headroomPct,
    },
    warnings: sized.warnings,
  };
}
