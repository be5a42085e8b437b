import { and, asc, desc, eq, inArray, isNull, ne, sql } from "drizzle-orm";

import { db } from "@/db";
import {
  builds,
  customers,
  invoices,
  jobLines,
  jobs,
  parts,
  quoteLines,
  quotes,
  type Job,
} from "@/db/schema";
import { unitsOf } from "@/lib/catalog/stock";
import type { ChosenPart, KitRole } from "@/lib/domain/builds";
import { Conflict, NotFound } from "@/lib/domain/errors";
import { fitPlan, fitShortages, jobStatusFor, type FittedPart } from "@/lib/domain/jobs";

import { saveBuild } from "./builds";
import { nextShopNumber, type Tx } from "./counters";

const jobSelect = {
  job: jobs,
  quoteNumber: quotes.number,
  quoteRevision: quotes.revision,
  quoteStatus: quotes.status,
  customerName: customers.name,
  customerEmail: customers.email,
  customerUserId: customers.userId,
  buildTitle: builds.title,
  invoiceId: invoices.id,
  invoiceStatus: invoices.status,
};

const base = () =>
  db
    .select(jobSelect)
    .from(jobs)
    .innerJoin(quotes, eq(quotes.id, jobs.quoteId))
    .innerJoin(customers, eq(customers.id, jobs.customerId))
    .leftJoin(builds, eq(builds.id, jobs.buildId))
    .leftJoin(invoices, eq(invoices.jobId, jobs.id));

/** The shop's jobs, newest first; with `portalUserId`, only that customer's own. */
export async function listJobs(shopId: string, portalUserId?: string) {
  return base()
    .where(
      and(eq(jobs.shopId, shopId), portalUserId ? eq(customers.userId, portalUserId) : undefined),
    )
    .orderBy(desc(jobs.number));
}

export async function getJob(shopId: string, id: string, portalUserId?: string) {
  const [row] = await base()
    .where(
      and(
        eq(jobs.shopId, shopId),
        eq(jobs.id, id),
        portalUserId ? eq(customers.userId, portalUserId) : undefined,
      ),
    )
    .limit(1);
  if (!row) return null;
  const lines = await db
    .select()
    .from(jobLines)
    .where(and(eq(jobLines.shopId, shopId), eq(jobLines.jobId, id)))
    .orderBy(asc(jobLines.position));
  return { ...row, lines };
}
export type JobRow = NonNullable<Awaited<ReturnType<typeof getJob>>>;

/**
 * What the fit form starts from: the quote's currency and the labour hours it sold, in
 * thousandths (its first labour line, the one the invoice bills at its rate; null: no labour).
 */
export async function quoteFitFacts(shopId: string, quoteId: string) {
  const rows = await db
    .select({ currency: quotes.currency, labourMilli: quoteLines.quantityMilli })
    .from(quotes)
    .leftJoin(quoteLines, and(eq(quoteLines.quoteId, quotes.id), eq(quoteLines.kind, "labour")))
    .where(and(eq(quotes.shopId, shopId), eq(quotes.id, quoteId)))
    .orderBy(asc(quoteLines.position))
    .limit(1);
  return { currency: rows[0]?.currency ?? "USD", labourMilli: rows[0]?.labourMilli ?? null };
}

/** The job of a quote, if it has one. */
export async function jobOfQuote(shopId: string, quoteId: string) {
  const [j] = await db
    .select({ id: jobs.id })
    .from(jobs)
    .where(and(eq(jobs.shopId, shopId), eq(jobs.quoteId, quoteId)))
    .limit(1);
  return j ?? null;
}

/**
 * The job of a quote once it is fitted — its number, when, its lines as fitted and its invoice
 * (if raised) — or null while the quote's parts are not yet issued (no job, or one not fitted).
 */
export async function fittedJobOfQuote(shopId: string, quoteId: string) {
  const [row] = await db
    .select({
      id: jobs.id,
      number: jobs.number,
      fittedAt: jobs.fittedAt,
      invoiceId: invoices.id,
      invoiceNumber: invoices.number,
      invoiceStatus: invoices.status,
    })
    .from(jobs)
    .leftJoin(invoices, eq(invoices.jobId, jobs.id))
    .where(and(eq(jobs.shopId, shopId), eq(jobs.quoteId, quoteId), eq(jobs.status, "fitted")))
    .limit(1);
  if (!row) return null;
  const lines = await db
    .select({
      description: jobLines.description,
      quantity: jobLines.quantity,
      fittedQty: jobLines.fittedQty,
    })
    .from(jobLines)
    .where(and(eq(jobLines.shopId, shopId), eq(jobLines.jobId, row.id)))
    .orderBy(asc(jobLines.position));
  return { ...row, lines };
}

