import { NotFound } from "@/lib/domain/errors";
import { parseId } from "@/lib/ids";

export type IdCtx = { params: Promise<{ id: string }> };

/** The route's `[id]` as a UUID; anything else is simply "not found" (as is another shop's row). */
export async function uuidParam(ctx: IdCtx, what: string): Promise<string> {
  const id = parseId((await ctx.params).id);
  if (!id) throw new NotFound(what);
  return id;
}
