"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";

import { memberAction } from "@/lib/actions/member-action";
import { createBuild, createDraftBuild } from "@/lib/builds/build-commands";
import { BuildCreateSchema, BuildDraftFormSchema } from "@/lib/validations/builds";

/** The new-build form: a build with the default inputs for the chosen customer, then opens it. */
export const createBuildAction = memberAction(
  BuildCreateSchema.omit({ inputs: true }),
  async (m, input) => {
    const { build } = await createBuild(m, input);
    revalidatePath("/builds");
    redirect(`/builds/${build.id}`);
  },
);

/**
 * The counter's form: a draft build from the caller's goal (and their vehicle, picked or added),
 * in "needs sizing" for a tuner; then opens it.
 */
export const createDraftBuildAction = memberAction(BuildDraftFormSchema, async (m, input) => {
  const { build } = await createDraftBuild(m, input);
  revalidatePath("/builds");
  revalidatePath(`/customers/${input.customerId}`);
  redirect(`/builds/${build.id}`);
});
