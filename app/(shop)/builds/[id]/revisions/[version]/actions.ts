"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";

import { ConflictError, getRevision, saveBuild } from "@/db/queries/builds";
import { requireMember } from "@/lib/auth/member";
import { sizeForSave } from "@/lib/builds/service";
import type { FuelSystemInput } from "@/lib/calc";
import { HttpError } from "@/lib/http/http-error";

const RestoreSchema = z.object({
  buildId: z.uuid(),
  version: z.number().int().min(1),
  currentVersion: z.number().int().min(1),
});

/** Restores an earlier revision's inputs as a new revision (re-sized with today's library). */
export async function restoreRevisionAction(args: {
  buildId: string;
  version: number;
  currentVersion: number;
}): Promise<{ ok: false; status: number; message: string }> {
  let target: string;
  try {
    const m = await requireMember("builds:write");
    const a = RestoreSchema.parse(args);
    const rev = await getRevision(m.shopId, a.buildId, a.version);
    if (!rev) return { ok: false, status: 404, message: "That revision was not found" };
    await saveBuild(m.shopId, a.buildId, m.user.id, a.currentVersion, {
      ...sizeForSave(rev.inputs as FuelSystemInput),
      parts: rev.parts,
      note: `Restored from version ${a.version}`,
    });
    revalidatePath(`/builds/${a.buildId}`);
    target = `/builds/${a.buildId}`;
  } catch (e) {
    if (e instanceof ConflictError) return { ok: false, status: 409, message: e.message };
    if (e instanceof HttpError) return { ok: false, status: e.status, message: e.message };
    if (e instanceof z.ZodError)
      return { ok: false, status: 404, message: "That revision was not found" };
    throw e;
  }
  redirect(target);
}
