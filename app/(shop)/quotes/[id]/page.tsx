import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";

import { PartsFitted } from "@/components/quotes/parts-fitted";
import { QuoteEditor } from "@/components/quotes/quote-editor";
import { RevisionChanges } from "@/components/quotes/revision-changes";
import { StockPromise } from "@/components/quotes/stock-promise";
import { LocalTime } from "@/components/ui/local-time";
import { PageHeader } from "@/components/ui/status";
import { listPayments } from "@/db/queries/payments";
import { getQuote, getRevisionLines, latestRevision } from "@/db/queries/quotes";
import { getShopSettings } from "@/db/queries/shops";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { formatMoney } from "@/lib/catalog/money";
import { QUOTE_STATUS_LABELS, quoteLabel, quoteStatusOn } from "@/lib/domain/quotes";
import { idOrNotFound } from "@/lib/ids";
import { depositOf } from "@/lib/payments/deposit";
import { editedLine } from "@/lib/quotes/line-rows";
import { diffQuotes } from "@/lib/quotes/quote-diff";
import { quoteParts } from "@/lib/quotes/quote-stock";
import { shopToday } from "@/lib/shop/shop-zone";

export const metadata: Metadata = { title: "Quote" };

const PAYMENT_LABELS = {
  pending: "checkout opened, not paid",
  paid: "deposit paid",
  expired: "checkout expired",
} as const;

export default async function QuotePage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("quotes:read");
  const id = idOrNotFound((await params).id);
  const q = await getQuote(m.shopId, id);
  if (!q) notFound();
  const canWrite = can(m.role, "quotes:write");
  const qt = q.quote;
  const today = await shopToday(m.shopId);
  const shown = quoteStatusOn(qt, today);
  const [payments, latest, { stock, fitted }, seen, settings] = await Promise.all([
    listPayments(m.shopId, qt.id),
    qt.status === "superseded" ? latestRevision(m.shopId, qt.number) : null,
    quoteParts(m.shopId, qt, shown, q.lines),
    // A later revision: the one before it is what the customer was sent.
    qt.revision > 1 ? getRevisionLines(m.shopId, qt.number, qt.revision - 1) : null,
    getShopSettings(m.shopId),
  ]);
  const since = seen ? quoteLabel(qt.number, seen.revision) : null;
  return (
    <>
      <PageHeader title={`Quote ${quoteLabel(qt.number, qt.revision)}`}>
        <div className="flex items-center gap-3">
          <a
            href={`/api/v1/quotes/${qt.id}/pdf`}
            className="rounded-md border border-ink-300 bg-white px-3 py-1.5 text-sm font-medium text-ink-800 hover:bg-ink-100 print:hidden"
          >
            Quote PDF
          </a>
          <span
            className="rounded-full bg-ink-800 px-3 py-1 text-sm font-semibold text-white"
            data-testid="quote-status"
          >
            {QUOTE_STATUS_LABELS[quoteStatusOn(qt, today)]}
          </span>
        </div>
      </PageHeader>
      <p className="mb-4 text-sm text-ink-700">
        {q.customerName}
        {q.customerEmail ? ` <${q.customerEmail}>` : " (no e-mail address)"}
        {qt.buildId ? (
          <>
            {" "}
            · for{" "}
            <Link href={`/builds/${qt.buildId}`} className="text-copper-700 underline">
              {q.buildTitle}
            </Link>
          </>
        ) : null}
        {qt.statusChangedAt ? (
          <>
            {` · ${QUOTE_STATUS_LABELS[qt.status]} `}
            <LocalTime value={qt.statusChangedAt} />
          </>
        ) : null}
      </p>
      {qt.status === "draft" && qt.revision > 1 ? (
        <p className="mb-4 text-sm text-ink-700" data-testid="revision-draft">
          Revision {qt.revision} of {quoteLabel(qt.number, 1)}, a draft: the customer sees it once
          you send it. Their link to the earlier revision says it was replaced.
        </p>
      ) : null}
      {latest && latest.id !== qt.id ? (
        <p className="mb-4 text-sm text-ink-700" data-testid="replaced-by">
          Replaced by{" "}
          <Link href={`/quotes/${latest.id}`} className="text-copper-700 underline">
            {quoteLabel(qt.number, latest.revision)}
          </Link>{" "}
          ({QUOTE_STATUS_LABELS[quoteStatusOn(latest, today)].toLowerCase()}).
        </p>
      ) : null}
      {seen && since ? (
        <RevisionChanges since={since} diff={diffQuotes(qt, seen.lines, q.lines)} />
      ) : null}
      <QuoteEditor
        key={qt.id}
        id={qt.id}
        number={qt.number}
        revision={qt.revision}
        today={today}
        version={qt.version}
        status={qt.status}
        currency={qt.currency}
        taxRateBp={qt.taxRateBp}
        validUntil={qt.validUntil}
        depositMinor={depositOf(qt.totalMinor, settings?.settings.depositBp ?? 3000)}
        notes={qt.notes ?? ""}
        lines={q.lines.map(editedLine)}
        labourRateMinor={settings?.settings.labourRateMinor ?? 12000}
        canWrite={canWrite}
        customerEmail={q.customerEmail}
      />
      {stock ? <StockPromise lines={q.lines} {...stock} audience="counter" /> : null}
      {fitted ? <PartsFitted fitted={fitted} audience="counter" /> : null}
      <section
        aria-labelledby="q-pay"
        className="mt-6 rounded-lg border border-ink-200 bg-white p-5"
      >
        <h2 id="q-pay" className="text-lg font-semibold">
          Deposit
        </h2>
        {payments.length === 0 ? (
          <p className="mt-1 text-sm text-ink-600">
            {qt.status === "accepted"
              ? "Waiting for the customer to pay the deposit in their portal."
              : "No payment yet."}
          </p>
        ) : (
          <ul className="mt-2 space-y-1 text-sm" data-testid="quote-payments">
            {payments.map((p) => (
              <li key={p.id}>
                <span className="figure">{formatMoney(p.amountMinor, p.currency)}</span> —{" "}
                {PAYMENT_LABELS[p.status]}
                {p.provider === "counter" ? " at the counter" : ""}
                {p.paidAt ? (
                  <>
                    {" "}
                    <LocalTime value={p.paidAt} />
                  </>
                ) : (
                  <>
                    {" (checkout opened "}
                    <LocalTime value={p.createdAt} />)
                  </>
                )}
              </li>
            ))}
          </ul>
        )}
      </section>
      <section
        aria-labelledby="q-mail"
        className="mt-6 rounded-lg border border-ink-200 bg-white p-5 print:hidden"
      >
        <h2 id="q-mail" className="text-lg font-semibold">
          E-mails sent
        </h2>
        {q.messages.length === 0 ? (
          <p className="mt-1 text-sm text-ink-600">None yet.</p>
        ) : (
          <ul className="mt-2 space-y-1 text-sm" data-testid="quote-messages">
            {q.messages.map((msg) => (
              <li key={msg.id}>
                <LocalTime value={msg.sentAt} className="figure" /> to {msg.to}: “{msg.subject}”
              </li>
            ))}
          </ul>
        )}
      </section>
    </>
  );
}
