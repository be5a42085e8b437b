import { requireMember } from "@/lib/auth/member";
import { datalogView } from "@/lib/dyno/log-analysis";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";

/** GET — a datalog's facts, its headers and units row, and the mapping to start from. */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("datalogs:read");
  return Response.json(await datalogView(m.shopId, await uuidParam(ctx, "That datalog")));
});
