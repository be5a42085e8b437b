import type { Metadata } from "next";
import Link from "next/link";

import { ActionButton } from "@/components/operations/action-button";
import { SupplierForm } from "@/components/operations/supplier-form";
import { EmptyState, PageHeader } from "@/components/ui/status";
import { listPurchaseOrders, listSuppliers } from "@/db/queries/purchasing";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { formatMoney } from "@/lib/catalog/money";
import { PO_STATUS_LABELS, poLabel } from "@/lib/domain/operations";
import { createPurchaseOrderAction } from "@/lib/purchasing/purchasing-actions";
import { reorderRows } from "@/lib/purchasing/reorder";

export const metadata: Metadata = { title: "Purchasing" };

/** What to reorder (back-orders, parts under their minimum), purchase orders and suppliers. */
export default async function PurchasingPage() {
  const m = await requirePageMember("purchasing:read");
  const [reorder, orders, suppliers] = await Promise.all([
    reorderRows(m.shopId),
    listPurchaseOrders(m.shopId),
    listSuppliers(m.shopId),
  ]);
  const write = can(m.role, "purchasing:write");
  // One order per supplier from the reorder list: the parts that supplier offers cheapest.
  const bySupplier = new Map<
    string,
    { name: string; lines: { partId: string; quantity: number }[] }
  >();
  for (const r of reorder)
    if (r.supplier && r.suggested > 0) {
      const g = bySupplier.get(r.supplier.id) ?? { name: r.supplier.name, lines: [] };
      g.lines.push({ partId: r.partId, quantity: r.suggested });
      bySupplier.set(r.supplier.id, g);
    }
  return (
    <>
      <PageHeader title="Purchasing" />
      <section aria-labelledby="reorder-h" className="mb-8">
        <h2 id="reorder-h" className="mb-2 text-lg font-semibold text-ink-900">
          To reorder
        </h2>
        {reorder.length === 0 ? (
          <EmptyState title="Nothing to reorder">
            No accepted quote is waiting for stock and no part is under its minimum.
          </EmptyState>
        ) : (
          <div className="overflow-x-auto rounded-lg border border-ink-200 bg-white">
            <table className="w-full text-left text-sm" data-testid="reorder-list">
              <thead className="bg-ink-100 text-ink-700">
                <tr>
                  <th scope="col" className="px-4 py-2">
                    Part
                  </th>
                  <th scope="col" className="px-4 py-2 text-right">
                    Back-ordered
                  </th>
                  <th scope="col" className="hidden px-4 py-2 text-right sm:table-cell">
                    Free / minimum
                  </th>
                  <th scope="col" className="hidden px-4 py-2 text-right sm:table-cell">
                    On order
                  </th>
                  <th scope="col" className="px-4 py-2 text-right">
                    Order
                  </th>
                </tr>
              </thead>
              <tbody>
                {reorder.map((r) => (
                  <tr key={r.partId} className="border-t border-ink-100">
                    <td className="px-4 py-2">
                      {r.brand} {r.name}
                      <span className="block text-xs text-ink-600">
                        {r.sku} · {r.supplier ? r.supplier.name : "no supplier listed"}
                      </span>
                    </td>
                    <td className="figure px-4 py-2 text-right">{r.backOrdered}</td>
                    <td className="figure hidden px-4 py-2 text-right sm:table-cell">
                      {r.free} / {r.reorderLevel}
                    </td>
                    <td className="figure hidden px-4 py-2 text-right sm:table-cell">
                      {r.onOrder}
                    </td>
                    <td className="figure px-4 py-2 text-right">{r.suggested}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        {write && bySupplier.size ? (
          <ul className="mt-3 space-y-2">
            {[...bySupplier].map(([supplierId, g]) => (
              <li key={supplierId}>
                <ActionButton
                  action={createPurchaseOrderAction}
                  payload={{ supplierId, lines: g.lines }}
                  label={`Make a purchase order for ${g.name} (${g.lines.length} part${g.lines.length === 1 ? "" : "s"})`}
                  busyLabel="Making the order…"
                  goTo="/purchasing/orders/{id}"
                />
              </li>
            ))}
          </ul>
        ) : null}
      </section>

      <section aria-labelledby="po-h" className="mb-8">
        <h2 id="po-h" className="mb-2 text-lg font-semibold text-ink-900">
          Purchase orders
        </h2>
        {orders.length === 0 ? (
          <EmptyState title="No purchase orders yet">
            Make one from the reorder list above.
          </EmptyState>
        ) : (
          <ul className="divide-y divide-ink-100 rounded-lg border border-ink-200 bg-white text-sm">
            {orders.map((o) => (
              <li key={o.po.id} className="flex flex-wrap justify-between gap-2 px-4 py-2">
                <span>
                  <Link
                    href={`/purchasing/orders/${o.po.id}`}
                    className="figure text-copper-700 underline"
                  >
                    {poLabel(o.po.number)}
                  </Link>{" "}
                  {o.supplierName}
                </span>
                <span className="text-ink-700">
                  {PO_STATUS_LABELS[o.po.status]} · {formatMoney(o.po.totalMinor, o.po.currency)}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="sup-h">
        <h2 id="sup-h" className="mb-2 text-lg font-semibold text-ink-900">
          Suppliers
        </h2>
        {suppliers.length === 0 ? (
          <EmptyState title="No suppliers yet">Add the first one below.</EmptyState>
        ) : (
          <ul className="mb-4 divide-y divide-ink-100 rounded-lg border border-ink-200 bg-white text-sm">
            {suppliers.map((s) => (
              <li key={s.id} className="px-4 py-2 [overflow-wrap:anywhere]">
                <Link
                  href={`/purchasing/suppliers/${s.id}`}
                  className="font-medium text-copper-700 underline"
                >
                  {s.name}
                </Link>
                <span className="block break-all text-ink-600">
                  {[s.email, s.leadTimeDays !== null ? `${s.leadTimeDays} days` : null]
                    .filter(Boolean)
                    .join(" · ") || "No e-mail yet"}
                </span>
              </li>
            ))}
          </ul>
        )}
        {write ? <SupplierForm /> : null}
      </section>
    </>
  );
}
