import "server-only";

import { unstable_rethrow } from "next/navigation";
import type { z } from "zod";

import { requireMember, type Member } from "@/lib/auth/member";
import { Invalid } from "@/lib/domain/errors";
import { describeError } from "@/lib/http/error-map";
import { controlCharacterIssues } from "@/lib/http/text";

import { fieldErrorsOf, type ActionState } from "./state";

/** Form data as a plain object of strings (files and React's own fields dropped). */
export function formValues(form: FormData): Record<string, string> {
  // A Map, then own properties: a field named "__proto__" or "constructor" stays a field.
  const out = new Map<string, string>();
  for (const [k, v] of form.entries())
    if (typeof v === "string" && !k.startsWith("$ACTION")) out.set(k, v);
  return Object.fromEntries(out);
}

/** The one mapper's answer for an action: a refused ActionState with the values kept. */
export function errorState(err: unknown, values?: Record<string, string>): ActionState {
  unstable_rethrow(err); // redirect() and notFound() are control flow, not failures
  const d = describeError(err);
  const message =
    d.status === 500
      ? "Saving failed on our side; your entries are kept — try again"
      : d.code === "invalid_input" &&
          d.issues.length > 0 &&
          d.message === "Some fields are not valid"
        ? "Check the highlighted fields"
        : d.message;
  return {
    ok: false,
    status: d.status,
    code: d.code,
    message,
    ...(d.issues.length ? { fieldErrors: fieldErrorsOf(d.issues) } : {}),
    ...(values ? { values } : {}),
    ...(d.current === undefined ? {} : { current: d.current }),
  };
}

/**
 * The one wrapper for server actions, a thin adapter over a command: session → zod parse →
 * run (the command checks the role and the state) → ActionState. Takes FormData (forms with
 * `useActionState`) or a plain object (calls through `useTransition`). Bad input comes back as
 * field errors with the values typed, so nothing is lost.
 */
export function memberAction<S extends z.ZodType, T>(
  schema: S,
  run: (member: Member, data: z.output<S>) => Promise<ActionState<T> | T | void>,
) {
  return async (_prev: ActionState, input: unknown): Promise<ActionState<T>> => {
    const values = input instanceof FormData ? formValues(input) : undefined;
    try {
      const member = await requireMember();
      const issues = controlCharacterIssues(values ?? input);
      if (issues.length) throw new Invalid("Some fields carry control characters", issues);
      const data = schema.parse(values ?? input);
      const out = await run(member, data);
      if (out && typeof out === "object" && "ok" in out) return out as ActionState<T>;
      return { ok: true, ...(out === undefined ? {} : { data: out as T }) };
    } catch (e) {
      return errorState(e, values) as ActionState<T>;
    }
  };
}
