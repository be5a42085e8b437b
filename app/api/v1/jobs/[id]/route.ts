import { getJob } from "@/db/queries/jobs";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { NotFound } from "@/lib/domain/errors";
import { handle } from "@/lib/http/handler";
import { uuidParam, type IdCtx } from "@/lib/http/params";
import { jobData } from "@/lib/jobs/job-data";

/** GET — the job with its lines: wanted, allocated and (once fitted) fitted. A customer: their own. */
export const GET = handle<IdCtx>(async (_req, ctx) => {
  const m = await requireMember("jobs:view");
  const j = await getJob(
    m.shopId,
    await uuidParam(ctx, "That job"),
    ownRecordsOnly(m.role) ? m.user.id : undefined,
  );
  if (!j) throw new NotFound("That job");
  return Response.json({ job: jobData(j) });
});
