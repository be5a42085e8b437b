import "server-only";

import { fitJobRow, getJob, insertJob } from "@/db/queries/jobs";
import { getPartsByIds } from "@/db/queries/parts";
import { getQuote } from "@/db/queries/quotes";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { Invalid, InvalidTransition, NotFound } from "@/lib/domain/errors";
import { jobLabel } from "@/lib/domain/operations";
import { serverEnv } from "@/lib/env";
import { deliverNotice } from "@/lib/notices/notice-commands";
import type { JobFit } from "@/lib/validations/operations";

/**
 * Every write on a job: opening it from a paid quote, and fitting it (stock issued, the build
 * moved to fitted). The customer is told when it is ready to fit and when it is fitted.
 */

async function tellCustomer(
  m: Member,
  jobId: string,
  kind: "ready_to_fit" | "fitted",
  parts: string[] = [],
) {
  const job = await getJob(m.shopId, jobId);
  if (!job) return;
  await deliverNotice(
    { shopId: m.shopId, recordKind: "job", recordId: jobId },
    [job.customerEmail],
    {
      kind,
      shopName: m.shopName,
      customerName: job.customerName,
      job: jobLabel(job.job.number),
      buildTitle: job.buildTitle,
      parts,
      link: `${serverEnv().APP_URL}/my/jobs/${jobId}`,
    },
  );
}

/**
 * A job from a quote whose deposit is paid (one per quote): parts the quote holds are allocated,
 * the rest wait for stock (a purchase order's receipt allocates them in acceptance order). The
 * quote and its build move to ordered.
 */
export async function openJob(m: Member, input: { quoteId: string }) {
  authorize(m, "jobs:write");
  if (!(await getQuote(m.shopId, input.quoteId)))
    throw Invalid.field("quoteId", "That quote is not in this shop");
  const job = await insertJob(m.shopId, m.user.id, input.quoteId);
  if (job.status === "ready") await tellCustomer(m, job.id, "ready_to_fit");
  return (await getJob(m.shopId, job.id))!;
}

/**
 * Fits a job with the parts actually fitted (they may differ from the quote) and the labour
 * used: stock is issued, the job's holds released, the build moves to fitted with those parts.
 * The parts must be in the shop's catalog and on the shelf (409 with the part's field).
 */
export async function fitJob(m: Member, input: JobFit) {
  authorize(m, "jobs:write");
  const job = await getJob(m.shopId, input.id);
  if (!job) throw new NotFound("That job");
  if (job.job.status === "fitted") throw new InvalidTransition("This job is already fitted");
  const ids = [...new Set(input.parts.map((p) => p.partId))];
  const catalog = await getPartsByIds(m.shopId, ids);
  const known = new Map(catalog.map((p) => [p.id, p]));
  const issues = input.parts.flatMap((p, i) =>
    known.has(p.partId)
      ? []
      : [{ path: `parts.${i}.partId`, message: "That part is not in this shop's catalog" }],
  );
  if (issues.length) throw new Invalid(issues[0]!.message, issues);
  await fitJobRow(m.shopId, input.id, m.user.id, input);
  await tellCustomer(
    m,
    input.id,
    "fitted",
    input.parts.map(
      (p) => `${p.quantity} × ${known.get(p.partId)!.brand} ${known.get(p.partId)!.name}`,
    ),
  );
  return (await getJob(m.shopId, input.id))!;
}
