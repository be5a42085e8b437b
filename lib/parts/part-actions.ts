"use server";

import { revalidatePath } from "next/cache";

import { memberAction } from "@/lib/actions/member-action";
import { PATHS } from "@/lib/cache-tags";
import { createPart, deletePart, updatePart } from "@/lib/parts/part-commands";
import { FlatPartSchema, PartIdSchema, PartUpdateSchema } from "@/lib/validations/parts";

/** The part form's writes (components/parts/part-form.tsx): adapters over lib/parts/part-commands. */

export const createPartAction = memberAction(FlatPartSchema, async (m, input) => {
  const part = await createPart(m, input);
  revalidatePath(PATHS.parts);
  return { id: part.id };
});

/** Only the fields sent change: the form's save never clears what it does not show. */
export const updatePartAction = memberAction(PartUpdateSchema, async (m, input) => {
  const part = await updatePart(m, input);
  revalidatePath(PATHS.parts);
  revalidatePath(PATHS.part(part.id));
  return { id: part.id };
});

export const deletePartAction = memberAction(PartIdSchema, async (m, input) => {
  await deletePart(m, input);
  revalidatePath(PATHS.parts);
});
