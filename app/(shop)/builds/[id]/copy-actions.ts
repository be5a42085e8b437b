"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";

import { createBuild, getBuild } from "@/db/queries/builds";
import { requireMember } from "@/lib/auth/member";
import { sizeForSave } from "@/lib/builds/service";
import type { FuelSystemInput } from "@/lib/calc";
import { HttpError } from "@/lib/http/http-error";

/** "Power step": a new build for the same car, starting from this build's inputs. */
export async function copyBuildAction(
  buildId: string,
): Promise<{ ok: false; status: number; message: string }> {
  let target: string;
  try {
    const m = await requireMember("builds:write");
    const id = z.uuid().parse(buildId);
    const row = await getBuild(m.shopId, id);
    if (!row) return { ok: false, status: 404, message: "That build was not found" };
    const copy = await createBuild(m.shopId, m.user.id, {
      customerId: row.build.customerId,
      title: `${row.build.title} — next step`.slice(0, 120),
      vehicle: row.build.vehicle ?? undefined,
      ...sizeForSave(row.build.inputs as FuelSystemInput),
    });
    revalidatePath("/builds");
    target = `/builds/${copy.id}`;
  } catch (e) {
    if (e instanceof HttpError) return { ok: false, status: e.status, message: e.message };
    if (e instanceof z.ZodError)
      return { ok: false, status: 404, message: "That build was not found" };
    throw e;
  }
  redirect(target);
}
