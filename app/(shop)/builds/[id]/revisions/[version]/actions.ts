"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";

import { memberAction } from "@/lib/actions/member-action";
import { restoreRevision } from "@/lib/builds/build-commands";
import { RevisionRestoreSchema } from "@/lib/validations/builds";

/** Restores an earlier revision's inputs as a new revision (re-sized with today's library). */
export const restoreRevisionAction = memberAction(RevisionRestoreSchema, async (m, input) => {
  await restoreRevision(m, input);
  revalidatePath(`/builds/${input.buildId}`);
  redirect(`/builds/${input.buildId}`);
});
