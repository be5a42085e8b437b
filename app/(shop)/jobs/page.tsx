import type { Metadata } from "next";
import Link from "next/link";

import { ActionButton } from "@/components/operations/action-button";
import { EmptyState, PageHeader } from "@/components/ui/status";
import { listJobs, quotesAwaitingJob } from "@/db/queries/jobs";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { formatMoney } from "@/lib/catalog/money";
import { INVOICE_STATUS_LABELS, JOB_STATUS_LABELS, jobLabel } from "@/lib/domain/operations";
import { quoteLabel } from "@/lib/domain/quotes";
import { openJobAction } from "@/lib/jobs/job-actions";

export const metadata: Metadata = { title: "Jobs" };

/** The shop's jobs, and the paid quotes waiting to become one. */
export default async function JobsPage() {
  const m = await requirePageMember("jobs:read");
  const [jobs, waiting] = await Promise.all([listJobs(m.shopId), quotesAwaitingJob(m.shopId)]);
  const mayOpen = can(m.role, "jobs:write");
  return (
    <>
      <PageHeader title="Jobs">
        {can(m.role, "purchasing:read") ? (
          <Link href="/purchasing" className="text-sm text-copper-700 underline">
            Purchasing
          </Link>
        ) : null}
      </PageHeader>
      {waiting.length ? (
        <section className="mb-8" aria-labelledby="waiting-h">
          <h2 id="waiting-h" className="mb-2 text-lg font-semibold text-ink-900">
            Deposit paid, no job yet
          </h2>
          <ul className="divide-y divide-ink-100 rounded-lg border border-ink-200 bg-white">
            {waiting.map((q) => (
              <li
                key={q.id}
                className="flex flex-wrap items-center justify-between gap-3 px-4 py-3"
              >
                <div className="min-w-0">
                  <Link href={`/quotes/${q.id}`} className="figure text-copper-700 underline">
                    {quoteLabel(q.number, q.revision)}
                  </Link>{" "}
                  <span className="text-ink-800">{q.customerName}</span>
                  <span className="block text-sm text-ink-600">
                    {q.buildTitle ?? "Parts only"} · {formatMoney(q.totalMinor, q.currency)}
                  </span>
                </div>
                {mayOpen ? (
                  <ActionButton
                    action={openJobAction}
                    payload={{ quoteId: q.id }}
                    label="Open job"
                    busyLabel="Opening…"
                    goTo="/jobs/{id}"
                  />
                ) : null}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      {jobs.length === 0 ? (
        <EmptyState title="No jobs yet">
          A job starts from a quote once its deposit is paid: open it from the list above.
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-ink-200 bg-white">
          <table className="w-full text-left text-sm">
            <thead className="bg-ink-100 text-ink-700">
              <tr>
                <th scope="col" className="px-4 py-2">
                  Job
                </th>
                <th scope="col" className="px-4 py-2">
                  Customer
                </th>
                <th scope="col" className="hidden px-4 py-2 sm:table-cell">
                  Quote
                </th>
                <th scope="col" className="px-4 py-2">
                  Status
                </th>
                <th scope="col" className="hidden px-4 py-2 sm:table-cell">
                  Invoice
                </th>
              </tr>
            </thead>
            <tbody>
              {jobs.map((j) => (
                <tr key={j.job.id} className="border-t border-ink-100">
                  <td className="figure px-4 py-2 whitespace-nowrap">
                    <Link href={`/jobs/${j.job.id}`} className="text-copper-700 underline">
                      {jobLabel(j.job.number)}
                    </Link>
                  </td>
                  <td className="px-4 py-2">
                    {j.customerName}
                    <span className="block text-xs text-ink-600 sm:hidden">
                      {quoteLabel(j.quoteNumber, j.quoteRevision)}
                    </span>
                  </td>
                  <td className="figure hidden px-4 py-2 sm:table-cell">
                    {quoteLabel(j.quoteNumber, j.quoteRevision)}
                  </td>
                  <td className="px-4 py-2">{JOB_STATUS_LABELS[j.job.status]}</td>
                  <td className="hidden px-4 py-2 sm:table-cell">
                    {j.invoiceId && j.invoiceStatus ? (
                      <Link href={`/invoices/${j.invoiceId}`} className="text-copper-700 underline">
                        {INVOICE_STATUS_LABELS[j.invoiceStatus]}
                      </Link>
                    ) : (
                      "—"
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
