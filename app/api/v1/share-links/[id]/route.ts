import { revokeShareLink } from "@/db/queries/shares";
import { requireMember } from "@/lib/auth/member";
import { NotFound } from "@/lib/domain/errors";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";

/** DELETE — revokes a share link at once. */
export const DELETE = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("shares:manage");
  if (!(await revokeShareLink(m.shopId, await uuidParam(ctx, "That link"))))
    throw new NotFound("That link");
  return new Response(null, { status: 204 });
});
