import "server-only";

import { getBuild } from "@/db/queries/builds";
import { listTunePulls, tuneLimitsOf } from "@/db/queries/tune";
import type { Build } from "@/db/schema";
import { storedEffectiveInputs } from "@/lib/builds/stored-inputs";
import {
  CalcInputError,
  checkLimits,
  DatalogError,
  DatalogMappingSchema,
  DEFAULT_TUNE_LIMITS,
  fuelBlend,
  mappingProblems,
  mergeTuneLimits,
  predictNextStep,
  preparePull,
  pressureReadingNotes,
  sameLimit,
  samplesFromLog,
  sizeParsedFuelSystem,
  suggestMapping,
  summarizePull,
  TUNE_LIMIT_KEYS,
  TuneLimitsOverrideSchema,
  TuneLimitsSchema,
  type Datalog,
  type DatalogMapping,
  type LimitCheck,
  type NextStep,
  type ParsedFuelSystemInput,
  type PowerMeasuredAt,
  type TuneLimitKey,
  type TuneLimits,
  type TuneLimitsOverride,
} from "@/lib/calc";
import { Invalid, NotFound } from "@/lib/domain/errors";

import { limitsInForce } from "./limits";
import { stepTarget, type StepAsked, type StepBasis } from "./step-target";

export { limitsInForce, shopLimitsAfter, type LimitsSource } from "./limits";

/**
 * What a tuner needs to place a log by hand, carried by the 422 `unplaced_log` (`current`): the
 * log's columns with their units row, the mapping tried (the one sent, remembered or guessed, as
 * far as it went) and whether it was the one remembered for this logger.
 */
export interface UnplacedLog {
  columns: string[];
  units: string[];
  mapping: Partial<DatalogMapping>;
  remembered: boolean;
}

/**
 * The mapping a new pull's log is read with: the one sent, else the shop's remembered mapping for
 * this logger's header set, else a guess from the headers. A log it cannot place is refused with
 * a message naming the column (or the channel no column was found for), and the log's columns so
 * the screen can offer them; nothing is stored.
 */
export function placeLog(log: Datalog, mapping: unknown, remembered: boolean): DatalogMapping {
  const tried = mapping ?? suggestMapping(log);
  const parsed = DatalogMappingSchema.safeParse(tried);
  const cols = log.headers.map((h) => `"${h}"`).join(", ");
  const current: UnplacedLog = {
    columns: log.headers,
    units: log.headers.map((_, i) => log.units[i] ?? ""),
    mapping: (tried && typeof tried === "object" ? tried : {}) as Partial<DatalogMapping>,
    remembered,
  };
  if (!parsed.success) {
    const first = parsed.error.issues[0]!;
    const channel = String(first.path[0] ?? "");
    const what =
      channel === "rpm"
        ? "engine speed"
        : channel === "duty"
          ? "injector duty or pulse width"
          : channel;
    throw new Invalid(
      `No column of this log reads as ${what} (its columns: ${cols}). Choose its column and try again`,
      [{ path: `mapping.${first.path.join(".")}`, message: first.message }],
      "unplaced_log",
      current,
    );
  }
  const problems = mappingProblems(parsed.data, log.headers);
  if (problems.length)
    throw new Invalid(
      `${remembered ? "The mapping remembered for this logger" : "The mapping"} names ${problems
        .map((p) => p.message.replace(/^The log has no column /, ""))
        .join(", ")}, which this log does not have (its columns: ${cols})`,
      problems.map((p) => ({ path: `mapping.${p.path}`, message: p.message })),
      "unplaced_log",
      current,
    );
  // A named column with no number in it cannot be placed either.
  const empty = mappedColumns(parsed.data).find((c) => {
    const i = log.headers.indexOf(c.column);
    return i >= 0 && !log.rows.some((r) => typeof r[i] === "number");
  });
  if (empty)
    throw new Invalid(
      `The column "${empty.column}" (mapped as ${empty.as}) holds no numbers`,
      [{ path: `mapping.${empty.path}`, message: `The column "${empty.column}" holds no numbers` }],
      "unplaced_log",
      current,
    );
  return parsed.data;
}

function mappedColumns(m: DatalogMapping): { column: string; as: string; path: string }[] {
  return [
    { column: m.rpm, as: "engine speed", path: "rpm" },
    { column: m.duty.column, as: "duty", path: "duty.column" },
    ...(m.mixture
      ? [{ column: m.mixture.column, as: m.mixture.kind, path: "mixture.column" }]
      : []),
    ...(m.boost ? [{ column: m.boost.column, as: "boost", path: "boost.column" }] : []),
    ...(m.power ? [{ column: m.power.column, as: "power", path: "power.column" }] : []),
  ];
}

