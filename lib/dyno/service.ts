import "server-only";

import { z, ZodError } from "zod";

import { getBuild, saveBuild } from "@/db/queries/builds";
import {
  getDatalog,
  markDatalogVerified,
  rememberedMapping,
  saveAnalysis,
  verifiedBsfcPoints,
} from "@/db/queries/datalogs";
import {
  analyzePull,
  ASPIRATIONS,
  CALC_VERSION,
  DatalogMappingSchema,
  defaultBsfc,
  dutyAcrossRpm,
  fuelBlend,
  FuelSystemInputSchema,
  headerKey,
  mappingProblems,
  parseDatalog,
  sampleDutyPct,
  samplesFromLog,
  shopBsfcTable,
  sizeParsedFuelSystem,
  suggestMapping,
  type Aspiration,
  type PullContext,
} from "@/lib/calc";
import { STATUS_LABELS, STATUS_NEXT } from "@/lib/domain/builds";
import { NotFound } from "@/lib/domain/errors";
import { HttpError } from "@/lib/http/http-error";
import { getObject } from "@/lib/storage";

async function load(shopId: string, id: string) {
  const d = await getDatalog(shopId, id);
  if (!d) throw new NotFound("That datalog");
  const log = parseDatalog((await getObject(d.objectKey)).toString("utf8"));
  return { d, log };
}

/** The log's facts with the mapping to start from: the shop's remembered one for this logger, else a guess. */
export async function datalogView(shopId: string, id: string) {
  const { d, log } = await load(shopId, id);
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

/** Analyses the log with a mapping against its build's injectors and targets; remembers the mapping. */
export async function analyseDatalog(shopId: string, userId: string, id: string, body: unknown) {
  const mapping = z
    .object({ mapping: DatalogMappingSchema }, { error: "Send { mapping }" })
    .parse(body).mapping;
  const { d, log } = await load(shopId, id);
  const problems = mappingProblems(mapping, log.headers);
  if (problems.length)
    throw new ZodError(
      problems.map((p) => ({
        code: "custom" as const,
        path: ["mapping", ...p.path.split(".")],
        message: p.message,
        input: undefined,
      })),
    );
  const row = await getBuild(shopId, d.buildId);
  if (!row) throw new NotFound("That build");
  const input = FuelSystemInputSchema.parse(row.build.inputs);
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
  const targetLambda =
    input.fuel.targetLambda ??
    defaultBsfc({
      ethanolVolPct: ethanolPct,
      aspiration: input.engine.aspiration,
      defaults: input.fuel.bsfcDefaults,
    }).referenceLambda;
  const ctx: PullContext = {
    injectorCount: input.injectors.count,
    ratedFlowCcPerMin: input.injectors.ratedFlowCcPerMin,
    ratedPressureKpa: input.injectors.ratedPressureKpa,
    densityKgPerL: fuelBlend(ethanolPct).densityKgPerL,
    targetLambda,
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
      lambdaTarget: targetLambda,
      fuelDiffKpa: s.fuelDiffKpa ?? null,
    }));
  const stored = {
    ...analysis,
    ethanolPct,
    targetLambda,
    predictedPeakDutyPct: result.blend.rich.dutyPct,
  };
  await saveAnalysis(shopId, userId, id, headerKey(log.headers), mapping, stored);
  return { analysis: stored, series };
}

/** "Mark verified": the build moves to verified, with this analysed log attached, as a new revision. */
export async function verifyWithDatalog(shopId: string, userId: string, id: string) {
  const d = await getDatalog(shopId, id);
  if (!d) throw new NotFound("That datalog");
  if (!d.analysis)
    throw new HttpError(409, "not_analysed", "Analyse the log before marking the build verified");
  const row = await getBuild(shopId, d.buildId);
  if (!row) throw new NotFound("That build");
  const b = row.build;
  if (b.status !== "verified" && !STATUS_NEXT[b.status].includes("verified"))
    throw new HttpError(
      409,
      "invalid_transition",
      `Only a fitted build is verified; this one is ${STATUS_LABELS[b.status].toLowerCase()}`,
    );
  const input = FuelSystemInputSchema.parse(b.inputs);
  const saved = await saveBuild(shopId, b.id, userId, b.version, {
    status: "verified",
    note: `Verified with dyno log ${d.fileName}`,
    inputs: b.inputs,
    result: sizeParsedFuelSystem(input),
    calcVersion: CALC_VERSION,
  });
  await markDatalogVerified(shopId, userId, id);
  return saved;
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
