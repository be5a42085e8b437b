import { and, asc, desc, eq, gt, inArray, like, lt, or, sql } from "drizzle-orm";

import { db } from "@/db";
import {
  buildRevisions,
  builds,
  customers,
  datalogs,
  member,
  quotes,
  user,
  vehicles,
  type Build,
} from "@/db/schema";
import type { FuelSystemResult, ParsedFuelSystemInput } from "@/lib/calc";
import { type BuildStatus, type BuildStatusFacts, type ChosenPart } from "@/lib/domain/builds";
import { Conflict, NotFound } from "@/lib/domain/errors";
import type { SizingSettings } from "@/lib/sizing/effective-inputs";
import type { VehicleInput } from "@/lib/validations/vehicles";

import { escapeLike } from "./like";
import { differs } from "./unchanged";
import { insertVehicle } from "./vehicles";

export const BUILD_SORTS = ["updated", "created", "title"] as const;
export type BuildSort = (typeof BUILD_SORTS)[number];

const SORT_COLUMNS = {
  updated: { col: builds.updatedAt, desc: true },
  created: { col: builds.createdAt, desc: true },
  title: { col: builds.title, desc: false },
} as const;

/** An instant PostgreSQL's timestamptz takes as JavaScript writes it: years 1 to 9999. */
function storableInstant(d: Date): boolean {
  const year = d.getUTCFullYear();
  return !Number.isNaN(d.getTime()) && year >= 1 && year <= 9999;
}

/** Opaque keyset cursor: base64url of [sort key of the last row, its id]. */
const encodeCursor = (key: string, id: string) =>
  Buffer.from(JSON.stringify([key, id])).toString("base64url");
function decodeCursor(c: string): [string, string] | null {
  try {
    const v: unknown = JSON.parse(Buffer.from(c, "base64url").toString("utf8"));
    return Array.isArray(v) &&
      v.length === 2 &&
      typeof v[0] === "string" &&
      typeof v[1] === "string" &&
      /^[0-9a-f-]{36}$/i.test(v[1])
      ? [v[0], v[1]]
      : null;
  } catch {
    return null;
  }
}

export interface BuildListOptions {
  q?: string;
  status?: BuildStatus;
  tunerId?: string;
  customerId?: string;
  /** Only builds of customers linked to this portal user. */
  portalUserId?: string;
  sort?: BuildSort;
  cursor?: string;
  limit: number;
}

/**
 * One page of a shop's builds. The search runs on `search_text` (title, vehicle and customer
 * name, kept by a trigger) through a trigram index; paging is keyset on (sort key, id).
 */
export async function listBuilds(shopId: string, opts: BuildListOptions) {
  const sort = SORT_COLUMNS[opts.sort ?? "updated"];
  const conds = [eq(builds.shopId, shopId)];
  if (opts.status) conds.push(eq(builds.status, opts.status));
  if (opts.customerId) conds.push(eq(builds.customerId, opts.customerId));
  if (opts.tunerId) conds.push(eq(builds.tunerId, opts.tunerId));
  if (opts.portalUserId) conds.push(eq(customers.userId, opts.portalUserId));
  if (opts.q) conds.push(like(builds.searchText, `%${escapeLike(opts.q.toLowerCase())}%`));
  const after = opts.cursor ? decodeCursor(opts.cursor) : null;
  if (after) {
    const [rawKey, id] = after;
    const key = sort.col === builds.title ? rawKey : new Date(rawKey);
    // A cursor naming no instant PostgreSQL can hold (year 0, year 275760) starts from the top.
    if (!(key instanceof Date) || storableInstant(key)) {
      const beyond = sort.desc ? lt(sort.col, key as never) : gt(sort.col, key as never);
      conds.push(
        or(
          beyond,
          and(eq(sort.col, key as never), sort.desc ? lt(builds.id, id) : gt(builds.id, id)),
        )!,
      );
    }
  }
  const rows = await db
    .select({
      id: builds.id,
      title: builds.title,
      vehicle: builds.vehicle,
      status: builds.status,
      version: builds.version,
      createdAt: builds.createdAt,
      updatedAt: builds.updatedAt,
      customerId: builds.customerId,
      customerName: customers.name,
      tunerId: builds.tunerId,
      tunerName: user.name,
      dutyPct: sql<number | null>`(${builds.result}->'injector'->>'dutyPct')::float8`,
      marginPct: sql<number | null>`(${builds.result}->'pump'->>'marginPct')::float8`,
    })
    .from(builds)
    .innerJoin(customers, eq(customers.id, builds.customerId))
    .leftJoin(user, eq(user.id, builds.tunerId))
    .where(and(...conds))
    .orderBy(
      sort.desc ? desc(sort.col) : asc(sort.col),
      sort.desc ? desc(builds.id) : asc(builds.id),
    )
    .limit(opts.limit + 1);
  const more = rows.length > opts.limit;
  const page = more ? rows.slice(0, opts.limit) : rows;
  const last = page[page.length - 1];
  const lastKey = last
    ? opts.sort === "title"
      ? last.title
      : (opts.sort === "created" ? last.createdAt : last.updatedAt).toISOString()
    : "";
  return { builds: page, nextCursor: more && last ? encodeCursor(lastKey, last.id) : null };
}

