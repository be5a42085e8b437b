import { requireMember } from "@/lib/auth/member";
import { verifyWithDatalog } from "@/lib/dyno/service";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";

/** POST — mark the log's build verified with this analysed log attached (a fitted build only). */
export const POST = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("datalogs:upload");
  const build = await verifyWithDatalog(m.shopId, m.user.id, await uuidParam(ctx, "That datalog"));
  return Response.json({ build });
});
