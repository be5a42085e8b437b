import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";

import { ActionButton } from "@/components/operations/action-button";
import { FitForm } from "@/components/operations/fit-form";
import { MailLog } from "@/components/operations/mail-log";
import { PageHeader, Signal } from "@/components/ui/status";
import { getJob, quoteFitFacts } from "@/db/queries/jobs";
import { mailOf } from "@/db/queries/mail-log";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { JOB_STATUS_LABELS, jobLabel } from "@/lib/domain/operations";
import { quoteLabel } from "@/lib/domain/quotes";
import { idOrNotFound } from "@/lib/ids";
import { createInvoiceAction } from "@/lib/invoices/invoice-actions";
import { fitJobAction } from "@/lib/jobs/job-actions";
import { formatQuoteQuantity } from "@/lib/quotes/quote-presentation";

export const metadata: Metadata = { title: "Job" };

/** A job: its parts (wanted, allocated as they arrive, fitted), fitting, and its invoice. */
export default async function JobPage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("jobs:read");
  const id = idOrNotFound((await params).id);
  const j = await getJob(m.shopId, id);
  if (!j) notFound();
  const [mail, { labourMilli, currency }] = await Promise.all([
    mailOf(m.shopId, [id]),
    quoteFitFacts(m.shopId, j.job.quoteId),
  ]);
  const job = j.job;
  const parts = j.lines.filter((l) => l.partId);
  return (
    <>
      <PageHeader title={`Job ${jobLabel(job.number)}`}>
        <Link href="/jobs" className="text-sm text-copper-700 underline">
          Back to the jobs
        </Link>
      </PageHeader>
      <p className="mb-4 text-ink-800">
        {j.customerName} · {j.buildTitle ?? "Parts only"} ·{" "}
        <Link href={`/quotes/${job.quoteId}`} className="figure text-copper-700 underline">
          {quoteLabel(j.quoteNumber, j.quoteRevision)}
        </Link>{" "}
        <Signal level={job.status === "waiting_parts" ? "caution" : "ok"} testId="job-status">
          {JOB_STATUS_LABELS[job.status]}
        </Signal>
      </p>
      <div className="overflow-x-auto rounded-lg border border-ink-200 bg-white">
        <table className="w-full text-left text-sm">
          <thead className="bg-ink-100 text-ink-700">
            <tr>
              <th scope="col" className="px-4 py-2">
                Part
              </th>
              <th scope="col" className="px-4 py-2 text-right">
                Wanted
              </th>
              <th scope="col" className="px-4 py-2 text-right">
                In for this job
              </th>
              <th scope="col" className="px-4 py-2 text-right">
                Fitted
              </th>
            </tr>
          </thead>
          <tbody>
            {j.lines.length === 0 ? (
              <tr>
                <td colSpan={4} className="px-4 py-3 text-ink-600">
                  This job has no parts: labour only.
                </td>
              </tr>
            ) : (
              j.lines.map((l) => (
                <tr key={l.id} className="border-t border-ink-100">
                  <td className="px-4 py-2">
                    {l.description}
                    {l.sku ? <span className="block text-xs text-ink-600">{l.sku}</span> : null}
                  </td>
                  <td className="figure px-4 py-2 text-right">{l.quantity}</td>
                  <td className="figure px-4 py-2 text-right">{l.allocatedQty}</td>
                  <td className="figure px-4 py-2 text-right">{l.fittedQty ?? "—"}</td>
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>

      {job.status !== "fitted" && can(m.role, "jobs:write") ? (
        <section className="mt-8" aria-labelledby="fit-h">
          <h2 id="fit-h" className="mb-1 text-lg font-semibold text-ink-900">
            Fitted
          </h2>
          <p className="mb-3 text-sm text-ink-600">
            {job.status === "waiting_parts"
              ? "Not every part is in yet. Fit now only with what is on the shelf."
              : "Every part is in. Say what was actually fitted and the labour used."}{" "}
            Stock is taken off the shelf and the build moves to fitted with these parts.
          </p>
          <FitForm
            action={fitJobAction}
            id={job.id}
            version={job.version}
            lines={parts.map((l) => ({
              partId: l.partId!,
              description: l.description,
              sku: l.sku,
              start: l.allocatedQty,
            }))}
            labourHours={labourMilli === null ? null : formatQuoteQuantity(labourMilli)}
            currency={currency}
          />
        </section>
      ) : null}

      {job.status === "fitted" ? (
        <section className="mt-8" aria-labelledby="inv-h">
          <h2 id="inv-h" className="mb-2 text-lg font-semibold text-ink-900">
            Invoice
          </h2>
          {j.invoiceId ? (
            <Link href={`/invoices/${j.invoiceId}`} className="text-copper-700 underline">
              Open the invoice
            </Link>
          ) : can(m.role, "invoices:write") ? (
            <ActionButton
              action={createInvoiceAction}
              payload={{ jobId: job.id }}
              label="Raise invoice"
              busyLabel="Raising…"
              goTo="/invoices/{id}"
            />
          ) : (
            <p className="text-sm text-ink-600">No invoice yet; the counter raises it.</p>
          )}
        </section>
      ) : null}

      <section className="mt-8" aria-labelledby="mail-h">
        <h2 id="mail-h" className="mb-2 text-lg font-semibold text-ink-900">
          E-mails about this job
        </h2>
        <MailLog rows={mail} />
      </section>
    </>
  );
}
