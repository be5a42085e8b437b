import { requireMember } from "@/lib/auth/member";
import { verifyBuildWithDatalog } from "@/lib/dyno/dyno-commands";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";

/** POST — mark the log's build verified with this analysed log attached (a fitted build only). */
export const POST = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember();
  return Response.json(
    await verifyBuildWithDatalog(m, { id: await uuidParam(ctx, "That datalog") }),
  );
});
