import { and, desc, eq, ilike, lt, or, sql } from "drizzle-orm";
import { db } from "@/db";
import { buildRevisions, builds, customers, type Build, type BuildStatus } from "@/db/schema";
import type { FuelSystemResult } from "@/lib/calc";
import { HttpError } from "@/lib/auth/errors";

export class ConflictError extends HttpError {
  constructor(readonly current: Build) {
    super(409, "conflict", `Someone saved this build meanwhile (now version ${current.version}); nothing was overwritten`);
  }
}

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/** Cursor = "<updatedAt ISO>|<id>" of the last row seen. */
export async function listBuilds(shopId: string, opts: { q?: string; status?: BuildStatus; cursor?: string; limit: number; customerId?: string }) {
  const conds = [eq(builds.shopId, shopId)];
  if (opts.status) conds.push(eq(builds.status, opts.status));
  if (opts.customerId) conds.push(eq(builds.customerId, opts.customerId));
  if (opts.q) {
    const like = `%${escapeLike(opts.q)}%`;
    conds.push(or(ilike(builds.title, like), ilike(builds.vehicle, like), ilike(customers.name, like))!);
  }
  if (opts.cursor) {
    const [at, id] = opts.cursor.split("|");
    const when = new Date(at ?? "");
    if (id && !Number.isNaN(when.getTime())) conds.push(or(lt(builds.updatedAt, when), and(eq(builds.updatedAt, when), lt(builds.id, id)))!);
  }
  const rows = await db
    .select({
      id: builds.id,
      title: builds.title,
      vehicle: builds.vehicle,
      status: builds.status,
      version: builds.version,
      updatedAt: builds.updatedAt,
      customerId: builds.customerId,
      customerName: customers.name,
      dutyPct: sql<number | null>`(${builds.result}->'injector'->>'dutyPct')::float8`,
      marginPct: sql<number | null>`(${builds.result}->'pump'->>'marginPct')::float8`,
    })
    .from(builds)
    .innerJoin(customers, eq(customers.id, builds.customerId))
    .where(and(...conds))
    .orderBy(desc(builds.updatedAt), desc(builds.id))
    .limit(opts.limit + 1);
  const more = rows.length > opts.limit;
  const page = more ? rows.slice(0, opts.limit) : rows;
  const last = page[page.length - 1];
  return { builds: page, nextCursor: more && last ? `${last.updatedAt.toISOString()}|${last.id}` : null };
}

export async function getBuild(shopId: string, id: string) {
  const [row] = await db
    .select({ build: builds, customerName: customers.name, customerUserId: customers.userId })
    .from(builds)
    .innerJoin(customers, eq(customers.id, builds.customerId))
    .where(and(eq(builds.shopId, shopId), eq(builds.id, id)))
    .limit(1);
  return row ?? null;
}

/** Builds of the customer signed in to the portal (matched by their user id). */
export async function listBuildsOfPortalUser(shopId: string, userId: string) {
  return db
    .select({ id: builds.id, title: builds.title, vehicle: builds.vehicle, status: builds.status, updatedAt: builds.updatedAt })
    .from(builds)
    .innerJoin(customers, eq(customers.id, builds.customerId))
    .where(and(eq(builds.shopId, shopId), eq(customers.userId, userId)))
    .orderBy(desc(builds.updatedAt));
}

export async function createBuild(shopId: string, userId: string, v: { customerId: string; title: string; vehicle?: string; inputs: unknown; result: FuelSystemResult | null; calcVersion: string }) {
  return db.transaction(async (tx) => {
    const [c] = await tx.select({ id: customers.id }).from(customers).where(and(eq(customers.shopId, shopId), eq(customers.id, v.customerId))).limit(1);
    if (!c) throw new HttpError(422, "invalid_input", "That customer is not in this shop");
    const [b] = await tx
      .insert(builds)
      .values({ shopId, customerId: v.customerId, title: v.title, vehicle: v.vehicle || null, inputs: v.inputs, result: v.result, calcVersion: v.calcVersion, createdBy: userId, updatedBy: userId })
      .returning();
    await tx.insert(buildRevisions).values({ shopId, buildId: b!.id, version: 1, status: b!.status, inputs: v.inputs, result: v.result, calcVersion: v.calcVersion, authorId: userId, note: "Created" });
    return b!;
  });
}

/**
 * Saves a new revision if the build is still at `expectedVersion`; otherwise throws
 * ConflictError carrying the current build. The build and its revision are written together.
 */
export async function saveBuild(
  shopId: string,
  id: string,
  userId: string,
  expectedVersion: number,
  v: { title?: string; vehicle?: string; status?: BuildStatus; note?: string; inputs: unknown; result: FuelSystemResult; calcVersion: string },
) {
  return db.transaction(async (tx) => {
    const [b] = await tx
      .update(builds)
      .set({
        ...(v.title !== undefined ? { title: v.title } : {}),
        ...(v.vehicle !== undefined ? { vehicle: v.vehicle || null } : {}),
        ...(v.status ? { status: v.status } : {}),
        inputs: v.inputs,
        result: v.result,
        calcVersion: v.calcVersion,
        version: sql`${builds.version} + 1`,
        updatedBy: userId,
        updatedAt: new Date(),
      })
      .where(and(eq(builds.shopId, shopId), eq(builds.id, id), eq(builds.version, expectedVersion)))
      .returning();
    if (!b) {
      const [current] = await tx.select().from(builds).where(and(eq(builds.shopId, shopId), eq(builds.id, id))).limit(1);
      if (!current) throw new HttpError(404, "not_found", "That build was not found");
      throw new ConflictError(current);
    }
    await tx.insert(buildRevisions).values({ shopId, buildId: id, version: b.version, status: b.status, inputs: v.inputs, result: v.result, calcVersion: v.calcVersion, authorId: userId, note: v.note || null });
    return b;
  });
}

export async function listRevisions(shopId: string, buildId: string) {
  return db
    .select({ id: buildRevisions.id, version: buildRevisions.version, status: buildRevisions.status, note: buildRevisions.note, createdAt: buildRevisions.createdAt, authorId: buildRevisions.authorId })
    .from(buildRevisions)
    .where(and(eq(buildRevisions.shopId, shopId), eq(buildRevisions.buildId, buildId)))
    .orderBy(desc(buildRevisions.version));
}

export async function getRevision(shopId: string, buildId: string, version: number) {
  const [row] = await db
    .select()
    .from(buildRevisions)
    .where(and(eq(buildRevisions.shopId, shopId), eq(buildRevisions.buildId, buildId), eq(buildRevisions.version, version)))
    .limit(1);
  return row ?? null;
}