/** A pull's figures from its log: points (power at the crank), notes, summary. */
export function measurePull(
  log: Datalog,
  mapping: DatalogMapping,
  input: ParsedFuelSystemInput,
  pull: { ethanolPct: number; powerMeasuredAt: PowerMeasuredAt },
) {
  const drivetrainLossPct = input.target.drivetrainLossPct ?? 15;
  try {
    const { points, notes } = preparePull(samplesFromLog(log, mapping), {
      measuredAt: pull.powerMeasuredAt,
      drivetrainLossPct,
    });
    if (!points.length)
      throw new Invalid(
        `The column "${mapping.rpm}" (engine speed) has no usable speed in any row`,
        [{ path: "mapping.rpm", message: "No row has an engine speed" }],
        "unplaced_log",
        {
          columns: log.headers,
          units: log.headers.map((_, i) => log.units[i] ?? ""),
          mapping,
          remembered: false,
        } satisfies UnplacedLog,
      );
    const summary = summarizePull(
      points,
      {
        injectorCount: input.injectors.count,
        ratedFlowCcPerMin: input.injectors.ratedFlowCcPerMin,
        ratedPressureKpa: input.injectors.ratedPressureKpa,
        densityKgPerL: fuelBlend(pull.ethanolPct, input.fuel.properties).densityKgPerL,
      },
      pull.powerMeasuredAt,
      drivetrainLossPct,
    );
    const logNotes = [...notes, ...pressureReadingNotes(mapping, points)];
    return { points, logNotes, summary, drivetrainLossPct };
  } catch (e) {
    if (e instanceof CalcInputError || e instanceof DatalogError)
      throw new Invalid(e.message, [{ path: "(body)", message: e.message }], "bad_datalog");
    throw e;
  }
}

export interface PullView {
  id: string;
  position: number;
  fileName: string;
  datalogId: string;
  ethanolPct: number;
  boostTargetKpa: number | null;
  notes: string;
  powerMeasuredAt: PowerMeasuredAt;
  drivetrainLossPct: number;
  excluded: boolean;
  verified: boolean;
  createdAt: Date;
  summary: ReturnType<typeof measurePull>["summary"];
  logNotes: ReturnType<typeof measurePull>["logNotes"];
  points: ReturnType<typeof measurePull>["points"];
  checks: LimitCheck[];
}

/**
 * The build's tune session as read: the limits in force and where they came from, every pull in
 * order with its checks, and the next step predicted from the last pull that is not excluded and
 * logged power (`step`: a boost or crank power; none: the build's target, else 20 kPa more boost).
 */
export async function tuneSession(shopId: string, buildId: string, step?: StepAsked) {
  const row = await getBuild(shopId, buildId);
  if (!row) throw new NotFound("That build");
  const stored = await tuneLimitsOf(shopId, buildId);
  const { limits, source, sources, base: shopLimits, baseSource } = limitsInForce(stored);
  const pulls: PullView[] = (await listTunePulls(shopId, buildId)).map(
    ({ pull: p, fileName, verifiedAt }) => ({
      id: p.id,
      position: p.position,
      fileName,
      datalogId: p.datalogId,
      ethanolPct: p.ethanolPct,
      boostTargetKpa: p.boostTargetKpa,
      notes: p.notes,
      powerMeasuredAt: p.powerMeasuredAt,
      drivetrainLossPct: p.drivetrainLossPct,
      excluded: p.excluded,
      verified: verifiedAt !== null,
      createdAt: p.createdAt,
      summary: p.summary,
      logNotes: p.logNotes,
      points: p.points,
      checks: checkLimits(p.points, limits),
    }),
  );
  return {
    buildId,
    limits,
    limitsSource: source,
    /** Where each field of `limits` comes from: this build, the shop's defaults or the library's. */
    limitSources: sources,
    /** What the build's limits start from (the shop's defaults, else the library's). */
    shopLimits,
    shopLimitsSource: baseSource,
    pulls,
    next: nextStep(row.build, pulls, limits, step),
  };
}

