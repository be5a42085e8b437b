import { insertShareLink, markShareLinkRevoked } from "@/db/queries/shares";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { serverEnv } from "@/lib/env";
import type { ShareLinkCreate, ShareLinkRevoke } from "@/lib/validations/shares";

export interface CreatedShareLink {
  link: { id: string; expiresAt: string };
  /** The only time the link's URL is shown: the database keeps its hash alone. */
  url: string;
}

/** A new expiring link to one of the shop's builds' spec sheet; NotFound for another shop's build. */
export async function createShareLink(
  member: Member,
  input: ShareLinkCreate,
): Promise<CreatedShareLink> {
  authorize(member, "shares:manage");
  const { link, token } = await insertShareLink(
    member.shopId,
    input.buildId,
    member.user.id,
    input.days,
  );
  return {
    link: { id: link.id, expiresAt: link.expiresAt.toISOString() },
    url: `${serverEnv().APP_URL}/share/${token}`,
  };
}

/** Withdraws a link at once; NotFound when it is not one of the shop's. */
export async function revokeShareLink(
  member: Member,
  input: ShareLinkRevoke,
): Promise<{ id: string }> {
  authorize(member, "shares:manage");
  await markShareLinkRevoked(member.shopId, input.id);
  return { id: input.id };
}
