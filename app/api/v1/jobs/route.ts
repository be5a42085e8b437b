import { listJobs } from "@/db/queries/jobs";
import { requireMember } from "@/lib/auth/member";
import { ownRecordsOnly } from "@/lib/auth/permissions";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { openJob } from "@/lib/jobs/job-commands";
import { jobData } from "@/lib/jobs/job-data";
import { JobOpenSchema } from "@/lib/validations/operations";

/** GET — the shop's jobs; a customer's own only. */
export const GET = handle(async () => {
  const m = await requireMember("jobs:view");
  const rows = await listJobs(m.shopId, ownRecordsOnly(m.role) ? m.user.id : undefined);
  return Response.json({ jobs: rows.map((r) => jobData(r)) });
});

/** POST { quoteId } — a job from a quote whose deposit is paid. */
export const POST = handle(async (req) => {
  const m = await requireMember();
  const input = JobOpenSchema.parse(await readJson(req));
  return Response.json({ job: jobData(await openJob(m, input)) }, { status: 201 });
});
