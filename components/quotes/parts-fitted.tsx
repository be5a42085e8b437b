import Link from "next/link";

import { LocalTime } from "@/components/ui/local-time";
import { INVOICE_STATUS_LABELS, invoiceLabel, jobLabel } from "@/lib/domain/operations";
import type { QuoteFitted } from "@/lib/quotes/quote-stock";

/**
 * A quote whose job is fitted: what was fitted, when, and the job and invoice it went on to —
 * in place of the stock promise, which no longer applies once the parts are issued. The same on
 * the counter's quote page and in the customer's portal (links to their own job and invoice;
 * `quoteParts` names no draft invoice to a customer).
 */
export function PartsFitted({
  fitted,
  audience,
}: {
  fitted: QuoteFitted;
  audience: "counter" | "customer";
}) {
  const portal = audience === "customer";
  const invoice = fitted.invoice;
  return (
    <section
      aria-labelledby="q-fitted"
      className="mt-6 rounded-lg border border-ink-200 bg-white p-5"
      data-testid="parts-fitted"
    >
      <h2 id="q-fitted" className="text-lg font-semibold">
        Parts fitted
      </h2>
      <p className="mt-1 text-sm text-ink-700" data-testid="fitted-summary">
        {fitted.summary}
      </p>
      <p className="mt-2 flex flex-wrap gap-x-3 gap-y-1 text-sm">
        <span>
          <Link
            href={portal ? `/my/jobs/${fitted.jobId}` : `/jobs/${fitted.jobId}`}
            className="text-copper-700 underline"
          >
            Job {jobLabel(fitted.jobNumber)}
          </Link>
          {fitted.fittedAt ? (
            <>
              {" "}
              fitted on <LocalTime value={fitted.fittedAt} kind="date" />
            </>
          ) : null}
        </span>
        {invoice ? (
          <span>
            <Link
              href={portal ? `/my/invoices/${invoice.id}` : `/invoices/${invoice.id}`}
              className="text-copper-700 underline"
            >
              {invoice.number === null
                ? "Draft invoice"
                : `Invoice ${invoiceLabel(invoice.number)}`}
            </Link>{" "}
            ({INVOICE_STATUS_LABELS[invoice.status].toLowerCase()})
          </span>
        ) : null}
      </p>
    </section>
  );
}
