"use server";

import { revalidatePath } from "next/cache";

import { memberAction } from "@/lib/actions/member-action";
import { PATHS } from "@/lib/cache-tags";
import {
  NextPowerStepSchema,
  TuneLimitsSaveSchema,
  TunePullRefSchema,
  TunePullUpdateSchema,
} from "@/lib/validations/tune";

import {
  copyAsNextPowerStep,
  deleteTunePull,
  saveTuneLimits,
  updateTunePull,
} from "./tune-commands";

/** The tune session's pull editor and "Exclude": `{ pull }`. */
export const updateTunePullAction = memberAction(TunePullUpdateSchema, (m, input) =>
  updateTunePull(m, input),
);

/** "Delete pull" (after its confirmation): `{ deleted }`. */
export const deleteTunePullAction = memberAction(TunePullRefSchema, (m, input) =>
  deleteTunePull(m, input),
);

/**
 * The limits editors: the build's own limits (the session's), or — the owner, from the session
 * or the Settings page — the shop's defaults.
 */
export const saveTuneLimitsAction = memberAction(TuneLimitsSaveSchema, async (m, input) => {
  const out = await saveTuneLimits(m, input);
  if (input.buildId) revalidatePath(`/builds/${input.buildId}/dyno`);
  if (input.scope === "shop") revalidatePath(PATHS.settings);
  return out;
});

/** "Copy as next power step": `{ build }`, the new step linked back to this one. */
export const nextPowerStepAction = memberAction(NextPowerStepSchema, async (m, input) => {
  const out = await copyAsNextPowerStep(m, input);
  revalidatePath("/builds");
  return out;
});
