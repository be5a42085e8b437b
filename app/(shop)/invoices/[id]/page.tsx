import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";

import { CreditNoteForm } from "@/components/operations/credit-note-form";
import { InvoiceBody } from "@/components/operations/invoice-body";
import { InvoiceEditor } from "@/components/operations/invoice-editor";
import { MailLog } from "@/components/operations/mail-log";
import { PageHeader, Signal } from "@/components/ui/status";
import { getInvoice } from "@/db/queries/invoices";
import { mailOf } from "@/db/queries/mail-log";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { INVOICE_STATUS_LABELS, invoiceLabel, jobLabel } from "@/lib/domain/operations";
import { idOrNotFound } from "@/lib/ids";
import { editedLine } from "@/lib/quotes/line-rows";

export const metadata: Metadata = { title: "Invoice" };

/** An invoice: a draft to issue, or an issued one (frozen) to correct by credit notes. */
export default async function InvoicePage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("invoices:read");
  const id = idOrNotFound((await params).id);
  const inv = await getInvoice(m.shopId, id);
  if (!inv) notFound();
  const mail = await mailOf(m.shopId, [id]);
  const i = inv.invoice;
  const write = can(m.role, "invoices:write");
  return (
    <>
      <PageHeader title={`Invoice ${i.number === null ? "(draft)" : invoiceLabel(i.number)}`}>
        <div className="flex flex-wrap items-center gap-3">
          <a
            href={`/api/v1/invoices/${i.id}/pdf`}
            className="rounded-md border border-ink-300 bg-white px-3 py-1.5 text-sm font-medium text-ink-800 hover:bg-ink-100 print:hidden"
          >
            Invoice (PDF)
          </a>
          <Link href={`/jobs/${i.jobId}`} className="text-sm text-copper-700 underline">
            Job {jobLabel(inv.jobNumber)}
          </Link>
        </div>
      </PageHeader>
      <p className="mb-4 text-ink-800">
        {inv.customerName}{" "}
        <Signal
          level={i.status === "draft" ? "info" : i.status === "paid" ? "ok" : "caution"}
          testId="invoice-status"
        >
          {INVOICE_STATUS_LABELS[i.status]}
        </Signal>
      </p>
      {i.status === "draft" && write ? (
        <section aria-labelledby="edit-h">
          <h2 id="edit-h" className="mb-1 text-lg font-semibold text-ink-900">
            Before it is issued
          </h2>
          <p className="mb-3 text-sm text-ink-600">
            Say what was actually fitted and the labour used; the deposit paid is deducted.
          </p>
          <InvoiceEditor
            id={i.id}
            customerName={inv.customerName}
            version={i.version}
            currency={i.currency}
            taxRateBp={i.taxRateBp}
            depositMinor={i.depositMinor}
            notes={i.notes ?? ""}
            lines={inv.lines.map(editedLine)}
          />
        </section>
      ) : (
        <InvoiceBody inv={inv} />
      )}
      {i.status !== "draft" && write ? (
        <section className="mt-8" aria-labelledby="cn-h">
          <h2 id="cn-h" className="mb-2 text-lg font-semibold text-ink-900">
            Correct with a credit note
          </h2>
          <CreditNoteForm id={i.id} currency={i.currency} />
        </section>
      ) : null}
      <section className="mt-8" aria-labelledby="mail-h">
        <h2 id="mail-h" className="mb-2 text-lg font-semibold text-ink-900">
          E-mails about this invoice
        </h2>
        <MailLog rows={mail} />
      </section>
    </>
  );
}
