import type { Metadata } from "next";
import Link from "next/link";

import { EmptyState, PageHeader } from "@/components/ui/status";
import { listBuildsOfPortalUser } from "@/db/queries/builds";
import { listQuotes } from "@/db/queries/quotes";
import { requirePageMember } from "@/lib/auth/member";
import { formatMoney } from "@/lib/catalog/money";
import { STATUS_LABELS } from "@/lib/domain/builds";
import { isoDay, QUOTE_STATUS_LABELS, quoteLabel, quoteStatusOn } from "@/lib/domain/quotes";
import { formatCalendarDate } from "@/lib/format/dates";

export const metadata: Metadata = { title: "My builds" };

export default async function MyBuildsPage() {
  const m = await requirePageMember("portal:view");
  const today = isoDay(); // a quote past its date shows as expired before the sweep writes it
  const [builds, quotes] = await Promise.all([
    listBuildsOfPortalUser(m.shopId, m.user.id),
    listQuotes(m.shopId, { portalUserId: m.user.id }),
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
    </>
  );
}
