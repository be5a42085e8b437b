import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";

import { SupplierEditor } from "@/components/operations/supplier-editor";
import { PageHeader } from "@/components/ui/status";
import { getSupplier } from "@/db/queries/purchasing";
import { getShopSettings } from "@/db/queries/shops";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { formatMoney } from "@/lib/catalog/money";
import { idOrNotFound } from "@/lib/ids";

export const metadata: Metadata = { title: "Supplier" };

/** A supplier: who, where orders go, lead time, and their SKUs and costs for our parts. */
export default async function SupplierPage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("purchasing:read");
  const id = idOrNotFound((await params).id);
  const [s, settings] = await Promise.all([getSupplier(m.shopId, id), getShopSettings(m.shopId)]);
  if (!s) notFound();
  const currency = settings?.settings.currency ?? "USD";
  return (
    <>
      <PageHeader title={`Supplier ${s.name}`}>
        <Link href="/purchasing" className="text-sm text-copper-700 underline">
          Back to purchasing
        </Link>
      </PageHeader>
      {can(m.role, "purchasing:write") ? (
        <SupplierEditor supplier={s} currency={currency} />
      ) : (
        <>
          <dl className="grid gap-2 text-sm sm:grid-cols-2">
            {[
              ["Contact", s.contactName],
              ["Orders e-mail", s.email],
              ["Phone", s.phone],
              ["Lead time", s.leadTimeDays === null ? null : `${s.leadTimeDays} days`],
              ["Notes", s.notes],
            ].map(([k, val]) => (
              <div key={k}>
                <dt className="font-medium text-ink-700">{k}</dt>
                <dd className="break-words text-ink-900">{val || "—"}</dd>
              </div>
            ))}
          </dl>
          <h2 className="mt-6 mb-2 text-lg font-semibold text-ink-900">Their SKUs for our parts</h2>
          {s.parts.length === 0 ? (
            <p className="text-sm text-ink-600">No parts listed for this supplier yet.</p>
          ) : (
            <ul className="divide-y divide-ink-100 rounded-lg border border-ink-200 bg-white text-sm">
              {s.parts.map((p) => (
                <li key={p.partId} className="flex flex-wrap justify-between gap-2 px-4 py-2">
                  <span>
                    {p.sku} — {p.name}
                  </span>
                  <span className="figure text-ink-700">
                    {p.supplierSku}
                    {p.costMinor === null ? "" : ` · ${formatMoney(p.costMinor, currency)}`}
                  </span>
                </li>
              ))}
            </ul>
          )}
        </>
      )}
    </>
  );
}
