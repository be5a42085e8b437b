/** What every server action returns to its form. Never carries secrets. */
export interface ActionState {
  ok: boolean;
  /** On a refusal, the status the API would answer with (401, 403, 404, 409, 422). */
  status?: number;
  message?: string;
  fieldErrors?: Record<string, string[]>;
  values?: Record<string, string>;
}

export const initialActionState: ActionState = { ok: false };
