import { requireMember } from "@/lib/auth/member";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { revokeShareLink } from "@/lib/shares/share-commands";

/** DELETE — revokes a share link at once. */
export const DELETE = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember();
  await revokeShareLink(m, { id: await uuidParam(ctx, "That link") });
  return new Response(null, { status: 204 });
});
