import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";

import { DepositButton } from "@/components/portal/deposit-button";
import { QuoteDecision } from "@/components/portal/quote-decision";
import { PartsFitted } from "@/components/quotes/parts-fitted";
import { QuoteLinesTable } from "@/components/quotes/quote-lines-table";
import { StockPromise } from "@/components/quotes/stock-promise";
import { LocalTime } from "@/components/ui/local-time";
import { PageHeader } from "@/components/ui/status";
import { listPayments } from "@/db/queries/payments";
import { getQuote, latestRevision } from "@/db/queries/quotes";
import { getShopSettings } from "@/db/queries/shops";
import { requirePageMember } from "@/lib/auth/member";
import { formatMoney } from "@/lib/catalog/money";
import { QUOTE_STATUS_LABELS, quoteLabel, quoteStatusOn } from "@/lib/domain/quotes";
import { formatCalendarDate } from "@/lib/format/dates";
import { idOrNotFound } from "@/lib/ids";
import { depositOf } from "@/lib/payments/deposit";
import { formatRateBp, presentQuote } from "@/lib/quotes/quote-presentation";
import { quoteParts } from "@/lib/quotes/quote-stock";
import { shopToday } from "@/lib/shop/shop-zone";

export const metadata: Metadata = { title: "My quote" };

/** A customer's own quote, read-only. Anyone else's is "not found". */
const PAYMENT_NOTES: Record<string, { ok: boolean; text: string }> = {
  paid: { ok: true, text: "Thank you: your deposit is paid." },
  pending: {
    ok: false,
    text: "The payment is not confirmed yet; this page shows it as soon as it is.",
  },
  cancelled: { ok: false, text: "Checkout was cancelled; nothing was charged." },
};

export default async function MyQuotePage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<{ payment?: string }>;
}) {
  const m = await requirePageMember("portal:view");
  const id = idOrNotFound((await params).id);
  const note = PAYMENT_NOTES[(await searchParams).payment ?? ""];
  const q = await getQuote(m.shopId, id, m.user.id);
  if (!q) notFound();
  const qt = q.quote;
  // As of today, whatever is stored: past its date a sent or accepted quote is expired.
  const status = quoteStatusOn(qt, await shopToday(m.shopId));
  const money = (v: number) => formatMoney(v, qt.currency);
  const presented = presentQuote(qt, q.lines);
  const [settings, paid, latest, { stock, fitted }] = await Promise.all([
    getShopSettings(m.shopId),
    listPayments(m.shopId, qt.id).then((ps) => ps.filter((p) => p.status === "paid")),
    status === "superseded" ? latestRevision(m.shopId, qt.number) : null,
    quoteParts(m.shopId, qt, status, q.lines, { customer: true }),
  ]);
  // A replaced revision points only to a newer one the shop has sent (never to a draft).
  const newer =
    latest && latest.revision > qt.revision && latest.status !== "draft" ? latest : null;
  const depositBp = settings?.settings.depositBp ?? 3000;
  const deposit = depositOf(qt.totalMinor, depositBp);
  return (
    <>
      <PageHeader title={`Quote ${quoteLabel(qt.number, qt.revision)}`}>
        <div className="flex flex-wrap items-center gap-3">
          <a
            href={`/api/v1/quotes/${qt.id}/pdf`}
            className="rounded-md border border-ink-300 bg-white px-3 py-1.5 text-sm font-medium text-ink-800 hover:bg-ink-100"
          >
            Download quote (PDF)
          </a>
          {qt.buildId ? (
            <a
              href={`/api/v1/builds/${qt.buildId}/spec-sheet`}
              className="rounded-md border border-ink-300 bg-white px-3 py-1.5 text-sm font-medium text-ink-800 hover:bg-ink-100"
            >
              Spec sheet (PDF)
            </a>
          ) : null}
          <Link href="/my" className="text-sm text-copper-700 underline">
            Back
          </Link>
        </div>
      </PageHeader>
      {note ? (
        <p
          role="status"
          className={`mb-4 rounded-md px-3 py-2 text-sm font-medium ${note.ok ? "bg-ok-50 text-ok-700" : "bg-ink-100 text-ink-800"}`}
        >
          {note.text}
        </p>
      ) : null}
      {status === "superseded" ? (
        <p
          role="status"
          className="mb-4 rounded-md border-l-4 border-caution-600 bg-caution-50 px-3 py-2 text-sm font-medium text-ink-800"
          data-testid="replaced"
        >
          This quote was replaced by a new revision and can no longer be accepted.{" "}
          {newer ? (
            <Link href={`/my/quotes/${newer.id}`} className="text-copper-700 underline">
              See {quoteLabel(qt.number, newer.revision)}
            </Link>
          ) : (
            "The shop sends you the new one when it is ready."
          )}
        </p>
      ) : null}
      {status === "expired" ? (
        <p
          role="status"
          className="mb-4 rounded-md border-l-4 border-caution-600 bg-caution-50 px-3 py-2 text-sm font-medium text-ink-800"
          data-testid="expired"
        >
          This quote was valid until {formatCalendarDate(qt.validUntil)} and can no longer be
          accepted. Ask the shop for a new one.
        </p>
      ) : null}
      <p className="mb-4 text-ink-700">
        <span data-testid="my-quote-status">{QUOTE_STATUS_LABELS[status]}</span> · valid until{" "}
        {formatCalendarDate(qt.validUntil)}
        {q.buildTitle ? ` · ${q.buildTitle}` : ""}
      </p>
      <QuoteLinesTable presented={presented} />
      {qt.notes ? <p className="mt-4 text-sm text-ink-700">{qt.notes}</p> : null}
      {stock ? <StockPromise lines={q.lines} {...stock} audience="customer" /> : null}
      {fitted ? <PartsFitted fitted={fitted} audience="customer" /> : null}
      {status === "accepted" && deposit > 0 ? (
        <DepositButton id={qt.id} amount={money(deposit)} />
      ) : null}
      {paid.map((p) => (
        <p key={p.id} className="mt-4 text-sm text-ok-700" data-testid="deposit-paid">
          ✓ Deposit of {formatMoney(p.amountMinor, p.currency)} paid{" "}
          {p.paidAt ? <LocalTime value={p.paidAt} /> : null}.
        </p>
      ))}
      {status === "sent" && deposit > 0 ? (
        // What accepting asks for, read before the customer accepts (as the quote PDF says it).
        <p className="mt-4 text-sm text-ink-800" data-testid="deposit-asked">
          Deposit on acceptance:{" "}
          <span className="figure font-semibold">
            {formatRateBp(depositBp)} ({money(deposit)})
          </span>{" "}
          of the total {money(qt.totalMinor)}; the shop orders the parts once it is paid.
        </p>
      ) : null}
      {status === "sent" ? (
        <QuoteDecision id={qt.id} holds={stock?.summary ?? null} />
      ) : status === qt.status && qt.statusChangedAt ? (
        <p className="mt-4 text-sm text-ink-700" data-testid="decision">
          {QUOTE_STATUS_LABELS[qt.status]} on <LocalTime value={qt.statusChangedAt} />.
        </p>
      ) : null}
      <p className="mt-6 text-sm text-ink-600">
        Fuel system work must be fitted and checked by qualified people, following your local codes.
      </p>
    </>
  );
}
