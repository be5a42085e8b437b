import { and, desc, eq, isNotNull, sql } from "drizzle-orm";

import { db } from "@/db";
import { builds, datalogMappings, datalogs } from "@/db/schema";
import { NotFound } from "@/lib/domain/errors";

import { saveBuild, type BuildPatch } from "./builds";
import { differs, differsFromExcluded } from "./unchanged";

export async function recordDatalog(v: typeof datalogs.$inferInsert) {
  const [row] = await db.insert(datalogs).values(v).returning();
  return row!;
}

export async function listDatalogs(shopId: string, buildId: string) {
  return db
    .select()
    .from(datalogs)
    .where(and(eq(datalogs.shopId, shopId), eq(datalogs.buildId, buildId)))
    .orderBy(desc(datalogs.uploadedAt));
}

export async function getDatalog(shopId: string, id: string) {
  const [row] = await db
    .select()
    .from(datalogs)
    .where(and(eq(datalogs.shopId, shopId), eq(datalogs.id, id)))
    .limit(1);
  return row ?? null;
}

export async function rememberedMapping(shopId: string, key: string) {
  const [row] = await db
    .select()
    .from(datalogMappings)
    .where(and(eq(datalogMappings.shopId, shopId), eq(datalogMappings.headerKey, key)))
    .limit(1);
  return row ?? null;
}

/**
 * Keeps the mapping for this logger's header set and the analysis on the log, together; the same
 * mapping and analysis again write nothing.
 */
export async function saveAnalysis(
  shopId: string,
  userId: string,
  id: string,
  key: string,
  mapping: unknown,
  analysis: unknown,
) {
  await db.transaction(async (tx) => {
    await tx
      .insert(datalogMappings)
      .values({ shopId, headerKey: key, mapping, updatedBy: userId })
      .onConflictDoUpdate({
        target: [datalogMappings.shopId, datalogMappings.headerKey],
        set: { mapping, updatedBy: userId, updatedAt: new Date() },
        setWhere: differsFromExcluded([datalogMappings.mapping]),
      });
    await tx
      .update(datalogs)
      .set({ mapping, analysis })
      .where(
        and(
          eq(datalogs.shopId, shopId),
          eq(datalogs.id, id),
          differs(datalogs, { mapping, analysis }),
        ),
      );
  });
}

/**
 * "Mark verified" in one transaction: the build's save (a new revision, if still at
 * `expectedVersion`) and the log's verified mark. Either both are written or neither.
 */
export async function saveBuildVerifiedByDatalog(
  shopId: string,
  userId: string,
  datalogId: string,
  buildId: string,
  expectedVersion: number,
  patch: BuildPatch,
) {
  return db.transaction(async (tx) => {
    const build = await saveBuild(shopId, buildId, userId, expectedVersion, patch, tx);
    const [marked] = await tx
      .update(datalogs)
      .set({ verifiedAt: new Date(), verifiedBy: userId })
      .where(
        and(eq(datalogs.shopId, shopId), eq(datalogs.id, datalogId), eq(datalogs.buildId, buildId)),
      )
      .returning({ id: datalogs.id });
    if (!marked) throw new NotFound("That datalog");
    return build;
  });
}

/**
 * The measured figures of the shop's verified builds: per build, its newest verified log that
 * logged power, with the build's aspiration. A build moved back to draft stops counting.
 */
export async function verifiedBsfcPoints(shopId: string) {
  return db
    .selectDistinctOn([datalogs.buildId], {
      buildId: datalogs.buildId,
      gPerKwh: sql<number | null>`(${datalogs.analysis} -> 'measuredBsfc' ->> 'gPerKwh')::float8`,
      ethanolVolPct: sql<number | null>`(${datalogs.analysis} ->> 'ethanolPct')::float8`,
      aspiration: sql<string>`${builds.inputs} -> 'engine' ->> 'aspiration'`,
    })
    .from(datalogs)
    .innerJoin(builds, and(eq(builds.id, datalogs.buildId), eq(builds.shopId, datalogs.shopId)))
    .where(
      and(
        eq(datalogs.shopId, shopId),
        isNotNull(datalogs.verifiedAt),
        eq(builds.status, "verified"),
        sql`${datalogs.analysis} -> 'measuredBsfc' ->> 'gPerKwh' is not null`,
      ),
    )
    .orderBy(datalogs.buildId, desc(datalogs.verifiedAt));
}

/** The newest verified log of a build, with its analysis (for the spec sheet). */
export async function latestVerifiedDatalog(shopId: string, buildId: string) {
  const [row] = await db
    .select({
      id: datalogs.id,
      fileName: datalogs.fileName,
      analysis: datalogs.analysis,
      verifiedAt: datalogs.verifiedAt,
    })
    .from(datalogs)
    .where(
      and(
        eq(datalogs.shopId, shopId),
        eq(datalogs.buildId, buildId),
        isNotNull(datalogs.verifiedAt),
      ),
    )
    .orderBy(desc(datalogs.verifiedAt))
    .limit(1);
  return row ?? null;
}
