import type { JobRow } from "@/db/queries/jobs";
import { jobLabel } from "@/lib/domain/operations";

/** A job as the API answers it: no e-mail addresses or sign-in ids. */
export function jobData(r: Omit<JobRow, "lines"> & { lines?: JobRow["lines"] }) {
  return {
    ...r.job,
    label: jobLabel(r.job.number),
    quoteNumber: r.quoteNumber,
    quoteRevision: r.quoteRevision,
    customerName: r.customerName,
    buildTitle: r.buildTitle,
    invoiceId: r.invoiceId,
    invoiceStatus: r.invoiceStatus,
    ...(r.lines ? { lines: r.lines } : {}),
  };
}
