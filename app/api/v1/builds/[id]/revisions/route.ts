import { getBuild, listRevisions } from "@/db/queries/builds";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { NotFound } from "@/lib/domain/errors";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";

export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("builds:view");
  const id = await uuidParam(ctx, "That build");
  if (!(await getBuild(m.shopId, id, ownRecordsOnly(m.role) ? m.user.id : undefined)))
    throw new NotFound("That build");
  return Response.json({ revisions: await listRevisions(m.shopId, id) });
});
