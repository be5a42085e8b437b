import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { QuoteEditor } from "@/components/quotes/quote-editor";
import { PageHeader } from "@/components/ui/status";
import { listParts } from "@/db/queries/parts";
import { getQuote } from "@/db/queries/quotes";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { quoteLabel } from "@/lib/catalog/labels";
import { QUOTE_STATUS_LABELS } from "@/lib/validations/quotes";

export const metadata: Metadata = { title: "Quote" };

export default async function QuotePage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("quotes:read");
  const { id } = await params;
  const q = /^[0-9a-f-]{36}$/i.test(id) ? await getQuote(m.shopId, id) : null;
  if (!q) notFound();
  const canWrite = can(m.role, "quotes:write");
  const catalog = canWrite ? (await listParts(m.shopId, { sort: "sku", limit: 2000 })).map((p) => ({ id: p.id, sku: p.sku, label: `${p.brand} ${p.name}`, priceMinor: p.priceMinor, free: p.stock - p.reserved })) : [];
  const qt = q.quote;
  return (
    <>
      <PageHeader title={`Quote ${quoteLabel(qt.number, qt.revision)}`}>
        <span className="rounded-full bg-ink-800 px-3 py-1 text-sm font-semibold text-white" data-testid="quote-status">{QUOTE_STATUS_LABELS[qt.status]}</span>
      </PageHeader>
      <p className="mb-4 text-sm text-ink-700">
        {q.customerName}{q.customerEmail ? ` <${q.customerEmail}>` : " (no e-mail address)"}
        {qt.buildId ? <> · for <Link href={`/builds/${qt.buildId}`} className="text-copper-700 underline">{q.buildTitle}</Link></> : null}
        {qt.statusChangedAt ? ` · ${QUOTE_STATUS_LABELS[qt.status]} ${qt.statusChangedAt.toISOString().replace("T", " ").slice(0, 16)} UTC` : ""}
      </p>
      <QuoteEditor
        key={`${qt.id}-${qt.version}`}
        id={qt.id}
        version={qt.version}
        status={qt.status}
        currency={qt.currency}
        taxRateBp={qt.taxRateBp}
        validUntil={qt.validUntil}
        notes={qt.notes ?? ""}
        lines={q.lines.map((l) => ({ kind: l.kind, partId: l.partId, sku: l.sku, description: l.description, quantityMilli: l.quantityMilli, unitPriceMinor: l.unitPriceMinor, discountBp: l.discountBp }))}
        catalog={catalog}
        canWrite={canWrite}
        customerEmail={q.customerEmail}
      />
      <section aria-labelledby="q-mail" className="mt-6 rounded-lg border border-ink-200 bg-white p-5">
        <h2 id="q-mail" className="text-lg font-semibold">E-mails sent</h2>
        {q.messages.length === 0 ? <p className="mt-1 text-sm text-ink-600">None yet.</p> : (
          <ul className="mt-2 space-y-1 text-sm" data-testid="quote-messages">
            {q.messages.map((msg) => (
              <li key={msg.id}><span className="figure">{msg.sentAt.toISOString().replace("T", " ").slice(0, 16)} UTC</span> to {msg.to}: “{msg.subject}”</li>
            ))}
          </ul>
        )}
      </section>
    </>
  );
}
