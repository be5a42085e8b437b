import "server-only";

import { createHash, randomUUID } from "node:crypto";

import type { z } from "zod";

import { getBuild, createBuild as insertBuild } from "@/db/queries/builds";
import { rememberedMapping } from "@/db/queries/datalogs";
import {
  deleteTunePull as deletePullRow,
  getTunePull,
  insertTunePull,
  saveBuildTuneLimits,
  saveShopTuneLimits,
  shopTuneLimits,
  tuneLimitsOf,
  updateTunePull as updatePullRow,
} from "@/db/queries/tune";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { buildData, type BuildResult } from "@/lib/builds/build-data";
import { readStoredInputs, sizeForSave, storedEffectiveInputs } from "@/lib/builds/stored-inputs";
import { DatalogError, headerKey, nextOverride, parseDatalog } from "@/lib/calc";
import { Invalid, NotFound } from "@/lib/domain/errors";
import { shopSizingSettings } from "@/lib/sizing/shop-sizing";
import { deleteObject, getObject, putObject } from "@/lib/storage";
import type {
  NextPowerStepSchema,
  TuneLimitsSaveSchema,
  TunePullRefSchema,
  TunePullUpdateSchema,
  TunePullUploadSchema,
} from "@/lib/validations/tune";

import { limitsInForce, measurePull, placeLog, shopLimitsAfter } from "./tune-session";

function parse(csv: string) {
  try {
    return parseDatalog(csv);
  } catch (e) {
    if (e instanceof DatalogError)
      throw new Invalid(e.message, [{ path: "(body)", message: e.message }], "bad_datalog");
    throw e;
  }
}

/**
 * Adds a pull to the build's session: the log parsed, placed by the mapping (sent, remembered for
 * the logger, or guessed) and measured before anything is stored; then the file, and in one
 * transaction the log, the pull (last in order) and the remembered mapping. A log the mapping
 * cannot place is a 422 naming the column, and nothing is stored.
 */
export async function addTunePull(m: Member, input: z.output<typeof TunePullUploadSchema>) {
  authorize(m, "datalogs:upload");
  const row = await getBuild(m.shopId, input.buildId);
  if (!row) throw new NotFound("That build");
  const log = parse(input.csv);
  const key = headerKey(log.headers);
  const remembered = input.mapping ? null : await rememberedMapping(m.shopId, key);
  const mapping = placeLog(log, input.mapping ?? remembered?.mapping, Boolean(remembered));
  const measured = measurePull(log, mapping, storedEffectiveInputs(row.build), input);
  const bytes = Buffer.from(input.csv, "utf8");
  const fileName =
    (input.fileName ?? "pull.csv").replace(/[^\w .()-]+/g, "_").slice(0, 120) || "pull.csv";
  const objectKey = `${m.shopId}/builds/${input.buildId}/datalogs/${randomUUID()}.csv`;
  await putObject(objectKey, bytes, "text/csv");
  const { pull, datalog } = await insertTunePull(
    {
      shopId: m.shopId,
      buildId: input.buildId,
      objectKey,
      fileName,
      sizeBytes: bytes.length,
      sha256: createHash("sha256").update(bytes).digest("hex"),
      headers: log.headers,
      rowCount: log.rows.length,
      uploadedBy: m.user.id,
    },
    {
      ethanolPct: input.ethanolPct,
      boostTargetKpa: input.boostTargetKpa ?? null,
      notes: input.notes ?? "",
      powerMeasuredAt: input.powerMeasuredAt,
      mapping,
      ...measured,
      createdBy: m.user.id,
    },
    { headerKey: key, mapping },
  );
  return {
    pull: { ...pull, fileName: datalog.fileName },
    cutShort: log.cutShort,
  };
}

/**
 * Changes a pull's fuel, boost target, notes, where power was measured, or excludes it. A new
 * fuel or power site measures the log again (BSFC depends on both); the same values write nothing.
 */
