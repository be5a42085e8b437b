import { requireMember } from "@/lib/auth/member";
import { analyseDatalog } from "@/lib/dyno/dyno-commands";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { DatalogAnalysisSchema } from "@/lib/validations/datalogs";

/** POST { mapping } — analyse the log against its build (measured vs predicted); the mapping is remembered for this logger. */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const input = DatalogAnalysisSchema.parse({
    ...((await readJson(req)) as object),
    id: await uuidParam(ctx, "That datalog"),
  });
  return Response.json(await analyseDatalog(m, input));
});