/** Moves a build one step (quoted → ordered, ordered → fitted) inside the caller's transaction. */
async function stepBuild(
  tx: Tx,
  shopId: string,
  buildId: string | null,
  userId: string,
  from: "quoted" | "ordered",
  to: "ordered" | "fitted",
  extra: { parts?: ChosenPart[]; note: string },
) {
  if (!buildId) return;
  const [b] = await tx
    .select({ status: builds.status, version: builds.version })
    .from(builds)
    .where(and(eq(builds.shopId, shopId), eq(builds.id, buildId)))
    .for("update")
    .limit(1);
  if (!b) return;
  let version = b.version;
  if (to === "fitted" && b.status === "quoted")
    version = (
      await saveBuild(shopId, buildId, userId, version, { status: "ordered", note: extra.note }, tx)
    ).version;
  else if (b.status !== from) return;
  await saveBuild(
    shopId,
    buildId,
    userId,
    version,
    { status: to, ...(extra.parts ? { parts: extra.parts } : {}), note: extra.note },
    tx,
  );
}

/**
 * A job from a quote whose deposit is paid (or that is ordered), one per quote: its part lines
 * with what the quote holds as allocated, ready to fit when all is held. The quote moves to
 * ordered and its build (when quoted) to ordered, in the same transaction. Conflict if the quote
 * is not paid or already has a job.
 */
export async function insertJob(shopId: string, userId: string, quoteId: string): Promise<Job> {
  return db.transaction(async (tx) => {
    const [q] = await tx
      .select()
      .from(quotes)
      .where(and(eq(quotes.shopId, shopId), eq(quotes.id, quoteId)))
      .for("update")
      .limit(1);
    if (!q) throw new NotFound("That quote");
    const [had] = await tx.select().from(jobs).where(eq(jobs.quoteId, quoteId)).limit(1);
    if (had) throw new Conflict("This quote already has a job", "job_exists", had);
    if (q.status !== "deposit_paid" && q.status !== "ordered")
      throw new Conflict("A job starts from a quote whose deposit is paid", "not_paid", q);
    const ql = await tx
      .select()
      .from(quoteLines)
      .where(and(eq(quoteLines.quoteId, quoteId), eq(quoteLines.kind, "part")))
      .orderBy(asc(quoteLines.position));
    const lines = ql.map((l, i) => ({
      shopId,
      quoteLineId: l.id,
      position: i + 1,
      partId: l.partId,
      sku: l.sku,
      description: l.description,
      quantity: unitsOf(l.quantityMilli),
      allocatedQty: Math.min(l.heldQty, unitsOf(l.quantityMilli)),
      unitPriceMinor: l.unitPriceMinor,
      discountBp: l.discountBp,
    }));
    const status = jobStatusFor(lines);
    const number = await nextShopNumber(tx, shopId, "job");
    const [job] = await tx
      .insert(jobs)
      .values({
        shopId,
        number,
        quoteId,
        customerId: q.customerId,
        buildId: q.buildId,
        status,
        ...(status === "ready" ? { readyAt: new Date() } : {}),
        createdBy: userId,
      })
      .returning();
    if (lines.length)
      await tx.insert(jobLines).values(lines.map((l) => ({ ...l, jobId: job!.id })));
    if (q.status === "deposit_paid")
      await tx
        .update(quotes)
        .set({
          status: "ordered",
          statusChangedAt: new Date(),
          statusChangedBy: userId,
          version: q.version + 1,
          updatedAt: new Date(),
        })
        .where(eq(quotes.id, q.id));
    await stepBuild(tx, shopId, q.buildId, userId, "quoted", "ordered", {
      note: `Ordered: job ${number}`,
    });
    return job!;
  });
}

const CATEGORY_ROLE: Partial<Record<string, KitRole>> = {
  injector: "injector",
  pump: "pump",
  regulator: "regulator",
  line: "feed-line",
  filter: "filter",
  sensor: "sensor",
};

/**
 * Fits a job, in one transaction: the parts actually fitted are issued from stock (each part's
 * stock down by what was fitted; what the job held released from `reserved`; the quote lines
 * hold nothing more), the job's lines record what was fitted (a part the quote did not name is
 * a new line at its catalog price), the labour used is kept, the job is fitted, and its build
 * moves to fitted with the parts actually fitted (a new build revision). Conflict — nothing
 * written — when the job is stale or fitted, or the shelf lacks a part (with the field).
 */
