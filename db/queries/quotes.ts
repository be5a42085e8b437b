import { and, asc, desc, eq, gt, gte, inArray, lt, ne, or, sql } from "drizzle-orm";

import { db } from "@/db";
import {
  builds,
  customers,
  invitation,
  parts,
  quoteLines,
  quoteMessages,
  quotes,
  shopSettings,
} from "@/db/schema";
import { quoteTotals } from "@/lib/catalog/quote-totals";
import { allocate, freeOf } from "@/lib/catalog/stock";
import { Conflict, NotFound } from "@/lib/domain/errors";
import {
  QUOTE_EDITABLE,
  QUOTE_HOLDS_STOCK,
  QUOTE_LAPSES,
  QUOTE_STATUS_LABELS,
  type QuoteStatus,
} from "@/lib/domain/quotes";
import { calendarDay } from "@/lib/format/dates";
import { parseQuoteNumber, type QuoteLineInput } from "@/lib/validations/quotes";

import { nextShopNumber, type Tx } from "./counters";
import { sameLines, totalColumns } from "./document-lines";
import { escapeLike } from "./like";

export type { QuoteLineInput };
export type QuoteRow = typeof quotes.$inferSelect;

/** The quote as it is now: what a refused write hands back as `current`. */
function changedMeanwhile(q: QuoteRow): Conflict<QuoteRow> {
  return new Conflict(
    `Someone changed this quote meanwhile (now version ${q.version}, ${QUOTE_STATUS_LABELS[q.status].toLowerCase()}); nothing was overwritten`,
    "conflict",
    q,
  );
}

/** The quote's row, locked for the rest of the transaction; another shop's is "not found". */
async function lockQuote(tx: Tx, shopId: string, id: string): Promise<QuoteRow> {
  const [q] = await tx
    .select()
    .from(quotes)
    .where(and(eq(quotes.shopId, shopId), eq(quotes.id, id)))
    .for("update")
    .limit(1);
  if (!q) throw new NotFound("That quote");
  return q;
}

async function writeLines(
  tx: Tx,
  shopId: string,
  quoteId: string,
  lines: QuoteLineInput[],
  taxRateBp: number,
) {
  await tx
    .delete(quoteLines)
    .where(and(eq(quoteLines.shopId, shopId), eq(quoteLines.quoteId, quoteId)));
  if (lines.length) {
    // Part lines must name parts of this shop.
    const partIds = [...new Set(lines.map((l) => l.partId).filter((x): x is string => Boolean(x)))];
    if (partIds.length) {
      const found = await tx
        .select({ id: parts.id })
        .from(parts)
        .where(and(eq(parts.shopId, shopId), inArray(parts.id, partIds)));
      // The command checked them; one deleted since is a clash, not a crash.
      if (found.length !== partIds.length)
        throw new Conflict(
          "A part on this quote was removed from the catalog meanwhile; nothing was saved",
        );
    }
    await tx.insert(quoteLines).values(
      lines.map((l, i) => ({
        shopId,
        quoteId,
        position: i + 1,
        kind: l.kind,
        partId: l.partId ?? null,
        sku: l.sku ?? null,
        description: l.description,
        quantityMilli: l.quantityMilli,
        unitPriceMinor: l.unitPriceMinor,
        discountBp: l.discountBp,
      })),
    );
  }
  return totalColumns(quoteTotals(lines, taxRateBp));
}

