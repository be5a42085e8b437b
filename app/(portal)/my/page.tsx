import type { Metadata } from "next";
import Link from "next/link";

import { EmptyState, PageHeader } from "@/components/ui/status";
import { listBuildsOfPortalUser } from "@/db/queries/builds";
import { listInvoices } from "@/db/queries/invoices";
import { listJobs } from "@/db/queries/jobs";
import { listQuotes } from "@/db/queries/quotes";
import { requirePageMember } from "@/lib/auth/member";
import { formatMoney } from "@/lib/catalog/money";
import { STATUS_LABELS } from "@/lib/domain/builds";
import {
  INVOICE_STATUS_LABELS,
  invoiceLabel,
  JOB_STATUS_LABELS,
  jobLabel,
} from "@/lib/domain/operations";
import { QUOTE_STATUS_LABELS, quoteLabel, quoteStatusOn } from "@/lib/domain/quotes";
import { formatCalendarDate } from "@/lib/format/dates";
import { shopToday } from "@/lib/shop/shop-zone";

export const metadata: Metadata = { title: "My builds" };

export default async function MyBuildsPage() {
  const m = await requirePageMember("portal:view");
  const today = await shopToday(m.shopId); // a quote past its date shows as expired before the sweep writes it
  const [builds, quotes, jobs, invoices] = await Promise.all([
    listBuildsOfPortalUser(m.shopId, m.user.id),
    listQuotes(m.shopId, { portalUserId: m.user.id, today }),
    listJobs(m.shopId, m.user.id),
    listInvoices(m.shopId, m.user.id),
  ]);
  return (
    <>
      <PageHeader title="My builds" />
      <p className="mb-4 text-ink-700">
        Welcome, {m.user.name}. Your builds from {m.shopName}.
      </p>
      {builds.length === 0 ? (
        <EmptyState title="Nothing shared with you yet">
          When the shop sizes your fuel system, the build shows up on this page.
        </EmptyState>
      ) : (
        <ul className="space-y-2" aria-label="My builds">
          {builds.map((b) => (
            <li key={b.id} className="rounded-lg border border-ink-200 bg-white p-4">
              <p className="font-semibold">{b.title}</p>
              <p className="text-sm text-ink-600">
                {b.vehicle ?? ""} · {STATUS_LABELS[b.status]}
              </p>
              <a
                href={`/api/v1/builds/${b.id}/spec-sheet`}
                className="text-sm text-copper-700 underline"
              >
                Download the spec sheet (PDF)
              </a>
            </li>
          ))}
        </ul>
      )}
      <h2 className="mt-8 mb-2 text-xl font-semibold">My quotes</h2>
      {quotes.length === 0 ? (
        <p className="text-ink-700">No quotes yet.</p>
      ) : (
        <ul className="space-y-2" aria-label="My quotes">
          {quotes
            .filter((q) => q.status !== "draft" && q.status !== "superseded")
            .map((q) => (
              <li key={q.id} className="rounded-lg border border-ink-200 bg-white p-4">
                <Link
                  href={`/my/quotes/${q.id}`}
                  className="font-semibold text-copper-700 underline"
                >
                  Quote {quoteLabel(q.number, q.revision)}
                </Link>
                <p className="text-sm text-ink-600">
                  {QUOTE_STATUS_LABELS[quoteStatusOn(q, today)]} ·{" "}
                  {formatMoney(q.totalMinor, q.currency)} · valid until{" "}
                  {formatCalendarDate(q.validUntil)}
                </p>
              </li>
            ))}
        </ul>
      )}
      {jobs.length || invoices.length ? (
        <section className="mt-8" aria-labelledby="work-h">
          <h2 id="work-h" className="mb-2 text-lg font-semibold text-ink-900">
            Work and invoices
          </h2>
          <ul className="divide-y divide-ink-100 rounded-lg border border-ink-200 bg-white text-sm">
            {jobs.map((j) => (
              <li key={j.job.id} className="px-4 py-2">
                <Link
                  href={`/my/jobs/${j.job.id}`}
                  className="font-semibold text-copper-700 underline"
                >
                  Job {jobLabel(j.job.number)}
                </Link>{" "}
                <span className="text-ink-600">{JOB_STATUS_LABELS[j.job.status]}</span>
              </li>
            ))}
            {invoices.map((i) => (
              <li key={i.invoice.id} className="px-4 py-2">
                <Link
                  href={`/my/invoices/${i.invoice.id}`}
                  className="font-semibold text-copper-700 underline"
                >
                  Invoice {invoiceLabel(i.invoice.number)}
                </Link>{" "}
                <span className="text-ink-600">
                  {INVOICE_STATUS_LABELS[i.invoice.status]} ·{" "}
                  {formatMoney(i.invoice.totalMinor, i.invoice.currency)}
                </span>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </>
  );
}
