import "server-only";

import {
  claimNotice,
  claimRetry,
  getMail,
  noticeSubscribers,
  setNoticeSubscription,
  settleNotice,
} from "@/db/queries/mail-log";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { Conflict, NotFound } from "@/lib/domain/errors";
import type { MailRecord, NoticeKind } from "@/lib/domain/operations";
import { sendMail } from "@/lib/mail";

import { noticeEmail, type NoticeData } from "./notice-email";
import { noticeFiles, type AttachmentMaker } from "./notice-files";

/**
 * Every notice after the deposit goes through here: logged on its record (`mail_log`) once per
 * record, notice, occasion and recipient; sent through the one mail path; a failed send is
 * logged `failed`, changes nothing else, and is sent again by `retryNotice`. Notices are sent
 * after the write they tell of is committed, and never make it fail.
 */

async function send(
  id: string,
  msg: { to: string; subject: string; text: string },
  files?: AttachmentMaker,
): Promise<"sent" | "failed"> {
  try {
    const attachments = files ? await files() : undefined;
    const { messageId } = await sendMail({
      ...msg,
      ...(attachments?.length ? { attachments } : {}),
    });
    await settleNotice(id, { ok: true, messageId });
    return "sent";
  } catch (e) {
    const why =
      (e as { code?: string }).code === "ECONNREFUSED"
        ? "the mail server is not answering"
        : ((e as Error).message ?? "the mail server refused it");
    console.warn(`notice ${id} not sent: ${why}`);
    await settleNotice(id, { ok: false, error: why }).catch(() => undefined);
    return "failed";
  }
}

export interface NoticeTarget {
  shopId: string;
  recordKind: MailRecord;
  recordId: string;
  /** Tells apart notices of one kind on one record (a receipt per payment). */
  occasion?: string;
}

/**
 * Sends one notice to each address once: "sent", "failed" (logged, to retry) or "already" (the
 * log has it). Addresses that are empty are skipped.
 */
export async function deliverNotice(
  target: NoticeTarget,
  to: (string | null | undefined)[],
  data: NoticeData,
  files?: AttachmentMaker,
): Promise<("sent" | "failed" | "already")[]> {
  const { subject, text } = noticeEmail(data);
  const out: ("sent" | "failed" | "already")[] = [];
  for (const addr of new Set(to.filter((t): t is string => Boolean(t)))) {
    try {
      const row = await claimNotice({
        ...target,
        notice: data.kind,
        to: addr,
        subject,
        body: text,
      });
      out.push(row ? await send(row.id, { to: addr, subject, text }, files) : "already");
    } catch (e) {
      // The log itself failed (the database away): the notice is lost for now, the write stands.
      console.error(`notice ${data.kind} on ${target.recordId} not logged:`, (e as Error).message);
      out.push("failed");
    }
  }
  return out;
}

/** The shop's notice to every member who asked for it. */
export async function notifyShop(target: NoticeTarget, data: NoticeData) {
  const to = await noticeSubscribers(target.shopId).catch(() => [] as string[]);
  return deliverNotice(target, to, data);
}

/** Sends a failed notice again, as it was written (its files made anew). */
export async function retryNotice(
  member: Member,
  input: { id: string },
): Promise<{ status: "sent" | "failed" }> {
  authorize(member, "notices:manage");
  const row = await getMail(member.shopId, input.id);
  if (!row) throw new NotFound("That e-mail");
  if (row.status !== "failed")
    throw new Conflict(
      row.status === "sent" ? "This e-mail was sent already" : "This e-mail is being sent",
      "not_failed",
    );
  const mine = await claimRetry(member.shopId, row.id);
  if (!mine) throw new Conflict("This e-mail is being sent", "not_failed");
  const files = noticeFiles(row.notice, row.shopId, row.recordId);
  return {
    status: await send(row.id, { to: row.to, subject: row.subject, text: row.body }, files),
  };
}

/** A staff member chooses whether to get the shop's notices. */
export async function setShopNotices(member: Member, input: { on: boolean }) {
  authorize(member, "notices:manage");
  await setNoticeSubscription(member.shopId, member.user.id, input.on);
  return { on: input.on };
}
