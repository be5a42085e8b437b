"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";

import { createBuild } from "@/db/queries/builds";
import { memberAction } from "@/lib/actions/member-action";
import { newBuildInputs } from "@/lib/builds/defaults";
import { sizeForSave } from "@/lib/builds/service";
import { BuildCreateSchema } from "@/lib/validations/builds";

export const createBuildAction = memberAction(
  "builds:write",
  BuildCreateSchema.omit({ inputs: true }),
  async (data, m) => {
    const b = await createBuild(m.shopId, m.user.id, { ...data, ...sizeForSave(newBuildInputs()) });
    revalidatePath("/builds");
    redirect(`/builds/${b.id}`);
  },
);
