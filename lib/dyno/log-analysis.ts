import "server-only";

import { getDatalog, rememberedMapping, verifiedBsfcPoints } from "@/db/queries/datalogs";
import type { DatalogRow } from "@/db/schema";
import {
  analyzePull,
  ASPIRATIONS,
  defaultBsfc,
  dutyAcrossRpm,
  fuelBlend,
  headerKey,
  lambdaTargetAt,
  parseDatalog,
  sampleDutyPct,
  samplesFromLog,
  shopBsfcTable,
  sizeParsedFuelSystem,
  suggestMapping,
  type Aspiration,
  type Datalog,
  type DatalogMapping,
  type ParsedFuelSystemInput,
  type PullContext,
  type TuneLimits,
} from "@/lib/calc";
import { NotFound } from "@/lib/domain/errors";
import { getObject } from "@/lib/storage";

/** The log's row and its file, parsed again from object storage. */
export async function loadDatalog(
  shopId: string,
  id: string,
): Promise<{ d: DatalogRow; log: Datalog }> {
  const d = await getDatalog(shopId, id);
  if (!d) throw new NotFound("That datalog");
  const log = parseDatalog((await getObject(d.objectKey)).toString("utf8"));
  return { d, log };
}

/** The log's facts with the mapping to start from: the shop's remembered one for this logger, else a guess. */
export async function datalogView(shopId: string, id: string) {
  const { d, log } = await loadDatalog(shopId, id);
  const remembered = await rememberedMapping(shopId, headerKey(log.headers));
  const { objectKey: _k, ...datalog } = d;
  return {
    datalog,
    headers: log.headers,
    units: log.units,
    mapping: (d.mapping ?? remembered?.mapping ?? suggestMapping(log)) as unknown,
    remembered: Boolean(remembered),
  };
}

/**
 * A pull measured against the build's sizing (`input`: the effective inputs the build was sized
 * with, lib/builds/stored-inputs#storedEffectiveInputs): the analysis (peak duty, lambda error, fuel
 * pressure, flow, BSFC) with the ethanol, target lambda and predicted peak duty it was judged on,
 * and a thinned series of measured against predicted duty for the chart.
 */
export function analyseLog(
  log: Datalog,
  mapping: DatalogMapping,
  input: ParsedFuelSystemInput,
  /** The session's lambda table (limits in force): the target follows boost. */
  lambdaTargets?: TuneLimits["lambdaTargets"],
) {
  const result = sizeParsedFuelSystem(input);
  const samples = samplesFromLog(log, mapping);
  const ethIdx = mapping.ethanol ? log.headers.indexOf(mapping.ethanol.column) : -1;
  const eth =
    ethIdx >= 0
      ? log.rows
          .map((r) => r[ethIdx])
          .filter((v): v is number => typeof v === "number" && v >= 0 && v <= 100)
      : [];
  const ethanolPct = eth.length
    ? eth.reduce((a, b) => a + b, 0) / eth.length
    : input.fuel.ethanolMaxVolPct;
  const peakBoost = samples.reduce(
    (m, s) =>
      typeof s.boostKpa === "number" && Number.isFinite(s.boostKpa) && s.boostKpa > m
        ? s.boostKpa
        : m,
    0,
  );
  const targetAt = lambdaTargets ? (b: number) => lambdaTargetAt(lambdaTargets, b) : undefined;
  const targetLambda = targetAt
    ? targetAt(peakBoost)
    : (input.fuel.targetLambda ??
      defaultBsfc({
        ethanolVolPct: ethanolPct,
        aspiration: input.engine.aspiration,
        defaults: input.fuel.bsfcDefaults,
      }).referenceLambda);
  const ctx: PullContext = {
    injectorCount: input.injectors.count,
    ratedFlowCcPerMin: input.injectors.ratedFlowCcPerMin,
    ratedPressureKpa: input.injectors.ratedPressureKpa,
    densityKgPerL: fuelBlend(ethanolPct, input.fuel.properties).densityKgPerL,
    targetLambda,
    lambdaTargetAt: targetAt,
    dutyDangerPct: result.limits.dutyDangerPct,
  };
  const analysis = analyzePull(samples, ctx);
  const predicted = dutyAcrossRpm(result, input.engine.idleRpm, input.engine.redlineRpm, 60);
  const predictAt = (rpm: number) => {
    const i = predicted.findIndex((p) => p.rpm >= rpm);
    if (i <= 0) return i === 0 ? predicted[0]!.dutyPctRich : null;
    const a = predicted[i - 1]!;
    const b = predicted[i]!;
    return a.dutyPctRich + ((b.dutyPctRich - a.dutyPctRich) * (rpm - a.rpm)) / (b.rpm - a.rpm || 1);
  };
  const step = Math.max(1, Math.ceil(samples.length / 600));
  const series = samples
    .filter((s, i) => i % step === 0 && s.rpm > 0)
    .map((s) => ({
      rpm: s.rpm,
      dutyMeasured: sampleDutyPct(s),
      dutyPredicted: predictAt(s.rpm),
      lambda: s.lambda ?? null,
      lambdaTarget: targetAt ? targetAt(s.boostKpa ?? 0) : targetLambda,
      fuelDiffKpa: s.fuelDiffKpa ?? null,
    }));
  return {
    analysis: {
      ...analysis,
      ethanolPct,
      targetLambda,
      predictedPeakDutyPct: result.injector.dutyPct,
    },
    series,
  };
}

/** The shop's measured BSFC by fuel class and aspiration, from its verified builds. */
export async function shopBsfc(shopId: string) {
  const points = (await verifiedBsfcPoints(shopId)).flatMap((p) =>
    p.gPerKwh !== null &&
    p.ethanolVolPct !== null &&
    (ASPIRATIONS as readonly string[]).includes(p.aspiration)
      ? [
          {
            buildId: p.buildId,
            gPerKwh: p.gPerKwh,
            ethanolVolPct: p.ethanolVolPct,
            aspiration: p.aspiration as Aspiration,
          },
        ]
      : [],
  );
  return shopBsfcTable(points);
}