/** A new draft quote with the next number of the shop (the command checked customer and parts). */
export async function insertQuote(
  shopId: string,
  userId: string,
  v: {
    customerId: string;
    buildId?: string | null;
    validUntil?: string;
    lines: QuoteLineInput[];
    notes?: string;
  },
) {
  return db.transaction(async (tx) => {
    const [c] = await tx
      .select({ id: customers.id })
      .from(customers)
      .where(and(eq(customers.shopId, shopId), eq(customers.id, v.customerId)))
      .limit(1);
    if (!c) throw new NotFound("That customer");
    const [s] = await tx
      .select()
      .from(shopSettings)
      .where(eq(shopSettings.shopId, shopId))
      .limit(1);
    const number = await nextShopNumber(tx, shopId, "quote");
    const [q] = await tx
      .insert(quotes)
      .values({
        shopId,
        number,
        customerId: v.customerId,
        buildId: v.buildId ?? null,
        currency: s?.currency ?? "USD",
        taxRateBp: s?.taxRateBp ?? 0,
        // Days counted from today in the shop's zone: the day its customer reads on the quote.
        validUntil: v.validUntil ?? calendarDay(new Date(), s?.timeZone, s?.quoteValidDays ?? 30),
        notes: v.notes ?? null,
        createdBy: userId,
      })
      .returning();
    const totals = await writeLines(tx, shopId, q!.id, v.lines, q!.taxRateBp);
    const [done] = await tx.update(quotes).set(totals).where(eq(quotes.id, q!.id)).returning();
    return done!;
  });
}

/**
 * The status filter as of `today` (as `quoteStatusOn` reads it): "expired" also finds a sent or
 * accepted quote past its date, and "sent"/"accepted" leave those out.
 */
function statusOn(status: QuoteStatus, today: string) {
  if (status === "expired")
    return or(
      eq(quotes.status, "expired"),
      and(inArray(quotes.status, [...QUOTE_LAPSES]), lt(quotes.validUntil, today)),
    );
  if (QUOTE_LAPSES.includes(status))
    return and(eq(quotes.status, status), gte(quotes.validUntil, today));
  return eq(quotes.status, status);
}

/** A search of the list: the quote's number, its customer's name, its build's title or vehicle. */
function searchOf(q: string) {
  const n = parseQuoteNumber(q);
  const like = `%${escapeLike(q.toLowerCase())}%`;
  return or(
    n
      ? and(
          eq(quotes.number, n.number),
          n.revision === undefined ? undefined : eq(quotes.revision, n.revision),
        )
      : undefined,
    sql`lower(${customers.name}) like ${like}`,
    sql`lower(coalesce(${builds.title}, '')) like ${like}`,
    sql`lower(coalesce(${builds.vehicle}, '')) like ${like}`,
  );
}

const LIST_ORDER = {
  newest: [desc(quotes.number), desc(quotes.revision)],
  oldest: [asc(quotes.number), asc(quotes.revision)],
  total: [desc(quotes.totalMinor), desc(quotes.number), desc(quotes.revision)],
  valid: [asc(quotes.validUntil), desc(quotes.number), desc(quotes.revision)],
  customer: [asc(sql`lower(${customers.name})`), desc(quotes.number), desc(quotes.revision)],
} as const;

/**
 * The shop's quotes (a customer's own, never drafts), searched, filtered by status as of
 * `today` and sorted; newest first by default. Reads only: see expireQuotes.
 */
export async function listQuotes(
  shopId: string,
  opts: {
    portalUserId?: string;
    status?: QuoteStatus;
    buildId?: string;
    q?: string;
    sort?: keyof typeof LIST_ORDER;
    /** The shop's calendar day (lib/shop/shop-zone#shopToday), for the status filter. */
    today: string;
  },
) {
  return db
    .select({
      id: quotes.id,
      number: quotes.number,
      revision: quotes.revision,
      status: quotes.status,
      totalMinor: quotes.totalMinor,
      currency: quotes.currency,
      validUntil: quotes.validUntil,
      updatedAt: quotes.updatedAt,
      customerId: quotes.customerId,
      customerName: customers.name,
      buildId: quotes.buildId,
      buildTitle: builds.title,
      buildVehicle: builds.vehicle,
    })
    .from(quotes)
    .innerJoin(customers, eq(customers.id, quotes.customerId))
    .leftJoin(builds, eq(builds.id, quotes.buildId))
    .where(
      and(
        eq(quotes.shopId, shopId),
        opts.portalUserId
          ? and(eq(customers.userId, opts.portalUserId), ne(quotes.status, "draft"))
          : undefined,
        opts.status ? statusOn(opts.status, opts.today) : undefined,
        opts.buildId ? eq(quotes.buildId, opts.buildId) : undefined,
        opts.q ? searchOf(opts.q) : undefined,
      ),
    )
    .orderBy(...LIST_ORDER[opts.sort ?? "newest"])
    .limit(500);
}

