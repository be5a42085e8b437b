import { APIError } from "better-auth/api";
import { headers } from "next/headers";
import type { z } from "zod";

import { sessionMembership } from "@/db/queries/members";
import {
  acceptInvitationFor,
  createShopWithOwner,
  findUserByEmail,
  getInvitation,
} from "@/db/queries/shops";
import { auth } from "@/lib/auth/server";
import {
  Conflict,
  Forbidden,
  Invalid,
  InvalidTransition,
  NotFound,
  RateLimited,
  Unauthorized,
} from "@/lib/domain/errors";
import type { AcceptInvitationSchema, SignUpSchema } from "@/lib/validations/auth";

/**
 * Accounts for people not signed in yet: signing up (a new shop with its owner) and joining a
 * shop by invitation. No member to authorize: each checks its own input (the invitation's id
 * is the secret of the e-mailed link).
 */

type Invitation = NonNullable<Awaited<ReturnType<typeof getInvitation>>>;

/** Why an invitation can no longer be accepted, in words for the person holding it; or null. */
export function invitationProblem(inv: Invitation | null, now = new Date()): string | null {
  if (!inv) return "This invitation does not exist.";
  if (inv.invitation.status !== "pending")
    return "This invitation has already been used or withdrawn.";
  if (inv.invitation.expiresAt.getTime() < now.getTime())
    return "This invitation has expired; ask the shop for a new one.";
  return null;
}

/** The invitation, still open; else NotFound or InvalidTransition with the reason. */
async function openInvitation(id: string): Promise<Invitation> {
  const inv = await getInvitation(id);
  const problem = invitationProblem(inv);
  if (!inv) throw new NotFound("That invitation");
  if (problem) throw new InvalidTransition(problem, "invitation_closed", "invitationId");
  return inv;
}

/** better-auth's refusals as our errors (its other failures pass through unchanged). */
function authRefusal(e: unknown, fallback: string): unknown {
  if (!(e instanceof APIError)) return e;
  if (e.statusCode === 429)
    return new RateLimited(
      e.message || undefined,
      Number(new Headers(e.headers as HeadersInit | undefined).get("retry-after")) || 10,
    );
  const code = (e.body as { code?: string } | undefined)?.code ?? "";
  if (code.includes("USER_ALREADY_EXISTS"))
    return new Invalid(
      "Check the highlighted fields",
      [{ path: "email", message: "An account with this e-mail already exists — sign in instead" }],
      "email_taken",
    );
  return new Invalid(e.message || fallback, [], "refused");
}

/**
 * Sign-up: a new account and a new shop, with the new person as its owner (e-mail to confirm).
 * better-auth's sign-up limit for the client's address applies here as on its HTTP endpoint
 * (lib/auth/auth-hooks.ts): a refusal is RateLimited (429) and creates nothing.
 */
export async function signUp(
  input: z.output<typeof SignUpSchema>,
): Promise<{ email: string; shopId: string | null }> {
  const { name, email, password, shopName } = input;
  let userId: string;
  try {
    const res = await auth.api.signUpEmail({
      body: { name, email, password, callbackURL: "/" },
      headers: await headers(),
    });
    userId = res.user.id;
  } catch (e) {
    throw authRefusal(e, "Sign-up was refused");
  }
  // An address that already has an account gets better-auth's look-alike answer (a made-up
  // user, nothing stored), so that signing up never tells who has an account: no shop either,
  // and the same "check your e-mail" as for a new one (was a 500: the made-up user has no row).
  if ((await findUserByEmail(email))?.id !== userId) return { email, shopId: null };
  return { email, shopId: await createShopWithOwner(userId, shopName) };
}

/**
 * A new person accepts an invitation: sets a name and password, joins the shop with the invited
 * role (the link proved the e-mail) and is signed in.
 */
export async function acceptInvitation(
  input: z.output<typeof AcceptInvitationSchema>,
): Promise<{ shopId: string }> {
  const inv = await openInvitation(input.invitationId);
  const email = inv.invitation.email;
  if (await findUserByEmail(email))
    throw new Conflict(
      "This e-mail already has an account: sign in first, then open the invitation link again.",
      "account_exists",
    );
  try {
    const res = await auth.api.signUpEmail({
      body: { name: input.name, email, password: input.password },
      headers: await headers(),
    });
    await acceptInvitationFor(res.user.id, inv.invitation);
    await auth.api.signInEmail({
      body: { email, password: input.password },
      headers: await headers(),
    });
  } catch (e) {
    throw authRefusal(e, "Joining was refused");
  }
  return { shopId: inv.invitation.organizationId };
}

/** Someone already signed in accepts an invitation sent to their own address. */
export async function acceptInvitationSignedIn(input: {
  invitationId: string;
}): Promise<{ shopId: string }> {
  const inv = await openInvitation(input.invitationId);
  const session = await auth.api.getSession({ headers: await headers() });
  const email = inv.invitation.email;
  if (!session) throw new Unauthorized(`Sign in as ${email} to accept this invitation.`);
  if (session.user.email !== email)
    throw new Forbidden(`Sign in as ${email} to accept this invitation.`);
  const shopId = inv.invitation.organizationId;
  if (await sessionMembership(session.user.id, shopId))
    throw new Conflict("You are already a member of this shop.", "already_member");
  await acceptInvitationFor(session.user.id, inv.invitation);
  return { shopId };
}
