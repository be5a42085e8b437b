"use server";

import { redirect } from "next/navigation";
import { z } from "zod";

import {
  acceptInvitation,
  acceptInvitationSignedIn,
  signUp,
} from "@/lib/accounts/account-commands";
import { errorState, formValues } from "@/lib/actions/member-action";
import type { ActionState } from "@/lib/actions/state";
import { Invalid, NotFound } from "@/lib/domain/errors";
import { controlCharacterIssues } from "@/lib/http/text";
import { AcceptInvitationSchema, SignUpSchema } from "@/lib/validations/auth";

// For signed-out visitors: no member to ask for, so these adapt the commands themselves.

/** What the form gets back on a refusal: never the password, and our own failures in words. */
function refusal(e: unknown, values: Record<string, string> | undefined, failed: string) {
  const state = errorState(e, values);
  return state.status === 500 ? { ...state, message: failed } : state;
}

/** The form's fields as strings (anything else sent is no form: nothing to keep). */
const fieldsOf = (input: unknown) => (input instanceof FormData ? formValues(input) : {});

/** The form parsed as members' forms are: control characters refused, then the schema. */
function parseForm<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
  const fields = fieldsOf(input);
  const issues = controlCharacterIssues(fields);
  if (issues.length) throw new Invalid("Some fields carry control characters", issues);
  return schema.parse(fields);
}

function withoutPassword(input: unknown): Record<string, string> {
  const values = fieldsOf(input);
  delete values.password;
  return values;
}

/** Sign-up: a new account and a new shop, with the new user as its owner. */
export async function signUpAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  let email: string;
  try {
    ({ email } = await signUp(parseForm(SignUpSchema, form)));
  } catch (e) {
    return refusal(e, withoutPassword(form), "Sign-up failed on our side; try again");
  }
  redirect(`/check-email?email=${encodeURIComponent(email)}`);
}

/** A new person accepts an invitation: sets a name and password, joins the shop with the invited role. */
export async function acceptInvitationAction(
  _prev: ActionState,
  form: FormData,
): Promise<ActionState> {
  try {
    await acceptInvitation(parseForm(AcceptInvitationSchema, form));
  } catch (e) {
    return refusal(e, withoutPassword(form), "Joining failed on our side; try again");
  }
  redirect("/");
}

/** Someone already signed in accepts an invitation sent to their own address. */
export async function acceptAsSignedInAction(invitationId: unknown): Promise<ActionState> {
  try {
    // An invitation's id is letters, digits, - and _ (better-auth's, or a UUID): anything else
    // (a NUL reached PostgreSQL: 500) is no invitation.
    const id = z
      .string()
      .regex(/^[\w-]{1,100}$/)
      .safeParse(invitationId);
    if (!id.success) throw new NotFound("That invitation");
    await acceptInvitationSignedIn({ invitationId: id.data });
  } catch (e) {
    return refusal(e, undefined, "Joining failed on our side; try again");
  }
  redirect("/");
}
