import { getBuild, listRevisions } from "@/db/queries/builds";
import { NotFoundError } from "@/lib/auth/errors";
import { requireMember } from "@/lib/auth/member";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";

export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("builds:read");
  const id = await uuidParam(ctx, "That build");
  if (!(await getBuild(m.shopId, id))) throw new NotFoundError("That build");
  return Response.json({ revisions: await listRevisions(m.shopId, id) });
});
