import { and, asc, eq, inArray, sql } from "drizzle-orm";

import { db } from "@/db";
import { mailLog, member, shopNoticeSubscribers, user } from "@/db/schema";
import type { MailRecord, NoticeKind } from "@/lib/domain/operations";
import { STAFF_ROLES } from "@/lib/domain/roles";

/**
 * Takes the right to send one notice: a row per (record, notice, occasion, recipient), made
 * here once. Returns the row when this call made it (send it), null when it was already there
 * (sent, being sent, or failed and waiting for a retry) — so a notice goes out once, whatever
 * runs twice.
 */
export async function claimNotice(v: {
  shopId: string;
  recordKind: MailRecord;
  recordId: string;
  notice: NoticeKind;
  occasion?: string;
  to: string;
  subject: string;
  body: string;
}) {
  const [row] = await db
    .insert(mailLog)
    .values({ ...v, occasion: v.occasion ?? "" })
    .onConflictDoNothing()
    .returning();
  return row ?? null;
}

/** A failed notice taken back for another try (null: not failed, or another try has it). */
export async function claimRetry(shopId: string, id: string) {
  const [row] = await db
    .update(mailLog)
    .set({ status: "pending" })
    .where(and(eq(mailLog.shopId, shopId), eq(mailLog.id, id), eq(mailLog.status, "failed")))
    .returning();
  return row ?? null;
}

/** How a send went: sent with the server's message id, or failed with why. */
export async function settleNotice(
  id: string,
  outcome: { ok: true; messageId: string | null } | { ok: false; error: string },
) {
  await db
    .update(mailLog)
    .set({
      status: outcome.ok ? "sent" : "failed",
      attempts: sql`${mailLog.attempts} + 1`,
      ...(outcome.ok
        ? { messageId: outcome.messageId, sentAt: new Date(), error: null }
        : { error: outcome.error.slice(0, 500) }),
    })
    .where(eq(mailLog.id, id));
}

export async function getMail(shopId: string, id: string) {
  const [row] = await db
    .select()
    .from(mailLog)
    .where(and(eq(mailLog.shopId, shopId), eq(mailLog.id, id)))
    .limit(1);
  return row ?? null;
}

/** The e-mails logged on records, oldest first. */
export async function mailOf(shopId: string, recordIds: string[]) {
  if (recordIds.length === 0) return [];
  return db
    .select()
    .from(mailLog)
    .where(and(eq(mailLog.shopId, shopId), inArray(mailLog.recordId, recordIds)))
    .orderBy(asc(mailLog.createdAt));
}

/** Staff of the shop who asked for its notices: their e-mail addresses. */
export async function noticeSubscribers(shopId: string): Promise<string[]> {
  const rows = await db
    .select({ email: user.email })
    .from(shopNoticeSubscribers)
    .innerJoin(user, eq(user.id, shopNoticeSubscribers.userId))
    .innerJoin(
      member,
      and(eq(member.userId, shopNoticeSubscribers.userId), eq(member.organizationId, shopId)),
    )
    .where(and(eq(shopNoticeSubscribers.shopId, shopId), inArray(member.role, [...STAFF_ROLES])));
  return rows.map((r) => r.email);
}

export async function isNoticeSubscriber(shopId: string, userId: string) {
  const [row] = await db
    .select({ userId: shopNoticeSubscribers.userId })
    .from(shopNoticeSubscribers)
    .where(and(eq(shopNoticeSubscribers.shopId, shopId), eq(shopNoticeSubscribers.userId, userId)))
    .limit(1);
  return Boolean(row);
}

/** Turns a member's shop notices on or off (choosing what they have writes nothing). */
export async function setNoticeSubscription(shopId: string, userId: string, on: boolean) {
  if (on) await db.insert(shopNoticeSubscribers).values({ shopId, userId }).onConflictDoNothing();
  else
    await db
      .delete(shopNoticeSubscribers)
      .where(
        and(eq(shopNoticeSubscribers.shopId, shopId), eq(shopNoticeSubscribers.userId, userId)),
      );
}