/** The shop's members who tune (for the table's tuner filter). */
export async function listTuners(shopId: string) {
  return db
    .select({ id: user.id, name: user.name })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(and(eq(member.organizationId, shopId), inArray(member.role, ["owner", "tuner"])))
    .orderBy(asc(user.name));
}

/** One build of the shop; with `portalUserId`, only if it belongs to that portal customer. */
export async function getBuild(shopId: string, id: string, portalUserId?: string) {
  const [row] = await db
    .select({ build: builds, customerName: customers.name, customerUserId: customers.userId })
    .from(builds)
    .innerJoin(customers, eq(customers.id, builds.customerId))
    .where(
      and(
        eq(builds.shopId, shopId),
        eq(builds.id, id),
        portalUserId ? eq(customers.userId, portalUserId) : undefined,
      ),
    )
    .limit(1);
  return row ?? null;
}

/** Builds of the customer signed in to the portal (matched by their user id). */
export async function listBuildsOfPortalUser(shopId: string, userId: string) {
  return db
    .select({
      id: builds.id,
      title: builds.title,
      vehicle: builds.vehicle,
      status: builds.status,
      updatedAt: builds.updatedAt,
    })
    .from(builds)
    .innerJoin(customers, eq(customers.id, builds.customerId))
    .where(and(eq(builds.shopId, shopId), eq(customers.userId, userId)))
    .orderBy(desc(builds.updatedAt));
}

export type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

/**
 * What the build's status moves depend on (lib/domain/builds.ts#statusMoves): its quotes but
 * superseded revisions, and whether a dyno log of it was marked verified after its last save as
 * a draft. Inside `tx` the quotes are read FOR SHARE, so none changes before that save commits.
 */
export async function buildStatusFacts(
  shopId: string,
  buildId: string,
  today: string,
  tx?: Tx,
): Promise<BuildStatusFacts> {
  const q = tx ?? db;
  const quoteRows = q
    .select({ status: quotes.status, validUntil: quotes.validUntil })
    .from(quotes)
    .where(
      and(
        eq(quotes.shopId, shopId),
        eq(quotes.buildId, buildId),
        sql`${quotes.status} <> 'superseded'`,
      ),
    );
  const lastDraft = sql`coalesce((select max(r.created_at) from ${buildRevisions} r where r.shop_id = ${shopId} and r.build_id = ${buildId} and r.status = 'draft'), '-infinity'::timestamptz)`;
  const [quoteList, logs] = await Promise.all([
    tx ? quoteRows.for("share") : quoteRows,
    q
      .select({ id: datalogs.id })
      .from(datalogs)
      .where(
        and(
          eq(datalogs.shopId, shopId),
          eq(datalogs.buildId, buildId),
          sql`${datalogs.verifiedAt} > ${lastDraft}`,
        ),
      )
      .limit(1),
  ]);
  return { quotes: quoteList, verifiedLog: logs.length > 0, today };
}

