"use server";

import { revalidatePath } from "next/cache";

import { memberAction } from "@/lib/actions/member-action";
import { JobFitSchema, JobOpenSchema } from "@/lib/validations/operations";

import { fitJob, openJob } from "./job-commands";
import { jobData } from "./job-data";

/** The server actions of jobs: thin adapters over lib/jobs/job-commands.ts (as /api/v1/jobs). */

function revalidateJob(id: string) {
  revalidatePath("/jobs");
  revalidatePath(`/jobs/${id}`);
  revalidatePath(`/my/jobs/${id}`);
}

/** { quoteId } of a quote whose deposit is paid → the new job. */
export const openJobAction = memberAction(JobOpenSchema, async (m, input) => {
  const job = jobData(await openJob(m, input));
  revalidateJob(job.id);
  revalidatePath(`/quotes/${input.quoteId}`);
  return job;
});

/** { id, version, parts, labourMilli, notes? } → the fitted job. */
export const fitJobAction = memberAction(JobFitSchema, async (m, input) => {
  const job = jobData(await fitJob(m, input));
  revalidateJob(job.id);
  return job;
});
