import { randomBytes } from "node:crypto";

import type { z } from "zod";

import {
  removeMember as deleteMember,
  hasOpenInvitation,
  insertInvitation,
  isMemberByEmail,
  setMemberRole,
} from "@/db/queries/members";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { Invalid, Unavailable } from "@/lib/domain/errors";
import { sendMail } from "@/lib/mail";
import type {
  InviteSchema,
  MemberRemoveSchema,
  MemberRoleSchema,
} from "@/lib/validations/settings";

import { INVITATION_DAYS, invitationMail } from "./invitation-mail";

/**
 * Invites someone to the shop with a role. The e-mail goes first and the invitation is recorded
 * only when the mail server took it, so a failed send leaves nothing pending behind.
 */
export async function inviteMember(
  member: Member,
  input: z.output<typeof InviteSchema>,
): Promise<{ email: string; expiresAt: string }> {
  authorize(member, "members:manage");
  const { email, role } = input;
  if (await isMemberByEmail(member.shopId, email))
    throw refused("email", `${email} is already a member of this shop`, "already_member");
  if (await hasOpenInvitation(member.shopId, email))
    throw refused("email", `${email} already has an invitation waiting`, "already_invited");
  const id = randomBytes(24).toString("base64url");
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 86_400_000);
  try {
    await sendMail(
      invitationMail({
        id,
        email,
        role,
        shopName: member.shopName,
        inviterName: member.user.name,
      }),
    );
  } catch (e) {
    console.error(e);
    throw new Unavailable("The invitation e-mail could not be sent; try again", "mail_failed");
  }
  await insertInvitation(member.shopId, {
    id,
    email,
    role,
    inviterId: member.user.id,
    expiresAt,
  });
  return { email, expiresAt: expiresAt.toISOString() };
}

/** Gives a member of the shop another role; the shop keeps at least one owner. */
export async function changeMemberRole(
  member: Member,
  input: z.output<typeof MemberRoleSchema>,
): Promise<{ changed: boolean }> {
  authorize(member, "members:manage");
  return { changed: await setMemberRole(member.shopId, input.memberId, input.role) };
}

/** Removes a member from the shop; the shop keeps at least one owner. */
export async function removeMember(
  member: Member,
  input: z.output<typeof MemberRemoveSchema>,
): Promise<{ removed: string }> {
  authorize(member, "members:manage");
  await deleteMember(member.shopId, input.memberId);
  return { removed: input.memberId };
}

/** One field refused, with the form's usual headline. */
function refused(path: string, message: string, code: string) {
  return new Invalid("Check the highlighted fields", [{ path, message }], code);
}
