"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";

import { memberAction } from "@/lib/actions/member-action";
import { createBuild } from "@/lib/builds/build-commands";
import { BuildCreateSchema } from "@/lib/validations/builds";

/** The new-build form: a build with the default inputs for the chosen customer, then opens it. */
export const createBuildAction = memberAction(
  BuildCreateSchema.omit({ inputs: true }),
  async (m, input) => {
    const { build } = await createBuild(m, input);
    revalidatePath("/builds");
    redirect(`/builds/${build.id}`);
  },
);
