import "server-only";

import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { cache } from "react";

import { sessionMemberByToken, sessionMembership } from "@/db/queries/members";
import type { ShopSizingColumns } from "@/db/schema";
import { auth } from "@/lib/auth/server";
import { Forbidden, Unauthorized } from "@/lib/domain/errors";
import { isRole, type Role } from "@/lib/domain/roles";
import {
  LIBRARY_SIZING_SETTINGS,
  sizingSettingsOf,
  type SizingSettings,
} from "@/lib/sizing/effective-inputs";
import { shopSizingSettings } from "@/lib/sizing/shop-sizing";

import { can, type Action } from "./permissions";
import { cookieValue, signedSessionToken } from "./session-cookie";

export interface Member {
  user: { id: string; name: string; email: string };
  shopId: string;
  shopName: string;
  role: Role;
}

/**
 * One request's session look-up: the member, and — when the one-trip path found it — the sizing
 * columns of its shop's settings, read by the same query (null: the shop has no settings row;
 * undefined: not read, the auth library's path found the member).
 */
interface SessionLookup {
  member: Member | null;
  shopSizing?: ShopSizingColumns | null;
}

const sessionLookup = cache(async (): Promise<SessionLookup> => {
  const h = await headers();
  const quick = await memberInOneTrip(h);
  if (quick !== "ask-the-library") return quick;
  const session = await auth.api.getSession({ headers: h });
  if (!session) return { member: null };
  const m = await sessionMembership(session.user.id, session.session.activeOrganizationId ?? null);
  return { member: asMember(session.user, m) };
});

/** Who is signed in, in which shop, with which role — or null. One look-up per request. */
export const currentMember = cache(async (): Promise<Member | null> => {
  return (await sessionLookup()).member;
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
async function memberInOneTrip(h: Headers): Promise<SessionLookup | "ask-the-library"> {
  const ctx = await auth.$context;
  const cookies = h.get("cookie");
  const token = signedSessionToken(cookies, ctx.authCookies.sessionToken.name, ctx.secret);
  if (!token) return { member: null };
  const row = await sessionMemberByToken(token);
  if (!row) return "ask-the-library";
  const now = Date.now();
  if (row.expiresAt.getTime() <= now) return "ask-the-library";
  const { expiresIn, updateAge } = ctx.sessionConfig;
  const dueForExtension = row.expiresAt.getTime() - expiresIn * 1000 + updateAge * 1000 <= now;
  const remembered = cookieValue(cookies, ctx.authCookies.dontRememberToken.name) === null;
  if (dueForExtension && remembered) return "ask-the-library";
  const member = asMember({ id: row.userId, name: row.userName, email: row.userEmail }, row);
  return { member, shopSizing: member ? row.shopSizing : undefined };
}

/** For route handlers and server actions: the member, allowed to take `action`; else Unauthorized or Forbidden. */
export async function requireMember(action?: Action): Promise<Member> {
  const m = await currentMember();
  if (!m) throw new Unauthorized();
  if (action && !can(m.role, action)) throw new Forbidden();
  return m;
}

/**
 * For the sizing route: the member, allowed to take `action` (else Unauthorized or Forbidden),
 * and its shop's sizing settings — read by the session's own query, so sizing costs one round
 * trip in all; only when the auth library's path found the member are they read apart.
 */
export async function requireSizingMember(
  action: Action,
): Promise<{ member: Member; sizing: SizingSettings }> {
  // One look-up (React's cache does not span a route handler's calls, so it is not asked twice).
  const { member, shopSizing } = await sessionLookup();
  if (!member) throw new Unauthorized();
  if (!can(member.role, action)) throw new Forbidden();
  if (shopSizing === undefined) return { member, sizing: await shopSizingSettings(member.shopId) };
  return { member, sizing: shopSizing ? sizingSettingsOf(shopSizing) : LIBRARY_SIZING_SETTINGS };
}

/** For pages: redirect to sign-in when signed out, home when the role may not see the page. */
export async function requirePageMember(action?: Action): Promise<Member> {
  const m = await currentMember();
  if (!m) redirect("/sign-in");
  if (action && !can(m.role, action)) redirect(m.role === "customer" ? "/my" : "/");
  return m;
}
