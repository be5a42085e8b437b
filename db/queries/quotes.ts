import { and, asc, desc, eq, inArray, lt, ne, sql } from "drizzle-orm";
import type { z } from "zod";

import { db } from "@/db";
import {
  builds,
  customers,
  parts,
  quoteLines,
  quoteMessages,
  quotes,
  shopCounters,
  shopSettings,
} from "@/db/schema";
import { quoteTotals } from "@/lib/catalog/quote-totals";
import {
  QUOTE_EDITABLE,
  QUOTE_HOLDS_STOCK,
  QUOTE_NEXT,
  QUOTE_STATUS_LABELS,
  type QuoteStatus,
} from "@/lib/domain/quotes";
import { HttpError } from "@/lib/http/http-error";
import { type QuoteLineSchema } from "@/lib/validations/quotes";

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];
export type QuoteLineInput = z.output<typeof QuoteLineSchema>;

export class QuoteConflictError extends HttpError {
  constructor(current: number) {
    super(
      409,
      "conflict",
      `Someone changed this quote meanwhile (now version ${current}); nothing was overwritten`,
    );
  }
}

/** The next number of a per-shop counter, inside the caller's transaction (row-locked: no gaps, no duplicates). */
async function nextNumber(tx: Tx, shopId: string, name: string): Promise<number> {
  const [row] = await tx
    .insert(shopCounters)
    .values({ shopId, name, value: 1 })
    .onConflictDoUpdate({
      target: [shopCounters.shopId, shopCounters.name],
      set: { value: sql`${shopCounters.value} + 1` },
    })
    .returning({ value: shopCounters.value });
  return row!.value;
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
      if (found.length !== partIds.length)
        throw new HttpError(
          422,
          "invalid_input",
          "A line names a part that is not in this shop's catalog",
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
  const t = quoteTotals(lines, taxRateBp);
  return {
    subtotalMinor: t.subtotalMinor,
    discountMinor: t.discountMinor,
    taxMinor: t.taxMinor,
    totalMinor: t.totalMinor,
  };
}

const addDays = (days: number) => new Date(Date.now() + days * 86400000).toISOString().slice(0, 10);

/** A new draft quote with the next number of the shop. */
export async function createQuote(
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
    if (!c) throw new HttpError(422, "invalid_input", "That customer is not in this shop");
    const [s] = await tx
      .select()
      .from(shopSettings)
      .where(eq(shopSettings.shopId, shopId))
      .limit(1);
    const number = await nextNumber(tx, shopId, "quote");
    const [q] = await tx
      .insert(quotes)
      .values({
        shopId,
        number,
        customerId: v.customerId,
        buildId: v.buildId ?? null,
        currency: s?.currency ?? "USD",
        taxRateBp: s?.taxRateBp ?? 0,
        validUntil: v.validUntil ?? addDays(s?.quoteValidDays ?? 30),
        notes: v.notes ?? null,
        createdBy: userId,
      })
      .returning();
    const totals = await writeLines(tx, shopId, q!.id, v.lines, q!.taxRateBp);
    const [done] = await tx.update(quotes).set(totals).where(eq(quotes.id, q!.id)).returning();
    return done!;
  });
}

export async function listQuotes(
  shopId: string,
  opts: { portalUserId?: string; status?: QuoteStatus; buildId?: string } = {},
) {
  await expireQuotes(shopId);
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
      customerName: customers.name,
      buildId: quotes.buildId,
      buildTitle: builds.title,
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
        opts.status ? eq(quotes.status, opts.status) : undefined,
        opts.buildId ? eq(quotes.buildId, opts.buildId) : undefined,
      ),
    )
    .orderBy(desc(quotes.number), desc(quotes.revision))
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

/** Replaces lines, validity and notes while the quote is still open to edits (draft or sent). */
export async function updateQuote(
  shopId: string,
  id: string,
  expectedVersion: number,
  v: { validUntil: string; notes?: string; lines: QuoteLineInput[] },
) {
  return db.transaction(async (tx) => {
    const [q] = await tx
      .select()
      .from(quotes)
      .where(and(eq(quotes.shopId, shopId), eq(quotes.id, id)))
      .for("update")
      .limit(1);
    if (!q) throw new HttpError(404, "not_found", "That quote was not found");
    if (!QUOTE_EDITABLE.includes(q.status))
      throw new HttpError(
        409,
        "locked",
        `A quote that is ${QUOTE_STATUS_LABELS[q.status].toLowerCase()} cannot be edited; make a new revision of it instead`,
      );
    if (q.version !== expectedVersion) throw new QuoteConflictError(q.version);
    const totals = await writeLines(tx, shopId, id, v.lines, q.taxRateBp);
    const [done] = await tx
      .update(quotes)
      .set({
        ...totals,
        validUntil: v.validUntil,
        notes: v.notes ?? null,
        version: q.version + 1,
        updatedAt: new Date(),
      })
      .where(eq(quotes.id, id))
      .returning();
    return done!;
  });
}