/** What a build's save writes; keys left out keep their stored value. */
export interface BuildPatch {
  title?: string;
  /** An empty string clears it. */
  vehicle?: string;
  status?: BuildStatus;
  note?: string;
  /** Inputs, their format, the result and the library version go together. */
  sized?: {
    inputs: ParsedFuelSystemInput;
    inputsSchemaVersion: number;
    result: FuelSystemResult;
    calcVersion: string;
    /** The shop settings it was sized with. */
    sizingSettings: SizingSettings;
  };
  parts?: ChosenPart[];
  /**
   * The kit's basis (builds.kit_basis) to keep with this save. Left out: a save whose inputs
   * differ from the stored ones clears it (the new inputs are then what the kit ranks against).
   */
  kitBasis?: { inputs: unknown; inputsSchemaVersion: number } | null;
  /**
   * Write a revision even when no column changes (a build verified again with another log: the
   * revision names that log). Otherwise a save that changes nothing writes nothing.
   */
  always?: boolean;
}

/**
 * A new build with its revision 1. The customer must be the shop's (the command checks it). A
 * draft from a caller's goal names a vehicle of the customer (`vehicleId`, checked here) or a
 * new one (`newVehicle`, added in the same transaction), starts in `needs_sizing` and has no
 * tuner yet.
 */
export async function createBuild(
  shopId: string,
  userId: string,
  v: {
    customerId: string;
    title: string;
    vehicle?: string;
    vehicleId?: string;
    newVehicle?: VehicleInput;
    status?: BuildStatus;
    note?: string;
    sized: NonNullable<BuildPatch["sized"]>;
    /** "Copy as next power step": the build it continues (same shop, checked by the caller). */
    previousStepId?: string;
  },
) {
  return db.transaction(async (tx) => {
    let vehicleId = v.vehicleId ?? null;
    if (vehicleId) {
      const [mine] = await tx
        .select({ id: vehicles.id })
        .from(vehicles)
        .where(
          and(
            eq(vehicles.shopId, shopId),
            eq(vehicles.id, vehicleId),
            eq(vehicles.customerId, v.customerId),
          ),
        )
        .limit(1);
      if (!mine) throw new NotFound("That vehicle");
    }
    if (v.newVehicle) vehicleId = (await insertVehicle(shopId, v.customerId, v.newVehicle, tx)).id;
    const draft = v.status === "needs_sizing";
    const [b] = await tx
      .insert(builds)
      .values({
        shopId,
        customerId: v.customerId,
        title: v.title,
        vehicle: v.vehicle || null,
        vehicleId,
        ...(v.status ? { status: v.status } : {}),
        ...v.sized,
        ...(v.previousStepId ? { previousStepId: v.previousStepId } : {}),
        tunerId: draft ? null : userId,
        createdBy: userId,
        updatedBy: userId,
      })
      .returning();
    await tx.insert(buildRevisions).values({
      shopId,
      buildId: b!.id,
      version: 1,
      status: b!.status,
      ...v.sized,
      authorId: userId,
      note: v.note ?? "Created",
    });
    return b!;
  });
}

/** The builds waiting for a tuner to size them, oldest first (the tuners' queue). */
export async function needsSizingQueue(shopId: string, limit = 10) {
  const where = and(eq(builds.shopId, shopId), eq(builds.status, "needs_sizing"));
  const [rows, [total]] = await Promise.all([
    db
      .select({
        id: builds.id,
        title: builds.title,
        vehicle: builds.vehicle,
        createdAt: builds.createdAt,
        customerName: customers.name,
        createdByName: user.name,
      })
      .from(builds)
      .innerJoin(customers, eq(customers.id, builds.customerId))
      .leftJoin(user, eq(user.id, builds.createdBy))
      .where(where)
      .orderBy(asc(builds.createdAt), asc(builds.id))
      .limit(limit),
    db
      .select({ n: sql<number>`count(*)::int` })
      .from(builds)
      .where(where),
  ]);
  return { builds: rows, total: total?.n ?? 0 };
}

/** The build as it is now, with the name of who saved it last (what a conflict shows). */
export type CurrentBuild = Build & { updatedByName: string | null };

/**
 * Checks a status move inside the save's transaction (the build's row locked): throws to refuse
 * it, and then nothing is written.
 */
export type StatusCheck = (from: BuildStatus, tx: Tx) => Promise<void>;