export async function getQuote(shopId: string, id: string, portalUserId?: string) {
  const [row] = await db
    .select({
      quote: quotes,
      customerName: customers.name,
      customerEmail: customers.email,
      customerUserId: customers.userId,
      buildTitle: builds.title,
    })
    .from(quotes)
    .innerJoin(customers, eq(customers.id, quotes.customerId))
    .leftJoin(builds, eq(builds.id, quotes.buildId))
    // A customer never sees a draft: it is the shop's until it is sent.
    .where(
      and(
        eq(quotes.shopId, shopId),
        eq(quotes.id, id),
        portalUserId
          ? and(eq(customers.userId, portalUserId), ne(quotes.status, "draft"))
          : undefined,
      ),
    )
    .limit(1);
  if (!row) return null;
  const [lines, messages] = await Promise.all([
    db
      .select()
      .from(quoteLines)
      .where(and(eq(quoteLines.shopId, shopId), eq(quoteLines.quoteId, id)))
      .orderBy(asc(quoteLines.position)),
    db
      .select()
      .from(quoteMessages)
      .where(and(eq(quoteMessages.shopId, shopId), eq(quoteMessages.quoteId, id)))
      .orderBy(desc(quoteMessages.sentAt)),
  ]);
  return { ...row, lines, messages };
}

/** Do the quote's stored lines (in order) differ from these? */
async function linesDiffer(tx: Tx, shopId: string, quoteId: string, lines: QuoteLineInput[]) {
  const stored = await tx
    .select()
    .from(quoteLines)
    .where(and(eq(quoteLines.shopId, shopId), eq(quoteLines.quoteId, quoteId)))
    .orderBy(asc(quoteLines.position));
  return !sameLines(stored, lines);
}

/**
 * Writes the fields given (an absent one is left as it is) if the quote is still at
 * `expectedVersion` and open to edits; else Conflict with the quote as it is now. Empty notes
 * are no notes (null). When the lines, validity and notes given equal the stored ones nothing is
 * written — no new version, lines kept with their ids — and the quote comes back as it is.
 */
export async function updateQuote(
  shopId: string,
  id: string,
  expectedVersion: number,
  v: { validUntil?: string; notes?: string; lines?: QuoteLineInput[] },
) {
  return db.transaction(async (tx) => {
    const q = await lockQuote(tx, shopId, id);
    if (q.version !== expectedVersion || !QUOTE_EDITABLE.includes(q.status))
      throw changedMeanwhile(q);
    const notes = v.notes === undefined ? undefined : v.notes || null;
    const changed =
      (v.validUntil !== undefined && v.validUntil !== q.validUntil) ||
      (notes !== undefined && notes !== q.notes) ||
      (v.lines !== undefined && (await linesDiffer(tx, shopId, id, v.lines)));
    if (!changed) return q;
    const totals = v.lines ? await writeLines(tx, shopId, id, v.lines, q.taxRateBp) : {};
    const [done] = await tx
      .update(quotes)
      .set({
        ...totals,
        ...(v.validUntil === undefined ? {} : { validUntil: v.validUntil }),
        ...(notes === undefined ? {} : { notes }),
        version: q.version + 1,
        updatedAt: new Date(),
      })
      .where(eq(quotes.id, id))
      .returning();
    return done!;
  });
}

/** +1 when a move starts holding stock, −1 when it stops holding it, else 0. */
function stockSign(from: QuoteStatus, to: QuoteStatus): 1 | -1 | 0 {
  const held = QUOTE_HOLDS_STOCK.includes(from);
  const holds = QUOTE_HOLDS_STOCK.includes(to);
  return held === holds ? 0 : holds ? 1 : -1;
}

