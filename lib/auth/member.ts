import "server-only";

import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { cache } from "react";

import { sessionMemberByToken, sessionMembership } from "@/db/queries/members";
import { auth } from "@/lib/auth/server";
import { Forbidden, Unauthorized } from "@/lib/domain/errors";
import { isRole, type Role } from "@/lib/domain/roles";

import { can, type Action } from "./permissions";
import { cookieValue, signedSessionToken } from "./session-cookie";

export interface Member {
  user: { id: string; name: string; email: string };
  shopId: string;
  shopName: string;
  role: Role;
}

/** Who is signed in, in which shop, with which role — or null. One look-up per request. */
export const currentMember = cache(async (): Promise<Member | null> => {
  const h = await headers();
  const quick = await memberInOneTrip(h);
  if (quick !== "ask-the-library") return quick;
  const session = await auth.api.getSession({ headers: h });
  if (!session) return null;
  const m = await sessionMembership(session.user.id, session.session.activeOrganizationId ?? null);
  return asMember(session.user, m);
});

function asMember(
  user: { id: string; name: string; email: string },
  m: { role: string | null; shopId: string | null; shopName: string | null } | null,
): Member | null {
  if (!m || !m.shopId || m.shopName === null || !isRole(m.role)) return null;
  return {
    user: { id: user.id, name: user.name, email: user.email },
    shopId: m.shopId,
    shopName: m.shopName,
    role: m.role,
  };
}

/**
 * The signed-in member from the session cookie and one query (session, person and membership
 * together). Whenever the auth library would do more than read — a session past its end (it
 * deletes it), one due for its daily extension (it writes the new end and the cookie) — or the
 * cookie names no session at all (it clears the cookie), the answer is "ask-the-library", and
 * the caller takes the library's own path. Revocation stays immediate: every request reads the
 * session row.
 */
async function memberInOneTrip(h: Headers): Promise<Member | null | "ask-the-library"> {
  const ctx = await auth.$context;
  const cookies = h.get("cookie");
  const token = signedSessionToken(cookies, ctx.authCookies.sessionToken.name, ctx.secret);
  if (!token) return null;
  const row = await sessionMemberByToken(token);
  if (!row) return "ask-the-library";
  const now = Date.now();
  if (row.expiresAt.getTime() <= now) return "ask-the-library";
  const { expiresIn, updateAge } = ctx.sessionConfig;
  const dueForExtension = row.expiresAt.getTime() - expiresIn * 1000 + updateAge * 1000 <= now;
  const remembered = cookieValue(cookies, ctx.authCookies.dontRememberToken.name) === null;
  if (dueForExtension && remembered) return "ask-the-library";
  return asMember({ id: row.userId, name: row.userName, email: row.userEmail }, row);
}

/** For route handlers and server actions: the member, allowed to take `action`; else Unauthorized or Forbidden. */
export async function requireMember(action?: Action): Promise<Member> {
  const m = await currentMember();
  if (!m) throw new Unauthorized();
  if (action && !can(m.role, action)) throw new Forbidden();
  return m;
}

/** For pages: redirect to sign-in when signed out, home when the role may not see the page. */
export async function requirePageMember(action?: Action): Promise<Member> {
  const m = await currentMember();
  if (!m) redirect("/sign-in");
  if (action && !can(m.role, action)) redirect(m.role === "customer" ? "/my" : "/");
  return m;
}