/**
 * Saves a new revision if the build is still at `expectedVersion`, writing only the keys of `v`
 * that are present; otherwise throws Conflict carrying the current build (CurrentBuild). The build
 * and its revision are written together, inside `tx` when the caller has one. A status change
 * is first put to `checkStatus`, in the same transaction. When every value given equals the
 * stored one, nothing is written (no version, no revision, no `updated_at`) and the build comes
 * back as it is — unless `v.always`.
 */
export async function saveBuild(
  shopId: string,
  id: string,
  userId: string,
  expectedVersion: number,
  v: BuildPatch,
  tx?: Tx,
  checkStatus?: StatusCheck,
): Promise<Build> {
  const changes = {
    ...(v.title !== undefined ? { title: v.title } : {}),
    ...(v.vehicle !== undefined ? { vehicle: v.vehicle || null } : {}),
    ...(v.status ? { status: v.status } : {}),
    ...(v.parts ? { parts: v.parts } : {}),
    ...v.sized,
  };
  const run = async (tx: Tx) => {
    const mine = and(eq(builds.shopId, shopId), eq(builds.id, id));
    if (v.status && checkStatus) {
      const [now] = await tx
        .select({ status: builds.status, version: builds.version })
        .from(builds)
        .where(mine)
        .for("update");
      // A stale version is answered below as a conflict, before any rule.
      if (now && now.version === expectedVersion && now.status !== v.status)
        await checkStatus(now.status, tx);
    }
    const [b] = await tx
      .update(builds)
      .set({
        ...changes,
        ...(v.kitBasis !== undefined
          ? { kitBasis: v.kitBasis }
          : v.sized
            ? {
                kitBasis: sql`case when ${builds.inputs} is distinct from ${JSON.stringify(v.sized.inputs)}::jsonb then null else ${builds.kitBasis} end`,
              }
            : {}),
        // A build taken out of the sizing queue gets the tuner who moves it, if it has none.
        ...(v.status && v.status !== "needs_sizing"
          ? { tunerId: sql`coalesce(${builds.tunerId}, ${userId})` }
          : {}),
        version: sql`${builds.version} + 1`,
        updatedBy: userId,
        updatedAt: new Date(),
      })
      .where(
        and(
          mine,
          eq(builds.version, expectedVersion),
          v.always ? undefined : differs(builds, changes),
        ),
      )
      .returning();
    if (!b) {
      if (!v.always) {
        const [same] = await tx
          .select()
          .from(builds)
          .where(and(mine, eq(builds.version, expectedVersion)))
          .limit(1);
        if (same) return same;
      }
      const [current] = await tx
        .select({ build: builds, updatedByName: user.name })
        .from(builds)
        .leftJoin(user, eq(user.id, builds.updatedBy))
        .where(and(eq(builds.shopId, shopId), eq(builds.id, id)))
        .limit(1);
      if (!current) throw new NotFound("That build");
      throw new Conflict<CurrentBuild>(
        `Someone saved this build meanwhile (now version ${current.build.version}); nothing was overwritten`,
        "conflict",
        { ...current.build, updatedByName: current.updatedByName },
      );
    }
    await tx.insert(buildRevisions).values({
      shopId,
      buildId: id,
      version: b.version,
      status: b.status,
      inputs: b.inputs,
      inputsSchemaVersion: b.inputsSchemaVersion,
      result: b.result,
      calcVersion: b.calcVersion,
      sizingSettings: b.sizingSettings,
      parts: b.parts,
      authorId: userId,
      note: v.note || null,
    });
    return b;
  };
  return tx ? run(tx) : db.transaction(run);
}

export async function listRevisions(shopId: string, buildId: string) {
  return db
    .select({
      id: buildRevisions.id,
      version: buildRevisions.version,
      status: buildRevisions.status,
      note: buildRevisions.note,
      createdAt: buildRevisions.createdAt,
      authorId: buildRevisions.authorId,
    })
    .from(buildRevisions)
    .where(and(eq(buildRevisions.shopId, shopId), eq(buildRevisions.buildId, buildId)))
    .orderBy(desc(buildRevisions.version));
}

export async function getRevision(shopId: string, buildId: string, version: number) {
  const [row] = await db
    .select()
    .from(buildRevisions)
    .where(
      and(
        eq(buildRevisions.shopId, shopId),
        eq(buildRevisions.buildId, buildId),
        eq(buildRevisions.version, version),
      ),
    )
    .limit(1);
  return row ?? null;
}
