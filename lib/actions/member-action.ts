import "server-only";

import { unstable_rethrow } from "next/navigation";
import type { z } from "zod";

import { HttpError } from "@/lib/auth/errors";
import { requireMember, type Member } from "@/lib/auth/member";
import type { Action } from "@/lib/auth/permissions";

import type { ActionState } from "./state";

/** Form data as a plain object of strings (files dropped). */
export function formValues(form: FormData): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of form.entries())
    if (typeof v === "string" && !k.startsWith("$ACTION")) out[k] = v;
  return out;
}

/** Every field's messages, not only the first. */
export function fieldErrorsOf(err: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const i of err.issues) {
    const key = i.path.map(String).join(".") || "form";
    (out[key] ??= []).push(i.message);
  }
  return out;
}

/**
 * The one wrapper for server actions: session → role check → zod parse → run.
 * Bad input comes back as field errors with the values typed, so nothing is lost.
 */
export function memberAction<S extends z.ZodType>(
  action: Action,
  schema: S,
  run: (data: z.output<S>, member: Member, form: FormData) => Promise<ActionState | void>,
) {
  return async (_prev: ActionState, form: FormData): Promise<ActionState> => {
    const values = formValues(form);
    let member: Member;
    try {
      member = await requireMember(action);
    } catch (e) {
      if (e instanceof HttpError)
        return { ok: false, status: e.status, message: e.message, values };
      throw e;
    }
    const parsed = schema.safeParse(values);
    if (!parsed.success)
      return {
        ok: false,
        status: 422,
        message: "Check the highlighted fields",
        fieldErrors: fieldErrorsOf(parsed.error),
        values,
      };
    try {
      return (await run(parsed.data, member, form)) ?? { ok: true };
    } catch (e) {
      unstable_rethrow(e); // redirect() and notFound() are control flow, not failures
      if (e instanceof HttpError)
        return { ok: false, status: e.status, message: e.message, values };
      console.error(e);
      return {
        ok: false,
        message: "Saving failed on our side; your entries are kept — try again",
        values,
      };
    }
  };
}
