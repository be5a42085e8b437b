import { and, desc, eq } from "drizzle-orm";
import { db } from "@/db";
import { datalogMappings, datalogs } from "@/db/schema";

export async function recordDatalog(v: typeof datalogs.$inferInsert) {
  const [row] = await db.insert(datalogs).values(v).returning();
  return row!;
}

export async function listDatalogs(shopId: string, buildId: string) {
  return db.select().from(datalogs).where(and(eq(datalogs.shopId, shopId), eq(datalogs.buildId, buildId))).orderBy(desc(datalogs.uploadedAt));
}

export async function getDatalog(shopId: string, id: string) {
  const [row] = await db.select().from(datalogs).where(and(eq(datalogs.shopId, shopId), eq(datalogs.id, id))).limit(1);
  return row ?? null;
}

export async function rememberedMapping(shopId: string, key: string) {
  const [row] = await db.select().from(datalogMappings).where(and(eq(datalogMappings.shopId, shopId), eq(datalogMappings.headerKey, key))).limit(1);
  return row ?? null;
}

/** Keeps the mapping for this logger's header set and the analysis on the log, together. */
export async function saveAnalysis(shopId: string, userId: string, id: string, key: string, mapping: unknown, analysis: unknown) {
  await db.transaction(async (tx) => {
    await tx.insert(datalogMappings).values({ shopId, headerKey: key, mapping, updatedBy: userId }).onConflictDoUpdate({ target: [datalogMappings.shopId, datalogMappings.headerKey], set: { mapping, updatedBy: userId, updatedAt: new Date() } });
    await tx.update(datalogs).set({ mapping, analysis }).where(and(eq(datalogs.shopId, shopId), eq(datalogs.id, id)));
  });
}

export async function markDatalogVerified(shopId: string, userId: string, id: string) {
  await db.update(datalogs).set({ verifiedAt: new Date(), verifiedBy: userId }).where(and(eq(datalogs.shopId, shopId), eq(datalogs.id, id)));
}
