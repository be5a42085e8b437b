import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { fitJob } from "@/lib/jobs/job-commands";
import { jobData } from "@/lib/jobs/job-data";
import { JobFitSchema } from "@/lib/validations/operations";

/**
 * POST { version, parts: [{ partId, quantity }], labourMilli, notes? } — the job is fitted with
 * the parts actually fitted: stock issued, the build moved to fitted with them.
 */
export const POST = handle<IdCtx>(async (req, ctx) => {
  const m = await requireMember();
  const id = await uuidParam(ctx, "That job");
  const body = await readJson(req);
  const input = JobFitSchema.parse({ ...(body && typeof body === "object" ? body : {}), id });
  return Response.json({ job: jobData(await fitJob(m, input)) });
});
