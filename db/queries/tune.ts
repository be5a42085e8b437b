import { and, asc, eq, sql } from "drizzle-orm";

import { db } from "@/db";
import { datalogMappings, datalogs, shopSettings, tunePulls, tuneSessions } from "@/db/schema";
import type { TuneLimits, TuneLimitsOverride } from "@/lib/calc";
import { Conflict, NotFound } from "@/lib/domain/errors";

import { differs, differsFromExcluded } from "./unchanged";

/** The build's pulls in order, with their log's name (excluded ones too). */
export async function listTunePulls(shopId: string, buildId: string) {
  return db
    .select({ pull: tunePulls, fileName: datalogs.fileName, verifiedAt: datalogs.verifiedAt })
    .from(tunePulls)
    .innerJoin(datalogs, eq(datalogs.id, tunePulls.datalogId))
    .where(and(eq(tunePulls.shopId, shopId), eq(tunePulls.buildId, buildId)))
    .orderBy(asc(tunePulls.position), asc(tunePulls.createdAt));
}

export async function getTunePull(shopId: string, id: string) {
  const [row] = await db
    .select({ pull: tunePulls, objectKey: datalogs.objectKey, verifiedAt: datalogs.verifiedAt })
    .from(tunePulls)
    .innerJoin(datalogs, eq(datalogs.id, tunePulls.datalogId))
    .where(and(eq(tunePulls.shopId, shopId), eq(tunePulls.id, id)))
    .limit(1);
  return row ?? null;
}

/**
 * A pull and its log in one transaction: the log's facts, the pull next in order, and the
 * logger's mapping remembered for the shop. Either all of it is stored or none.
 */
export async function insertTunePull(
  log: typeof datalogs.$inferInsert,
  pull: Omit<typeof tunePulls.$inferInsert, "datalogId" | "position" | "shopId" | "buildId">,
  remember: { headerKey: string; mapping: unknown },
) {
  return db.transaction(async (tx) => {
    const [d] = await tx.insert(datalogs).values(log).returning();
    // One writer at a time per build picks the next position.
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`tune:${log.buildId}`}))`);
    const [{ next } = { next: 1 }] = await tx
      .select({ next: sql<number>`coalesce(max(${tunePulls.position}), 0) + 1` })
      .from(tunePulls)
      .where(and(eq(tunePulls.shopId, log.shopId), eq(tunePulls.buildId, log.buildId)));
    const [p] = await tx
      .insert(tunePulls)
      .values({
        ...pull,
        shopId: log.shopId,
        buildId: log.buildId,
        datalogId: d!.id,
        position: Number(next),
      })
      .returning();
    await tx
      .insert(datalogMappings)
      .values({
        shopId: log.shopId,
        headerKey: remember.headerKey,
        mapping: remember.mapping,
        updatedBy: log.uploadedBy,
      })
      .onConflictDoUpdate({
        target: [datalogMappings.shopId, datalogMappings.headerKey],
        set: { mapping: remember.mapping, updatedBy: log.uploadedBy, updatedAt: new Date() },
        setWhere: differsFromExcluded([datalogMappings.mapping]),
      });
    await tx.update(datalogs).set({ mapping: remember.mapping }).where(eq(datalogs.id, d!.id));
    return { pull: p!, datalog: d! };
  });
}

/** Writes only the keys given, and nothing when they equal what is stored. */
export async function updateTunePull(
  shopId: string,
  id: string,
  values: Partial<
    Pick<
      typeof tunePulls.$inferInsert,
      | "ethanolPct"
      | "boostTargetKpa"
      | "powerMeasuredAt"
      | "notes"
      | "excluded"
      | "points"
      | "summary"
      | "logNotes"
      | "drivetrainLossPct"
    >
  >,
) {
  if (Object.keys(values).length)
    await db
      .update(tunePulls)
      .set({ ...values, updatedAt: new Date() })
      .where(and(eq(tunePulls.shopId, shopId), eq(tunePulls.id, id), differs(tunePulls, values)));
  const row = await getTunePull(shopId, id);
  if (!row) throw new NotFound("That pull");
  return row.pull;
}

/** Deletes a pull with its log (the log goes, the pull with it); a log that verified its build stays. */
export async function deleteTunePull(shopId: string, id: string) {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .select({ datalogId: tunePulls.datalogId, verifiedAt: datalogs.verifiedAt })
      .from(tunePulls)
      .innerJoin(datalogs, eq(datalogs.id, tunePulls.datalogId))
      .where(and(eq(tunePulls.shopId, shopId), eq(tunePulls.id, id)))
      .for("update")
      .limit(1);
    if (!row) throw new NotFound("That pull");
    if (row.verifiedAt)
      throw new Conflict(
        "This pull's log verified the build: exclude the pull instead of deleting it",
        "log_verified",
      );
    const [gone] = await tx
      .delete(datalogs)
      .where(and(eq(datalogs.shopId, shopId), eq(datalogs.id, row.datalogId)))
      .returning({ objectKey: datalogs.objectKey });
    return gone!;
  });
}

/** The shop's default limits as stored (null: the library's). */
export async function shopTuneLimits(shopId: string) {
  const [shop] = await db
    .select({ limits: shopSettings.tuneLimits })
    .from(shopSettings)
    .where(eq(shopSettings.shopId, shopId))
    .limit(1);
  return shop?.limits ?? null;
}

/** The build's own limits (null: none, the shop's apply) and the shop's defaults (null: the library's). */
export async function tuneLimitsOf(shopId: string, buildId: string) {
  const [build] = await db
    .select({ limits: tuneSessions.limits })
    .from(tuneSessions)
    .where(and(eq(tuneSessions.shopId, shopId), eq(tuneSessions.buildId, buildId)))
    .limit(1);
  return { build: build?.limits ?? null, shop: await shopTuneLimits(shopId) };
}

/** The build's own limit fields (null: back to the shop's); the same again writes nothing. */
export async function saveBuildTuneLimits(
  shopId: string,
  buildId: string,
  userId: string,
  limits: TuneLimitsOverride | null,
) {
  await db
    .insert(tuneSessions)
    .values({ shopId, buildId, limits, updatedBy: userId })
    .onConflictDoUpdate({
      target: [tuneSessions.shopId, tuneSessions.buildId],
      set: { limits, updatedBy: userId, updatedAt: new Date() },
      setWhere: differsFromExcluded([tuneSessions.limits]),
    });
}

/** The shop's default limits; the same again writes nothing. */
export async function saveShopTuneLimits(shopId: string, limits: TuneLimits | null) {
  const [row] = await db
    .select({ shopId: shopSettings.shopId })
    .from(shopSettings)
    .where(eq(shopSettings.shopId, shopId))
    .limit(1);
  if (!row) throw new NotFound("The shop");
  await db
    .update(shopSettings)
    .set({ tuneLimits: limits, updatedAt: new Date() })
    .where(and(eq(shopSettings.shopId, shopId), differs(shopSettings, { tuneLimits: limits })));
}
