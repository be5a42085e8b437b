import type { Metadata } from "next";
import Link from "next/link";

import { EmptyState, PageHeader } from "@/components/ui/status";
import { listQuotes } from "@/db/queries/quotes";
import { requirePageMember } from "@/lib/auth/member";
import { formatMoney } from "@/lib/catalog/money";
import { isoDay, QUOTE_STATUS_LABELS, quoteLabel, quoteStatusOn } from "@/lib/domain/quotes";

export const metadata: Metadata = { title: "Quotes" };

export default async function QuotesPage() {
  const m = await requirePageMember("quotes:read");
  const today = isoDay(); // a quote past its date shows as expired before the sweep writes it
  const quotes = await listQuotes(m.shopId);
  return (
    <>
      <PageHeader title="Quotes" />
      {quotes.length === 0 ? (
        <EmptyState title="No quotes yet">
          Open a sized build, choose its parts kit, and create a quote from it.
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-ink-200 bg-white">
          <table className="w-full text-left text-sm">
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
                  <td className="figure px-4 py-2">
                    <Link href={`/quotes/${q.id}`} className="text-copper-700 underline">
                      {quoteLabel(q.number, q.revision)}
                    </Link>
                  </td>
                  <td className="px-4 py-2">{q.customerName}</td>
                  <td className="px-4 py-2">{q.buildTitle ?? "—"}</td>
                  <td className="px-4 py-2">{QUOTE_STATUS_LABELS[quoteStatusOn(q, today)]}</td>
                  <td className="figure px-4 py-2">{q.validUntil}</td>
                  <td className="figure px-4 py-2 text-right">
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