export async function updateTunePull(m: Member, input: z.output<typeof TunePullUpdateSchema>) {
  authorize(m, "datalogs:upload");
  const found = await getTunePull(m.shopId, input.id);
  if (!found) throw new NotFound("That pull");
  const { id: _id, ...values } = input;
  const p = found.pull;
  const refigure =
    (values.ethanolPct !== undefined && values.ethanolPct !== p.ethanolPct) ||
    (values.powerMeasuredAt !== undefined && values.powerMeasuredAt !== p.powerMeasuredAt);
  let measured = {};
  if (refigure) {
    const row = await getBuild(m.shopId, p.buildId);
    if (!row) throw new NotFound("That build");
    const log = parse((await getObject(found.objectKey)).toString("utf8"));
    measured = measurePull(log, p.mapping, storedEffectiveInputs(row.build), {
      ethanolPct: values.ethanolPct ?? p.ethanolPct,
      powerMeasuredAt: values.powerMeasuredAt ?? p.powerMeasuredAt,
    });
  }
  const pull = await updatePullRow(m.shopId, input.id, { ...values, ...measured });
  return { pull };
}

/** Deletes a pull and its log (the file too); a log that verified the build is kept (409). */
export async function deleteTunePull(m: Member, input: z.output<typeof TunePullRefSchema>) {
  authorize(m, "datalogs:upload");
  const gone = await deletePullRow(m.shopId, input.id);
  // The rows are gone; a file left behind by a storage hiccup is only bytes nobody points at.
  await deleteObject(gone.objectKey).catch(() => undefined);
  return { deleted: input.id };
}

/**
 * The build's own limits: the fields sent, kept only where they stand apart from the shop's
 * (a field sent as it is in force keeps its source; null: every field back to the shop's). With
 * `scope: "shop"` the shop's defaults (the owner's, like every setting): the fields sent over
 * the shop's, null back to the library's. Nothing changed writes nothing.
 */
export async function saveTuneLimits(m: Member, input: z.output<typeof TuneLimitsSaveSchema>) {
  authorize(m, input.scope === "shop" ? "settings:update" : "datalogs:upload");
  if (input.scope === "shop") {
    const next = shopLimitsAfter(await shopTuneLimits(m.shopId), input.limits);
    if (next.write) await saveShopTuneLimits(m.shopId, next.limits);
    const after = limitsInForce({ build: null, shop: next.limits });
    return { scope: input.scope, limits: after.limits, sources: after.sources };
  }
  const buildId = input.buildId;
  if (!buildId) throw Invalid.field("buildId", "Name the build whose limits these are");
  if (!(await getBuild(m.shopId, buildId))) throw new NotFound("That build");
  const stored = await tuneLimitsOf(m.shopId, buildId);
  const now = limitsInForce(stored);
  const own = input.limits === null ? null : nextOverride(now.base, now.own, input.limits);
  // No row and nothing of its own: nothing to write (an unchanged save stays unchanged).
  if (own !== null || stored.build !== null)
    await saveBuildTuneLimits(m.shopId, buildId, m.user.id, own);
  const after = limitsInForce({ build: own, shop: stored.shop });
  return { scope: input.scope, limits: after.limits, sources: after.sources };
}

/**
 * "Copy as next power step": a new build for the same car from this one's inputs with the new
 * power target (measured where this build's target is), linked back to this build.
 */
export async function copyAsNextPowerStep(
  m: Member,
  input: z.output<typeof NextPowerStepSchema>,
): Promise<BuildResult> {
  authorize(m, "builds:write");
  const row = await getBuild(m.shopId, input.buildId);
  if (!row) throw new NotFound("That build");
  if (input.pullId) {
    const pull = await getTunePull(m.shopId, input.pullId);
    if (!pull || pull.pull.buildId !== input.buildId) throw new NotFound("That pull");
  }
  const inputs = readStoredInputs(row.build);
  const b = await insertBuild(m.shopId, m.user.id, {
    customerId: row.build.customerId,
    title: `${row.build.title} — next power step`.slice(0, 120),
    vehicle: row.build.vehicle ?? undefined,
    vehicleId: row.build.vehicleId ?? undefined,
    note: `Next power step from "${row.build.title}"`,
    previousStepId: row.build.id,
    sized: sizeForSave(await shopSizingSettings(m.shopId), {
      ...inputs,
      target: { ...inputs.target, powerKw: input.powerKw },
    }),
  });
  return { build: buildData(b) };
}
