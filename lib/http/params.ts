import { z } from "zod";

import { NotFound } from "@/lib/domain/errors";

export type IdCtx = { params: Promise<{ id: string }> };

/** The route's `[id]` as a UUID; anything else is simply "not found" (as is another shop's row). */
export async function uuidParam(ctx: IdCtx, what: string): Promise<string> {
  const parsed = z.uuid().safeParse((await ctx.params).id);
  if (!parsed.success) throw new NotFound(what);
  return parsed.data;
}