function nextStep(
  build: Build,
  pulls: PullView[],
  limits: TuneLimits,
  step: StepAsked = {},
): { from: string; step: NextStep; basis: StepBasis } | { from: null; reason: string } {
  const last = [...pulls]
    .reverse()
    .find((p) => !p.excluded && p.summary.measuredBsfc && p.summary.peakPower);
  if (!last)
    return {
      from: null,
      reason: pulls.length
        ? "No pull in the session logged power with duty: the next step needs a measured BSFC."
        : "Add a pull to predict the next step.",
    };
  const input = storedEffectiveInputs(build);
  const bsfc = last.summary.measuredBsfc!;
  const boostNow = Math.max(0, last.summary.peakBoostKpa ?? last.boostTargetKpa ?? 0);
  const wantedKw =
    input.target.measuredAt === "crank"
      ? input.target.powerKw
      : input.target.powerKw / (1 - (input.target.drivetrainLossPct ?? 15) / 100);
  const { target, basis } = stepTarget(
    { aspiration: input.engine.aspiration, maxBoostKpa: input.engine.maxBoostKpa, wantedKw },
    { crankKw: bsfc.powerKw, boostKpa: boostNow },
    step,
  );
  try {
    return {
      from: last.id,
      basis,
      step: predictNextStep(
        input,
        {
          crankKw: bsfc.powerKw,
          boostKpa: boostNow,
          bsfcGPerKwh: bsfc.gPerKwh,
          ethanolPct: last.ethanolPct,
        },
        target,
        limits.maxDutyPct,
      ),
    };
  } catch (e) {
    if (e instanceof CalcInputError) return { from: null, reason: e.message };
    throw e;
  }
}

/** What the spec sheet prints of the session: the best pull per fuel, and what stopped the climb. */
export interface SheetSession {
  best: {
    position: number;
    ethanolPct: number;
    crankKw: number;
    rpm: number;
    boostKpa: number | null;
    measured: { bsfcGPerKwh: number | null; dutyPct: number | null };
    predicted: { bsfcGPerKwh: number; dutyPct: number };
  }[];
  /** The last pull's limits crossed (else those it came near), with their reasons. */
  stoppedBy: { position: number; checks: LimitCheck[] } | null;
}

/**
 * The session for the spec sheet: per fuel (ethanol content), the pull with the most crank power
 * and the sizing's prediction at that power, boost and fuel; and the limits the last pull met.
 */
export async function sheetSession(
  shopId: string,
  buildId: string,
  input: ParsedFuelSystemInput,
): Promise<SheetSession | null> {
  const pulls = (await listTunePulls(shopId, buildId))
    .map((r) => r.pull)
    .filter((p) => !p.excluded);
  if (!pulls.length) return null;
  const { limits } = limitsInForce(await tuneLimitsOf(shopId, buildId));
  const byFuel = new Map<number, (typeof pulls)[number]>();
  for (const p of pulls) {
    const best = byFuel.get(p.ethanolPct);
    if (
      p.summary.peakPower &&
      (!best || p.summary.peakPower.crankKw > (best.summary.peakPower?.crankKw ?? 0))
    )
      byFuel.set(p.ethanolPct, p);
  }
  const best = [...byFuel.values()]
    .sort((a, b) => a.ethanolPct - b.ethanolPct)
    .map((p) => {
      const power = p.summary.peakPower!;
      const boost = p.summary.peakBoostKpa ?? p.boostTargetKpa;
      const sized = sizeParsedFuelSystem({
        ...input,
        engine: {
          ...input.engine,
          maxBoostKpa:
            input.engine.aspiration === "na" ? 0 : Math.min(500, Math.max(0, boost ?? 0)),
        },
        target: { ...input.target, powerKw: Math.max(1, power.crankKw), measuredAt: "crank" },
        fuel: { ...input.fuel, ethanolMinVolPct: p.ethanolPct, ethanolMaxVolPct: p.ethanolPct },
      });
      return {
        position: p.position,
        ethanolPct: p.ethanolPct,
        crankKw: power.crankKw,
        rpm: power.rpm,
        boostKpa: boost,
        measured: {
          bsfcGPerKwh: p.summary.measuredBsfc?.gPerKwh ?? null,
          dutyPct: p.summary.peakDuty?.pct ?? null,
        },
        predicted: { bsfcGPerKwh: sized.blend.rich.bsfcGPerKwh, dutyPct: sized.injector.dutyPct },
      };
    });
  const last = pulls[pulls.length - 1]!;
  const checks = checkLimits(last.points, limits);
  const over = checks.filter((c) => c.status === "over");
  const near = checks.filter((c) => c.status === "near");
  return {
    best,
    stoppedBy:
      over.length || near.length
        ? { position: last.position, checks: over.length ? over : near }
        : null,
  };
}
