import type { Metadata } from "next";
import Link from "next/link";
import { Suspense } from "react";

import { QuoteFilters } from "@/components/quotes/quote-filters";
import { EmptyState, PageHeader } from "@/components/ui/status";
import { listQuotes } from "@/db/queries/quotes";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { formatMoney } from "@/lib/catalog/money";
import { QUOTE_STATUS_LABELS, quoteLabel, quoteStatusOn } from "@/lib/domain/quotes";
import { formatCalendarDate } from "@/lib/format/dates";
import { shopToday } from "@/lib/shop/shop-zone";
import { QuoteListQuery, type QuoteListFilters } from "@/lib/validations/quotes";

export const metadata: Metadata = { title: "Quotes" };

/** The URL's filters; one that does not parse (a hand-edited URL) is left out, not an error. */
function filtersOf(sp: Record<string, string | string[] | undefined>): QuoteListFilters {
  const one = (k: string) => (typeof sp[k] === "string" ? sp[k] : undefined);
  const { shape } = QuoteListQuery;
  const q = shape.q.safeParse(one("q"));
  const status = shape.status.safeParse(one("status"));
  const sort = shape.sort.safeParse(one("sort"));
  return {
    q: (q.success && q.data) || undefined,
    status: status.success ? status.data : undefined,
    sort: sort.success ? sort.data : "newest",
  };
}

export default async function QuotesPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const m = await requirePageMember("quotes:read");
  const today = await shopToday(m.shopId); // a quote past its date shows as expired before the sweep writes it
  const filters = filtersOf(await searchParams);
  const filtered = Boolean(filters.q || filters.status);
  const quotes = await listQuotes(m.shopId, { ...filters, today });
  return (
    <>
      <PageHeader title="Quotes">
        {can(m.role, "quotes:write") ? (
          <Link
            href="/quotes/new"
            className="rounded-md bg-copper-600 px-4 py-2 text-sm font-semibold text-white hover:bg-copper-700"
          >
            New quote
          </Link>
        ) : null}
      </PageHeader>
      <Suspense>
        <QuoteFilters count={quotes.length} />
      </Suspense>
      {quotes.length === 0 ? (
        <EmptyState title={filtered ? "No quote matches" : "No quotes yet"}>
          {filtered
            ? "Try another number, name or vehicle, or another status."
            : "Make a parts-only quote with “New quote”, or open a sized build, choose its parts kit and quote it."}
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-ink-200 bg-white">
          <table className="table-cards w-full text-left text-sm" data-testid="quotes-table">
            <thead className="bg-ink-100 text-ink-700">
              <tr>
                <th scope="col" className="px-4 py-2">
                  Quote
                </th>
                <th scope="col" className="px-4 py-2">
                  Customer
                </th>
                <th scope="col" className="px-4 py-2">
                  Build
                </th>
                <th scope="col" className="px-4 py-2">
                  Status
                </th>
                <th scope="col" className="px-4 py-2">
                  Valid until
                </th>
                <th scope="col" className="px-4 py-2 text-right">
                  Total
                </th>
              </tr>
            </thead>
            <tbody>
              {quotes.map((q) => (
                <tr key={q.id} className="border-t border-ink-100">
                  <td className="figure px-4 py-2 whitespace-nowrap">
                    <Link href={`/quotes/${q.id}`} className="text-copper-700 underline">
                      {quoteLabel(q.number, q.revision)}
                    </Link>
                  </td>
                  <td className="px-4 py-2" data-label="Customer">
                    {q.customerName}
                  </td>
                  <td className="px-4 py-2" data-label="Build">
                    {q.buildTitle ? (
                      <>
                        <span>
                          {q.buildTitle}
                          {q.buildVehicle ? (
                            <span className="block text-xs text-ink-600">{q.buildVehicle}</span>
                          ) : null}
                        </span>
                      </>
                    ) : (
                      <span className="text-ink-600">Parts only</span>
                    )}
                  </td>
                  <td className="px-4 py-2" data-label="Status">
                    {QUOTE_STATUS_LABELS[quoteStatusOn(q, today)]}
                  </td>
                  <td className="figure px-4 py-2 whitespace-nowrap" data-label="Valid until">
                    {formatCalendarDate(q.validUntil)}
                  </td>
                  <td className="figure px-4 py-2 text-right whitespace-nowrap" data-label="Total">
                    {formatMoney(q.totalMinor, q.currency)}
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
