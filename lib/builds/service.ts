import {
  CALC_VERSION,
  FuelSystemInputSchema,
  sizeParsedFuelSystem,
  type FuelSystemInput,
} from "@/lib/calc";
import { STATUS_LABELS, STATUS_NEXT, type BuildStatus } from "@/lib/domain/builds";
import { HttpError } from "@/lib/http/http-error";

/** Validates and sizes inputs on the server — the same library the browser ran. */
export function sizeForSave(inputs: FuelSystemInput) {
  const parsed = FuelSystemInputSchema.parse(inputs);
  return { inputs: parsed, result: sizeParsedFuelSystem(parsed), calcVersion: CALC_VERSION };
}

/** Refuses a status move the workflow does not allow. */
export function checkTransition(from: BuildStatus, to: BuildStatus | undefined): void {
  if (!to || to === from) return;
  if (!STATUS_NEXT[from].includes(to)) {
    throw new HttpError(
      422,
      "invalid_transition",
      `A build cannot go from ${STATUS_LABELS[from]} to ${STATUS_LABELS[to]}`,
    );
  }
}