/** Holds (+1) or releases (−1) the stock of a quote's part lines. */
async function moveReservation(tx: Tx, shopId: string, quoteId: string, sign: 1 | -1) {
  const lines = await tx
    .select({ partId: quoteLines.partId, quantityMilli: quoteLines.quantityMilli })
    .from(quoteLines)
    .where(
      and(
        eq(quoteLines.shopId, shopId),
        eq(quoteLines.quoteId, quoteId),
        eq(quoteLines.kind, "part"),
      ),
    );
  const byPart = new Map<string, number>();
  for (const l of lines)
    if (l.partId)
      byPart.set(l.partId, (byPart.get(l.partId) ?? 0) + Math.ceil(l.quantityMilli / 1000));
  for (const [partId, qty] of [...byPart].sort(([a], [b]) => a.localeCompare(b))) {
    await tx
      .update(parts)
      .set({ reserved: sql`greatest(0, ${parts.reserved} + ${sign * qty})` })
      .where(and(eq(parts.shopId, shopId), eq(parts.id, partId)));
  }
}

/** Moves a quote along its workflow; accepting holds stock, declining or expiring an accepted quote releases it. */
export async function setQuoteStatus(
  shopId: string,
  id: string,
  userId: string | null,
  to: QuoteStatus,
  opts: { portalUserId?: string } = {},
) {
  return db.transaction(async (tx) => {
    const [q] = await tx
      .select()
      .from(quotes)
      .where(and(eq(quotes.shopId, shopId), eq(quotes.id, id)))
      .for("update")
      .limit(1);
    if (!q) throw new HttpError(404, "not_found", "That quote was not found");
    if (opts.portalUserId) {
      const [c] = await tx
        .select({ userId: customers.userId })
        .from(customers)
        .where(eq(customers.id, q.customerId))
        .limit(1);
      if (c?.userId !== opts.portalUserId)
        throw new HttpError(404, "not_found", "That quote was not found");
    }
    if (q.status === to) return q;
    if (!QUOTE_NEXT[q.status].includes(to))
      throw new HttpError(
        422,
        "invalid_transition",
        `A quote cannot go from ${QUOTE_STATUS_LABELS[q.status]} to ${QUOTE_STATUS_LABELS[to]}`,
      );
    const held = QUOTE_HOLDS_STOCK.includes(q.status);
    const holds = QUOTE_HOLDS_STOCK.includes(to);
    if (!held && holds) await moveReservation(tx, shopId, id, 1);
    if (held && !holds) await moveReservation(tx, shopId, id, -1);
    const [done] = await tx
      .update(quotes)
      .set({
        status: to,
        statusChangedAt: new Date(),
        statusChangedBy: userId,
        version: q.version + 1,
        updatedAt: new Date(),
      })
      .where(eq(quotes.id, id))
      .returning();
    return done!;
  });
}

/** A new editable revision of a locked quote (same number); the old one is replaced and its stock released. */
export async function reviseQuote(shopId: string, id: string, userId: string) {
  return db.transaction(async (tx) => {
    const [q] = await tx
      .select()
      .from(quotes)
      .where(and(eq(quotes.shopId, shopId), eq(quotes.id, id)))
      .for("update")
      .limit(1);
    if (!q) throw new HttpError(404, "not_found", "That quote was not found");
    if (q.status !== "accepted")
      throw new HttpError(
        422,
        "invalid_transition",
        "Only an accepted quote is revised; edit a draft or sent quote directly",
      );
    await moveReservation(tx, shopId, id, -1);
    await tx
      .update(quotes)
      .set({
        status: "superseded",
        statusChangedAt: new Date(),
        statusChangedBy: userId,
        version: q.version + 1,
        updatedAt: new Date(),
      })
      .where(eq(quotes.id, id));
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
        validUntil: q.validUntil,
        notes: q.notes,
        subtotalMinor: q.subtotalMinor,
        discountMinor: q.discountMinor,
        taxMinor: q.taxMinor,
        totalMinor: q.totalMinor,
        createdBy: userId,
      })
      .returning();
    const lines = await tx
      .select()
      .from(quoteLines)
      .where(eq(quoteLines.quoteId, id))
      .orderBy(asc(quoteLines.position));
    if (lines.length)
      await tx
        .insert(quoteLines)
        .values(lines.map(({ id: _id, quoteId: _q, ...l }) => ({ ...l, quoteId: rev!.id })));
    return rev!;
  });
}

/** Records a sent e-mail and moves a draft to sent, in one transaction. */
export async function recordQuoteSent(
  shopId: string,
  id: string,
  userId: string,
  msg: { to: string; subject: string; messageId: string | null },
) {
  return db.transaction(async (tx) => {
    await tx.insert(quoteMessages).values({
      shopId,
      quoteId: id,
      to: msg.to,
      subject: msg.subject,
      messageId: msg.messageId,
      sentBy: userId,
    });
    const [q] = await tx
      .select()
      .from(quotes)
      .where(and(eq(quotes.shopId, shopId), eq(quotes.id, id)))
      .for("update")
      .limit(1);
    if (q && q.status === "draft")
      await tx
        .update(quotes)
        .set({
          status: "sent",
          statusChangedAt: new Date(),
          statusChangedBy: userId,
          version: q.version + 1,
          updatedAt: new Date(),
        })
        .where(eq(quotes.id, id));
  });
}

/** Sent or accepted quotes past their date expire (accepted ones release their stock). */
export async function expireQuotes(shopId: string) {
  const today = new Date().toISOString().slice(0, 10);
  const due = await db
    .select({ id: quotes.id })
    .from(quotes)
    .where(
      and(
        eq(quotes.shopId, shopId),
        inArray(quotes.status, ["sent", "accepted"]),
        lt(quotes.validUntil, today),
      ),
    );
  for (const q of due) await setQuoteStatus(shopId, q.id, null, "expired").catch(() => undefined);
}
