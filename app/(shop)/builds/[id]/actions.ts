"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";

import { ConflictError, getBuild, saveBuild } from "@/db/queries/builds";
import { userName } from "@/db/queries/preferences";
import { requireMember } from "@/lib/auth/member";
import { checkTransition, sizeForSave } from "@/lib/builds/service";
import { zodIssues } from "@/lib/http/error-map";
import { HttpError } from "@/lib/http/http-error";
import { BuildSaveSchema } from "@/lib/validations/builds";

export type SaveBuildState =
  | { ok: true; version: number; message: string }
  | {
      ok: false;
      status?: number;
      message: string;
      fieldErrors?: Record<string, string>;
      conflict?: {
        version: number;
        updatedAt: string;
        title: string;
        authorName: string | null;
        inputs: unknown;
      };
    };

/** Saves the editor's build: validated and sized again on the server, written with its revision. */
export async function saveBuildAction(buildId: string, body: unknown): Promise<SaveBuildState> {
  let m;
  try {
    m = await requireMember("builds:write");
  } catch (e) {
    if (e instanceof HttpError) return { ok: false, status: e.status, message: e.message };
    throw e;
  }
  const id = z.uuid().safeParse(buildId);
  const parsed = BuildSaveSchema.safeParse(body);
  if (!id.success) return { ok: false, status: 404, message: "That build was not found" };
  if (!parsed.success)
    return {
      ok: false,
      status: 422,
      message: "Check the highlighted fields",
      fieldErrors: Object.fromEntries(zodIssues(parsed.error).map((i) => [i.path, i.message])),
    };
  try {
    const row = await getBuild(m.shopId, id.data);
    if (!row) return { ok: false, status: 404, message: "That build was not found" };
    checkTransition(row.build.status, parsed.data.status);
    const sized = sizeForSave(parsed.data.inputs);
    const b = await saveBuild(m.shopId, id.data, m.user.id, parsed.data.version, {
      ...parsed.data,
      ...sized,
    });
    revalidatePath(`/builds/${id.data}`);
    revalidatePath("/builds");
    return { ok: true, version: b.version, message: `Saved as version ${b.version}` };
  } catch (e) {
    if (e instanceof ConflictError) {
      return {
        ok: false,
        status: 409,
        message: e.message,
        conflict: {
          version: e.current.version,
          updatedAt: e.current.updatedAt.toISOString(),
          title: e.current.title,
          authorName: await userName(e.current.updatedBy),
          inputs: e.current.inputs,
        },
      };
    }
    if (e instanceof HttpError) return { ok: false, status: e.status, message: e.message };
    console.error(e);
    return {
      ok: false,
      status: 500,
      message: "Saving failed on our side; your entries are kept — try again",
    };
  }
}
