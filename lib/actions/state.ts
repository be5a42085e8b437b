import type { FieldIssue } from "@/lib/domain/errors";

/** What every server action returns to its form or caller. Never carries secrets. */
export interface ActionState<T = unknown> {
  ok: boolean;
  /** On a refusal, the status the API would answer with (401, 403, 404, 409, 422, 502, 503). */
  status?: number;
  /** On a refusal, the API's error code (`not_found`, `conflict`, `invalid_input`…). */
  code?: string;
  message?: string;
  /** Messages per field path (`inputs.engine.cylinders`); "form" for the input as a whole. */
  fieldErrors?: Record<string, string[]>;
  /** What the person typed, so a refused form loses nothing. */
  values?: Record<string, string>;
  /** On success: what the command returned (ids, the new version). */
  data?: T;
  /** On a conflict: the record as it is now. */
  current?: unknown;
}

export const initialActionState: ActionState = { ok: false };

/** Field issues as every field's messages, not only the first. */
export function fieldErrorsOf(issues: FieldIssue[]): Record<string, string[]> {
  const out = new Map<string, string[]>();
  for (const i of issues) {
    const key = i.path === "(body)" ? "form" : i.path;
    out.set(key, [...(out.get(key) ?? []), i.message]);
  }
  return Object.fromEntries(out);
}