/**
 * Holds what is free for the quotes' part lines (`sign` +1) or releases exactly what they hold
 * (−1). Holding locks the parts' rows in id order (concurrent transactions lock them in the same
 * order, and the second waits for the first and then sees its holds), gives each line at most the
 * free units left (`lib/catalog/stock.ts#allocate`, in line order) and records them per line
 * (`held_qty`); the rest is back-ordered. Releasing gives back each line's `held_qty` and sets it
 * to 0. `reserved` therefore never exceeds the stock a hold saw.
 */
async function moveReservation(tx: Tx, shopId: string, quoteIds: string[], sign: 1 | -1) {
  if (quoteIds.length === 0) return;
  const lines = await tx
    .select({
      id: quoteLines.id,
      kind: quoteLines.kind,
      partId: quoteLines.partId,
      quantityMilli: quoteLines.quantityMilli,
      heldQty: quoteLines.heldQty,
    })
    .from(quoteLines)
    .where(
      and(
        eq(quoteLines.shopId, shopId),
        inArray(quoteLines.quoteId, quoteIds),
        eq(quoteLines.kind, "part"),
      ),
    )
    .orderBy(asc(quoteLines.quoteId), asc(quoteLines.position));
  const partIds = [...new Set(lines.flatMap((l) => (l.partId ? [l.partId] : [])))].sort();
  if (partIds.length === 0) return;
  const locked = await tx
    .select({ id: parts.id, stock: parts.stock, reserved: parts.reserved })
    .from(parts)
    .where(and(eq(parts.shopId, shopId), inArray(parts.id, partIds)))
    .orderBy(asc(parts.id))
    .for("update");
  const held =
    sign === 1
      ? allocate(lines, new Map(locked.map((p) => [p.id, freeOf(p)])))
      : lines.map((l) => l.heldQty);
  const byPart = new Map<string, number>();
  lines.forEach((l, i) => {
    if (l.partId && held[i]) byPart.set(l.partId, (byPart.get(l.partId) ?? 0) + held[i]!);
  });
  for (const p of locked) {
    const qty = byPart.get(p.id);
    if (!qty) continue;
    await tx
      .update(parts)
      .set({ reserved: sql`greatest(0, ${parts.reserved} + ${sign * qty})` })
      .where(and(eq(parts.shopId, shopId), eq(parts.id, p.id)));
  }
  for (const [i, l] of lines.entries()) {
    const next = sign === 1 ? held[i]! : 0;
    if (next !== l.heldQty)
      await tx.update(quoteLines).set({ heldQty: next }).where(eq(quoteLines.id, l.id));
  }
}

/** The quote's status change, with its stock held or released, inside the caller's transaction. */
async function applyStatus(tx: Tx, q: QuoteRow, to: QuoteStatus, by: string | null) {
  const sign = stockSign(q.status, to);
  if (sign) await moveReservation(tx, q.shopId, [q.id], sign);
  return writeStatus(tx, q, to, by);
}

/** The status columns alone (the caller moved the stock). */
async function writeStatus(tx: Tx, q: QuoteRow, to: QuoteStatus, by: string | null) {
  const [done] = await tx
    .update(quotes)
    .set({
      status: to,
      statusChangedAt: new Date(),
      statusChangedBy: by,
      ...(to === "accepted" ? { acceptedAt: new Date() } : {}),
      version: q.version + 1,
      updatedAt: new Date(),
    })
    .where(eq(quotes.id, q.id))
    .returning();
  return done!;
}

/**
 * Moves a quote from `from` to `to` (the command checked the move is allowed): accepting holds
 * stock, declining or expiring an accepted quote releases it. If the quote is no longer in
 * `from`, nothing changes and Conflict carries it as it is now. With `portalUserId`, only that
 * customer's own quote.
 */
export async function setQuoteStatus(
  shopId: string,
  id: string,
  move: { from: QuoteStatus; to: QuoteStatus; by: string | null; portalUserId?: string },
) {
  return db.transaction(async (tx) => {
    const q = await lockQuote(tx, shopId, id);
    if (move.portalUserId) {
      const [c] = await tx
        .select({ userId: customers.userId })
        .from(customers)
        .where(eq(customers.id, q.customerId))
        .limit(1);
      if (c?.userId !== move.portalUserId) throw new NotFound("That quote");
    }
    if (q.status !== move.from) throw changedMeanwhile(q);
    return applyStatus(tx, q, move.to, move.by);
  });
}

