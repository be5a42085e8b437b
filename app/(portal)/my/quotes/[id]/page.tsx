import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { QuoteDecision } from "@/components/portal/quote-decision";
import { PageHeader } from "@/components/ui/status";
import { getQuote } from "@/db/queries/quotes";
import { requirePageMember } from "@/lib/auth/member";
import { quoteLabel } from "@/lib/catalog/labels";
import { formatMoney, formatScaled } from "@/lib/catalog/money";
import { quoteTotals } from "@/lib/catalog/quote-totals";
import { QUOTE_STATUS_LABELS } from "@/lib/validations/quotes";

export const metadata: Metadata = { title: "My quote" };

/** A customer's own quote, read-only. Anyone else's is "not found". */
export default async function MyQuotePage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("portal:view");
  const { id } = await params;
  const q = /^[0-9a-f-]{36}$/i.test(id) ? await getQuote(m.shopId, id, m.user.id) : null;
  if (!q) notFound();
  const qt = q.quote;
  const money = (v: number) => formatMoney(v, qt.currency);
  const t = quoteTotals(q.lines, qt.taxRateBp);
  return (
    <>
      <PageHeader title={`Quote ${quoteLabel(qt.number, qt.revision)}`}>
        <Link href="/my" className="text-sm text-copper-700 underline">Back</Link>
      </PageHeader>
      <p className="mb-4 text-ink-700">{QUOTE_STATUS_LABELS[qt.status]} · valid until {qt.validUntil}{q.buildTitle ? ` · ${q.buildTitle}` : ""}</p>
      <table className="w-full rounded-lg border border-ink-200 bg-white text-left text-sm">
        <thead className="bg-ink-100"><tr><th scope="col" className="px-3 py-2">Item</th><th scope="col" className="px-3 py-2 text-right">Qty</th><th scope="col" className="px-3 py-2 text-right">Amount</th></tr></thead>
        <tbody>
          {q.lines.map((l, i) => (
            <tr key={l.id} className="border-t border-ink-100"><td className="px-3 py-2">{l.description}</td><td className="figure px-3 py-2 text-right">{formatScaled(l.quantityMilli, 3)}</td><td className="figure px-3 py-2 text-right">{money(t.lines[i]!.netMinor)}</td></tr>
          ))}
        </tbody>
        <tfoot className="text-right">
          <tr><td colSpan={2} className="px-3 py-1">Tax</td><td className="figure px-3 py-1">{money(qt.taxMinor)}</td></tr>
          <tr className="font-semibold"><td colSpan={2} className="px-3 py-1">Total</td><td className="figure px-3 py-1">{money(qt.totalMinor)}</td></tr>
        </tfoot>
      </table>
      {qt.notes ? <p className="mt-4 text-sm text-ink-700">{qt.notes}</p> : null}
      {qt.status === "sent" ? <QuoteDecision id={qt.id} /> : qt.statusChangedAt ? <p className="mt-4 text-sm text-ink-700" data-testid="decision">{QUOTE_STATUS_LABELS[qt.status]} on {qt.statusChangedAt.toISOString().replace("T", " ").slice(0, 16)} UTC.</p> : null}
      <p className="mt-6 text-sm text-ink-600">Fuel system work must be fitted and checked by qualified people, following your local codes.</p>
    </>
  );
}
