import "server-only";

import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { cache } from "react";

import { sessionMembership } from "@/db/queries/members";
import { auth } from "@/lib/auth/server";
import { Forbidden, Unauthorized } from "@/lib/domain/errors";
import { isRole, type Role } from "@/lib/domain/roles";

import { can, type Action } from "./permissions";

export interface Member {
  user: { id: string; name: string; email: string };
  shopId: string;
  shopName: string;
  role: Role;
}

/** Who is signed in, in which shop, with which role — or null. One look-up per request. */
export const currentMember = cache(async (): Promise<Member | null> => {
  const session = await auth.api.getSession({ headers: await headers() });
  if (!session) return null;
  const m = await sessionMembership(session.user.id, session.session.activeOrganizationId ?? null);
  if (!m || !isRole(m.role)) return null;
  return {
    user: { id: session.user.id, name: session.user.name, email: session.user.email },
    shopId: m.shopId,
    shopName: m.shopName,
    role: m.role,
  };
});

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
