import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";

import { ActionButton } from "@/components/operations/action-button";
import { InvoiceBody } from "@/components/operations/invoice-body";
import { FormStatus, PageHeader } from "@/components/ui/status";
import { getInvoice } from "@/db/queries/invoices";
import { requirePageMember } from "@/lib/auth/member";
import { formatMoney } from "@/lib/catalog/money";
import { INVOICE_STATUS_LABELS, invoiceLabel } from "@/lib/domain/operations";
import { idOrNotFound } from "@/lib/ids";
import { startBalanceAction } from "@/lib/invoices/invoice-actions";

export const metadata: Metadata = { title: "My invoice" };

const PAYMENT_NOTES: Record<string, { ok: boolean; text: string }> = {
  paid: { ok: true, text: "Thank you: your payment is received." },
  pending: {
    ok: false,
    text: "The payment is not confirmed yet; this page shows it as soon as it is.",
  },
  cancelled: { ok: false, text: "Checkout was cancelled; nothing was charged." },
};

/** A customer's own issued invoice, with the balance to pay. Anyone else's is "not found". */
export default async function MyInvoicePage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<{ payment?: string }>;
}) {
  const m = await requirePageMember("portal:view");
  const id = idOrNotFound((await params).id);
  const note = PAYMENT_NOTES[(await searchParams).payment ?? ""];
  const inv = await getInvoice(m.shopId, id, m.user.id);
  if (!inv) notFound();
  const i = inv.invoice;
  const due = inv.ledger.balanceMinor;
  return (
    <>
      <PageHeader title={`Invoice ${invoiceLabel(i.number)}`}>
        <div className="flex flex-wrap items-center gap-3">
          <a
            href={`/api/v1/invoices/${i.id}/pdf`}
            className="rounded-md border border-ink-300 bg-white px-3 py-1.5 text-sm font-medium text-ink-800 hover:bg-ink-100"
          >
            Download invoice (PDF)
          </a>
          <Link href="/my" className="text-sm text-copper-700 underline">
            Back
          </Link>
        </div>
      </PageHeader>
      {note ? <FormStatus ok={note.ok} message={note.text} /> : null}
      <p className="mb-4 text-ink-800" data-testid="my-invoice-status">
        {INVOICE_STATUS_LABELS[i.status]}
      </p>
      <InvoiceBody inv={inv} />
      {i.status === "issued" && due > 0 ? (
        <div className="mt-6 rounded-lg border border-copper-100 bg-copper-50 p-4">
          <p className="mb-3 text-sm text-ink-800">
            Still to pay: <strong className="figure">{formatMoney(due, i.currency)}</strong>
          </p>
          <ActionButton
            action={startBalanceAction}
            payload={{ id: i.id }}
            label={`Pay ${formatMoney(due, i.currency)}`}
            busyLabel="Opening the secure checkout…"
            openUrl
          />
        </div>
      ) : null}
    </>
  );
}