/**
 * The next revision of a quote in one of `from` (same number, revision + 1, a draft), with the
 * edit's fields where given and the quote's own otherwise; the quote becomes superseded (an
 * accepted one's stock released), all in one transaction. Conflict, and nothing written, if the
 * quote is no longer in one of `from` or, with `expectedVersion`, no longer at that version.
 */
export async function insertRevision(
  shopId: string,
  id: string,
  userId: string,
  opts: {
    from: readonly QuoteStatus[];
    expectedVersion?: number;
    edit?: { validUntil?: string; notes?: string; lines?: QuoteLineInput[] };
  },
) {
  return db.transaction(async (tx) => {
    const q = await lockQuote(tx, shopId, id);
    if (
      !opts.from.includes(q.status) ||
      (opts.expectedVersion !== undefined && q.version !== opts.expectedVersion)
    )
      throw changedMeanwhile(q);
    await applyStatus(tx, q, "superseded", userId);
    const edit = opts.edit ?? {};
    const [rev] = await tx
      .insert(quotes)
      .values({
        shopId,
        number: q.number,
        revision: q.revision + 1,
        customerId: q.customerId,
        buildId: q.buildId,
        currency: q.currency,
        taxRateBp: q.taxRateBp,
        validUntil: edit.validUntil ?? q.validUntil,
        notes: edit.notes ?? q.notes,
        subtotalMinor: q.subtotalMinor,
        discountMinor: q.discountMinor,
        taxMinor: q.taxMinor,
        totalMinor: q.totalMinor,
        createdBy: userId,
      })
      .returning();
    if (edit.lines) {
      const totals = await writeLines(tx, shopId, rev!.id, edit.lines, q.taxRateBp);
      const [done] = await tx.update(quotes).set(totals).where(eq(quotes.id, rev!.id)).returning();
      return done!;
    }
    const lines = await tx
      .select()
      .from(quoteLines)
      .where(eq(quoteLines.quoteId, id))
      .orderBy(asc(quoteLines.position));
    if (lines.length)
      await tx
        .insert(quoteLines)
        .values(
          lines.map(({ id: _id, quoteId: _q, ...l }) => ({ ...l, heldQty: 0, quoteId: rev!.id })),
        );
    return rev!;
  });
}

/** The newest revision of a quote number in the shop: what a superseded revision points to. */
export async function latestRevision(shopId: string, number: number) {
  const [row] = await db
    .select({
      id: quotes.id,
      revision: quotes.revision,
      status: quotes.status,
      validUntil: quotes.validUntil,
    })
    .from(quotes)
    .where(and(eq(quotes.shopId, shopId), eq(quotes.number, number)))
    .orderBy(desc(quotes.revision))
    .limit(1);
  return row ?? null;
}

/**
 * One revision of a quote number with its lines (in order): the revision before a new one,
 * which is what the customer was sent. Null when the shop has no such revision.
 */
export async function getRevisionLines(shopId: string, number: number, revision: number) {
  const [q] = await db
    .select({
      id: quotes.id,
      revision: quotes.revision,
      status: quotes.status,
      currency: quotes.currency,
      taxRateBp: quotes.taxRateBp,
    })
    .from(quotes)
    .where(and(eq(quotes.shopId, shopId), eq(quotes.number, number), eq(quotes.revision, revision)))
    .limit(1);
  if (!q) return null;
  const lines = await db
    .select()
    .from(quoteLines)
    .where(and(eq(quoteLines.shopId, shopId), eq(quoteLines.quoteId, q.id)))
    .orderBy(asc(quoteLines.position));
  return { ...q, lines };
}

