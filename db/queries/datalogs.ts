import { and, desc, eq } from "drizzle-orm";
import { db } from "@/db";
import { datalogs } from "@/db/schema";

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
