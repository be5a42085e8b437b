"use server";

import { APIError } from "better-auth/api";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { z } from "zod";

import {
  acceptInvitationFor,
  createShopWithOwner,
  findUserByEmail,
  getInvitation,
} from "@/db/queries/shops";
import { fieldErrorsOf, formValues } from "@/lib/actions/member-action";
import type { ActionState } from "@/lib/actions/state";
import { auth } from "@/lib/auth";
import { currentMember } from "@/lib/auth/member";
import { zodIssues } from "@/lib/http/error-map";
import { AcceptInvitationSchema, SignUpSchema } from "@/lib/validations/auth";

/** Sign-up: a new account and a new shop, with the new user as its owner. */
export async function signUpAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  const values = formValues(form);
  delete values.password;
  const parsed = SignUpSchema.safeParse(formValues(form));
  if (!parsed.success)
    return {
      ok: false,
      message: "Check the highlighted fields",
      fieldErrors: fieldErrorsOf(zodIssues(parsed.error)),
      values,
    };
  const { name, email, password, shopName } = parsed.data;
  try {
    const res = await auth.api.signUpEmail({
      body: { name, email, password, callbackURL: "/" },
      headers: await headers(),
    });
    await createShopWithOwner(res.user.id, shopName);
  } catch (e) {
    if (e instanceof APIError) {
      const code = (e.body as { code?: string } | undefined)?.code;
      if (code?.includes("USER_ALREADY_EXISTS"))
        return {
          ok: false,
          message: "Check the highlighted fields",
          fieldErrors: { email: ["An account with this e-mail already exists — sign in instead"] },
          values,
        };
      return { ok: false, message: e.message || "Sign-up was refused", values };
    }
    console.error(e);
    return { ok: false, message: "Sign-up failed on our side; try again", values };
  }
  redirect(`/check-email?email=${encodeURIComponent(email)}`);
}

function invitationProblem(inv: Awaited<ReturnType<typeof getInvitation>>): string | null {
  if (!inv) return "This invitation does not exist.";
  if (inv.invitation.status !== "pending")
    return "This invitation has already been used or withdrawn.";
  if (inv.invitation.expiresAt.getTime() < Date.now())
    return "This invitation has expired; ask the shop for a new one.";
  return null;
}

/** A new person accepts an invitation: sets a name and password, joins the shop with the invited role. */
export async function acceptInvitationAction(
  _prev: ActionState,
  form: FormData,
): Promise<ActionState> {
  const values = formValues(form);
  delete values.password;
  const parsed = AcceptInvitationSchema.safeParse(formValues(form));
  if (!parsed.success)
    return {
      ok: false,
      message: "Check the highlighted fields",
      fieldErrors: fieldErrorsOf(zodIssues(parsed.error)),
      values,
    };
  const inv = await getInvitation(parsed.data.invitationId);
  const problem = invitationProblem(inv);
  if (problem || !inv) return { ok: false, message: problem ?? "Invitation not found", values };
  const email = inv.invitation.email;
  if (await findUserByEmail(email))
    return {
      ok: false,
      message:
        "This e-mail already has an account: sign in first, then open the invitation link again.",
      values,
    };
  try {
    const res = await auth.api.signUpEmail({
      body: { name: parsed.data.name, email, password: parsed.data.password },
      headers: await headers(),
    });
    await acceptInvitationFor(res.user.id, inv.invitation);
    await auth.api.signInEmail({
      body: { email, password: parsed.data.password },
      headers: await headers(),
    });
  } catch (e) {
    console.error(e);
    return { ok: false, message: "Joining failed on our side; try again", values };
  }
  redirect("/");
}

/** Someone already signed in accepts an invitation sent to their own address. */
export async function acceptAsSignedInAction(invitationId: string): Promise<ActionState> {
  if (!z.string().min(1).max(100).safeParse(invitationId).success)
    return { ok: false, status: 404, message: "Invitation not found" };
  const m = await currentMember();
  const session = await auth.api.getSession({ headers: await headers() });
  const inv = await getInvitation(invitationId);
  const problem = invitationProblem(inv);
  if (problem || !inv) return { ok: false, message: problem ?? "Invitation not found" };
  if (!session || session.user.email !== inv.invitation.email)
    return { ok: false, message: `Sign in as ${inv.invitation.email} to accept this invitation.` };
  if (m?.shopId === inv.invitation.organizationId)
    return { ok: false, message: "You are already a member of this shop." };
  await acceptInvitationFor(session.user.id, inv.invitation);
  redirect("/");
}