/** The open portal invitation of this shop for this e-mail, if there is one. */
export async function findPortalInvitation(shopId: string, email: string) {
  const [open] = await db
    .select({ id: invitation.id })
    .from(invitation)
    .where(
      and(
        eq(invitation.organizationId, shopId),
        eq(invitation.email, email.trim().toLowerCase()),
        eq(invitation.role, "customer"),
        eq(invitation.status, "pending"),
        gt(invitation.expiresAt, new Date()),
      ),
    )
    .limit(1);
  return open ?? null;
}

/** How long a portal invitation sent with a quote stays open. */
const INVITATION_DAYS = 14;

/**
 * After the mail server took the e-mail: logs it, records the portal invitation it carried (if
 * new) and moves a draft to sent, in one transaction.
 */
export async function recordQuoteSent(
  shopId: string,
  id: string,
  userId: string,
  msg: { to: string; subject: string; messageId: string | null },
  newInvitation: { id: string; email: string } | null,
) {
  return db.transaction(async (tx) => {
    const q = await lockQuote(tx, shopId, id);
    if (newInvitation)
      await tx
        .insert(invitation)
        .values({
          id: newInvitation.id,
          organizationId: shopId,
          email: newInvitation.email.trim().toLowerCase(),
          role: "customer",
          status: "pending",
          expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000),
          inviterId: userId,
        })
        .onConflictDoNothing();
    await tx.insert(quoteMessages).values({
      shopId,
      quoteId: id,
      to: msg.to,
      subject: msg.subject,
      messageId: msg.messageId,
      sentBy: userId,
    });
    return q.status === "draft" ? applyStatus(tx, q, "sent", userId) : q;
  });
}

/**
 * Sent or accepted quotes past their date become expired (accepted ones release their stock),
 * in one transaction: one shop's, or every shop's when no shop is named (the clock's sweep).
 * "Past" is judged on each shop's own calendar: the instant `at` read in the shop's time zone
 * (a quote valid until the 3rd is still open at 5 pm on the 3rd in Los Angeles, when it is
 * already the 4th in UTC). Rows another transaction holds are left to it. Returns the expired ids.
 */
export async function expireQuotes(at: Date, shopId?: string): Promise<string[]> {
  const shopDay = sql`(${at.toISOString()}::timestamptz at time zone coalesce((select ${shopSettings.timeZone} from ${shopSettings} where ${shopSettings.shopId} = ${quotes.shopId}), 'UTC'))::date`;
  return db.transaction(async (tx) => {
    const due = await tx
      .select()
      .from(quotes)
      .where(
        and(
          shopId ? eq(quotes.shopId, shopId) : undefined,
          inArray(quotes.status, ["sent", "accepted"]),
          lt(quotes.validUntil, shopDay),
        ),
      )
      .orderBy(asc(quotes.id))
      .for("update", { skipLocked: true });
    const heldByShop = new Map<string, string[]>();
    for (const q of due) {
      if (stockSign(q.status, "expired") !== -1) continue;
      heldByShop.set(q.shopId, [...(heldByShop.get(q.shopId) ?? []), q.id]);
    }
    for (const [shop, held] of heldByShop) await moveReservation(tx, shop, held, -1);
    for (const q of due) await writeStatus(tx, q, "expired", null);
    return due.map((q) => q.id);
  });
}

/** Units of each part held by a build's quotes (accepted, deposit paid, ordered), by part id. */
export async function heldForBuild(shopId: string, buildId: string): Promise<Map<string, number>> {
  const rows = await db
    .select({ partId: quoteLines.partId, held: sql<number>`sum(${quoteLines.heldQty})::int` })
    .from(quoteLines)
    .innerJoin(quotes, eq(quotes.id, quoteLines.quoteId))
    .where(
      and(
        eq(quoteLines.shopId, shopId),
        eq(quotes.shopId, shopId),
        eq(quotes.buildId, buildId),
        gt(quoteLines.heldQty, 0),
      ),
    )
    .groupBy(quoteLines.partId);
  return new Map(rows.flatMap((r) => (r.partId ? [[r.partId, Number(r.held)]] : [])));
}
