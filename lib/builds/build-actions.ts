"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";

import { memberAction } from "@/lib/actions/member-action";
import { BuildRefSchema, BuildSaveSchema } from "@/lib/validations/builds";
import { KitChoiceSchema } from "@/lib/validations/kit";

import { copyBuild, saveBuild } from "./build-commands";
import { chooseKit } from "./kit-commands";

/** The build editor's save: `{ build }` on success, a 409 state with `current` on a stale version. */
export const saveBuildAction = memberAction(BuildSaveSchema, async (m, input) => {
  const out = await saveBuild(m, input);
  revalidatePath(`/builds/${input.id}`);
  revalidatePath("/builds");
  return out;
});

/** "Copy as next power step": a new build from this one's inputs, then opens it. */
export const copyBuildAction = memberAction(BuildRefSchema, async (m, input) => {
  const { build } = await copyBuild(m, input);
  revalidatePath("/builds");
  redirect(`/builds/${build.id}`);
});

/** The kit picker's "Use these parts": a new revision with the parts' data. */
export const chooseKitAction = memberAction(KitChoiceSchema, async (m, input) => {
  const out = await chooseKit(m, input);
  revalidatePath(`/builds/${input.id}`);
  revalidatePath(`/builds/${input.id}/kit`);
  return out;
});