export async function fitJobRow(
  shopId: string,
  id: string,
  userId: string,
  v: { version: number; parts: FittedPart[]; labourMilli: number; notes?: string },
): Promise<Job> {
  return db.transaction(async (tx) => {
    const [job] = await tx
      .select()
      .from(jobs)
      .where(and(eq(jobs.shopId, shopId), eq(jobs.id, id)))
      .for("update")
      .limit(1);
    if (!job) throw new NotFound("That job");
    if (job.status === "fitted")
      throw new Conflict("This job is already fitted", "already_fitted", job);
    if (job.version !== v.version)
      throw new Conflict(
        `Someone changed this job meanwhile (now version ${job.version}); nothing was fitted`,
        "conflict",
        job,
      );
    const lines = await tx
      .select()
      .from(jobLines)
      .where(eq(jobLines.jobId, id))
      .orderBy(asc(jobLines.position))
      .for("update");
    const plan = fitPlan(lines, v.parts);
    const partIds = [...new Set([...plan.issue.keys(), ...plan.release.keys()])].sort();
    const locked = partIds.length
      ? await tx
          .select()
          .from(parts)
          .where(and(eq(parts.shopId, shopId), inArray(parts.id, partIds)))
          .orderBy(asc(parts.id))
          .for("update")
      : [];
    const byId = new Map(locked.map((p) => [p.id, p]));
    const index = new Map<string, number>();
    v.parts.forEach((p, i) => index.has(p.partId) || index.set(p.partId, i));
    const issues = fitShortages(plan, byId, index);
    if (issues.length) throw new Conflict(issues[0]!.message, "short_of_stock", undefined, issues);
    for (const p of locked) {
      const out = plan.issue.get(p.id) ?? 0;
      const back = plan.release.get(p.id) ?? 0;
      if (!out && !back) continue;
      await tx
        .update(parts)
        .set({
          stock: p.stock - out,
          reserved: sql`greatest(0, ${parts.reserved} - ${back})`,
        })
        .where(eq(parts.id, p.id));
    }
    await tx
      .update(quoteLines)
      .set({ heldQty: 0 })
      .where(and(eq(quoteLines.quoteId, job.quoteId), ne(quoteLines.heldQty, 0)));
    for (const l of lines)
      await tx
        .update(jobLines)
        .set({ fittedQty: plan.fitted.get(l.id) ?? 0 })
        .where(eq(jobLines.id, l.id));
    if (plan.extra.length)
      await tx.insert(jobLines).values(
        plan.extra.map((e, i) => {
          const p = byId.get(e.partId)!;
          return {
            shopId,
            jobId: id,
            position: lines.length + i + 1,
            partId: p.id,
            sku: p.sku,
            description: `${p.brand} ${p.name}`,
            quantity: 0,
            allocatedQty: 0,
            fittedQty: e.quantity,
            unitPriceMinor: p.priceMinor,
            discountBp: 0,
          };
        }),
      );
    const [done] = await tx
      .update(jobs)
      .set({
        status: "fitted",
        labourMilli: v.labourMilli,
        fittedAt: new Date(),
        fittedBy: userId,
        ...(v.notes !== undefined ? { notes: v.notes || null } : {}),
        version: job.version + 1,
        updatedAt: new Date(),
      })
      .where(eq(jobs.id, id))
      .returning();
    const [b] = job.buildId
      ? await tx
          .select({ parts: builds.parts })
          .from(builds)
          .where(eq(builds.id, job.buildId))
          .limit(1)
      : [];
    if (b) {
      const roleOf = new Map(b.parts.map((p) => [p.partId, p.role]));
      const fittedParts: ChosenPart[] = [];
      const qty = new Map<string, number>();
      for (const f of v.parts) qty.set(f.partId, (qty.get(f.partId) ?? 0) + f.quantity);
      for (const [partId, quantity] of qty) {
        const p = byId.get(partId)!;
        const role = roleOf.get(partId) ?? CATEGORY_ROLE[p.category];
        if (role)
          fittedParts.push({ role, partId, sku: p.sku, name: `${p.brand} ${p.name}`, quantity });
      }
      await stepBuild(tx, shopId, job.buildId, userId, "ordered", "fitted", {
        parts: fittedParts,
        note: `Fitted: job ${job.number}`,
      });
    }
    return done!;
  });
}

/** Quotes whose deposit is paid (or that are ordered) and that have no job yet, oldest first. */
export async function quotesAwaitingJob(shopId: string) {
  return db
    .select({
      id: quotes.id,
      number: quotes.number,
      revision: quotes.revision,
      customerName: customers.name,
      buildTitle: builds.title,
      totalMinor: quotes.totalMinor,
      currency: quotes.currency,
    })
    .from(quotes)
    .innerJoin(customers, eq(customers.id, quotes.customerId))
    .leftJoin(builds, eq(builds.id, quotes.buildId))
    .leftJoin(jobs, eq(jobs.quoteId, quotes.id))
    .where(
      and(
        eq(quotes.shopId, shopId),
        inArray(quotes.status, ["deposit_paid", "ordered"]),
        isNull(jobs.id),
      ),
    )
    .orderBy(asc(quotes.acceptedAt));
}
