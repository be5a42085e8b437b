import "server-only";

import { createHash, randomUUID } from "node:crypto";

import type { z } from "zod";

import { buildStatusFacts, getBuild } from "@/db/queries/builds";
import {
  getDatalog,
  recordDatalog,
  saveAnalysis,
  saveBuildVerifiedByDatalog,
} from "@/db/queries/datalogs";
import { tuneLimitsOf } from "@/db/queries/tune";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { saved, type BuildResult } from "@/lib/builds/build-data";
import {
  readStoredInputs,
  sizeForSave,
  storedEffectiveInputs,
  storedSizingSettings,
} from "@/lib/builds/stored-inputs";
import { DatalogError, headerKey, mappingProblems, parseDatalog } from "@/lib/calc";
import { canVerifyWithLog, STATUS_LABELS } from "@/lib/domain/builds";
import { Conflict, Invalid, NotFound } from "@/lib/domain/errors";
import { shopToday } from "@/lib/shop/shop-zone";
import { putObject } from "@/lib/storage";
import { limitsInForce } from "@/lib/tune/tune-session";
import type {
  DatalogAnalysisSchema,
  DatalogRefSchema,
  DatalogUploadSchema,
} from "@/lib/validations/datalogs";

import { analyseLog, loadDatalog } from "./log-analysis";

/**
 * Stores a dyno log for a build: parsed first (a file that does not parse stores nothing), then
 * the file to object storage and its facts (name, size, SHA-256, headers, rows, uploader) beside
 * the build. `cutShort`: the file stopped mid-row, and that partial row was left out.
 */
export async function uploadDatalog(m: Member, input: z.output<typeof DatalogUploadSchema>) {
  authorize(m, "datalogs:upload");
  if (!(await getBuild(m.shopId, input.buildId))) throw new NotFound("That build");
  let log;
  try {
    log = parseDatalog(input.csv);
  } catch (e) {
    if (e instanceof DatalogError)
      throw new Invalid(e.message, [{ path: "(body)", message: e.message }], "bad_datalog");
    throw e;
  }
  const bytes = Buffer.from(input.csv, "utf8");
  const fileName =
    (input.fileName ?? "datalog.csv").replace(/[^\w .()-]+/g, "_").slice(0, 120) || "datalog.csv";
  const objectKey = `${m.shopId}/builds/${input.buildId}/datalogs/${randomUUID()}.csv`;
  await putObject(objectKey, bytes, "text/csv");
  const { objectKey: _k, ...datalog } = await recordDatalog({
    shopId: m.shopId,
    buildId: input.buildId,
    objectKey,
    fileName,
    sizeBytes: bytes.length,
    sha256: createHash("sha256").update(bytes).digest("hex"),
    headers: log.headers,
    rowCount: log.rows.length,
    uploadedBy: m.user.id,
  });
  return { datalog, cutShort: log.cutShort };
}

/**
 * Analyses the log with a column mapping against its build's injectors and targets, keeps the
 * analysis on the log and remembers the mapping for this logger's header set (one transaction).
 */
export async function analyseDatalog(m: Member, input: z.output<typeof DatalogAnalysisSchema>) {
  authorize(m, "datalogs:upload");
  const { d, log } = await loadDatalog(m.shopId, input.id);
  const problems = mappingProblems(input.mapping, log.headers);
  if (problems.length)
    throw new Invalid(
      "Some columns are not in this log",
      problems.map((p) => ({ path: `mapping.${p.path}`, message: p.message })),
    );
  const row = await getBuild(m.shopId, d.buildId);
  if (!row) throw new NotFound("That build");
  const { limits } = limitsInForce(await tuneLimitsOf(m.shopId, d.buildId));
  const out = analyseLog(
    log,
    input.mapping,
    storedEffectiveInputs(row.build),
    limits.lambdaTargets,
  );
  await saveAnalysis(
    m.shopId,
    m.user.id,
    input.id,
    headerKey(log.headers),
    input.mapping,
    out.analysis,
  );
  return out;
}

/**
 * "Mark verified": the build (fitted, or verified again) moves to verified as a new revision
 * naming the log, and the log is marked as the one that verified it — both or neither.
 */
export async function verifyBuildWithDatalog(
  m: Member,
  input: z.output<typeof DatalogRefSchema>,
): Promise<BuildResult> {
  authorize(m, "datalogs:upload");
  const d = await getDatalog(m.shopId, input.id);
  if (!d) throw new NotFound("That datalog");
  // Both refusals are about what is stored now (the log, the build's status): 409, as always.
  if (!d.analysis)
    throw new Conflict("Analyse the log before marking the build verified", "not_analysed");
  const row = await getBuild(m.shopId, d.buildId);
  if (!row) throw new NotFound("That build");
  const b = row.build;
  // The same rule as the status control's (lib/domain/builds.ts): this log is the verified log.
  if (
    !canVerifyWithLog(b.status, await buildStatusFacts(m.shopId, b.id, await shopToday(m.shopId)))
  )
    throw new Conflict(
      `Only a fitted build is verified; this one is ${STATUS_LABELS[b.status].toLowerCase()}`,
      "invalid_transition",
    );
  return saved(
    saveBuildVerifiedByDatalog(m.shopId, m.user.id, d.id, b.id, b.version, {
      status: "verified",
      note: `Verified with dyno log ${d.fileName}`,
      always: true,
      // Verification moves the status: the figures stay those the log was compared with.
      sized: sizeForSave(storedSizingSettings(b), readStoredInputs(b)),
    }),
  );
}
