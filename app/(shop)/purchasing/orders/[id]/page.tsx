import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";

import { ActionButton } from "@/components/operations/action-button";
import { MailLog } from "@/components/operations/mail-log";
import { QuantityForm } from "@/components/operations/quantity-form";
import { PageHeader, Signal } from "@/components/ui/status";
import { mailOf } from "@/db/queries/mail-log";
import { getPurchaseOrder } from "@/db/queries/purchasing";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { formatMoney } from "@/lib/catalog/money";
import { PO_RECEIVABLE, PO_STATUS_LABELS, poLabel } from "@/lib/domain/operations";
import { cancelRefusal } from "@/lib/domain/purchasing";
import { idOrNotFound } from "@/lib/ids";
import {
  cancelPurchaseOrderAction,
  receivePurchaseOrderAction,
  sendPurchaseOrderAction,
} from "@/lib/purchasing/purchasing-actions";

export const metadata: Metadata = { title: "Purchase order" };

/** A purchase order: send it to the supplier, receive against it in part or in full. */
export default async function PurchaseOrderPage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("purchasing:read");
  const id = idOrNotFound((await params).id);
  const po = await getPurchaseOrder(m.shopId, id);
  if (!po) notFound();
  const mail = await mailOf(m.shopId, [id]);
  const write = can(m.role, "purchasing:write");
  const money = (v: number) => formatMoney(v, po.po.currency);
  const open = po.lines.filter((l) => l.receivedQty < l.quantity);
  const label = poLabel(po.po.number);
  const mayCancel = write && cancelRefusal(po.po.status, po.lines) === null;
  return (
    <>
      <PageHeader title={`Purchase order ${poLabel(po.po.number)}`}>
        <div className="flex flex-wrap items-center gap-3">
          <a
            href={`/api/v1/purchase-orders/${po.po.id}/pdf`}
            className="rounded-md border border-ink-300 bg-white px-3 py-1.5 text-sm font-medium text-ink-800 hover:bg-ink-100"
          >
            Order (PDF)
          </a>
          <Link href="/purchasing" className="text-sm text-copper-700 underline">
            Back to purchasing
          </Link>
        </div>
      </PageHeader>
      <p className="mb-4 text-ink-800">
        {po.supplierName}{" "}
        <Signal
          level={
            po.po.status === "received" ? "ok" : po.po.status === "cancelled" ? "caution" : "info"
          }
          testId="po-status"
        >
          {PO_STATUS_LABELS[po.po.status]}
        </Signal>
      </p>
      <div className="overflow-x-auto rounded-lg border border-ink-200 bg-white">
        <table className="w-full text-left text-sm" data-testid="po-lines">
          <thead className="bg-ink-100 text-ink-700">
            <tr>
              <th scope="col" className="px-4 py-2">
                Part
              </th>
              <th scope="col" className="px-4 py-2 text-right">
                Ordered
              </th>
              <th scope="col" className="px-4 py-2 text-right">
                Received
              </th>
              <th scope="col" className="hidden px-4 py-2 text-right sm:table-cell">
                Unit cost
              </th>
            </tr>
          </thead>
          <tbody>
            {po.lines.map((l) => (
              <tr key={l.id} className="border-t border-ink-100">
                <td className="px-4 py-2">
                  {l.description}
                  <span className="block text-xs text-ink-600">
                    {l.sku}
                    {l.supplierSku ? ` · theirs ${l.supplierSku}` : ""}
                  </span>
                </td>
                <td className="figure px-4 py-2 text-right">{l.quantity}</td>
                <td className="figure px-4 py-2 text-right">{l.receivedQty}</td>
                <td className="figure hidden px-4 py-2 text-right sm:table-cell">
                  {money(l.unitCostMinor)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-right text-sm font-semibold">Total {money(po.po.totalMinor)}</p>
      {(write && po.po.status === "draft") || mayCancel ? (
        <section className="mt-6 flex flex-wrap items-start gap-3">
          {write && po.po.status === "draft" ? (
            <ActionButton
              action={sendPurchaseOrderAction}
              payload={{ id: po.po.id }}
              label="E-mail to the supplier"
              busyLabel="Sending…"
              confirm={`E-mail ${label} to ${po.supplierName}?`}
              variant="secondary"
            />
          ) : null}
          {mayCancel ? (
            <ActionButton
              action={cancelPurchaseOrderAction}
              payload={{ id: po.po.id, version: po.po.version }}
              label="Cancel this order"
              busyLabel="Cancelling…"
              confirm={`Cancel ${label}?${po.po.status === "sent" ? ` ${po.supplierName} already has it: tell them too.` : ""} What it was for goes back on the reorder list; this cannot be undone.`}
              variant="secondary"
            />
          ) : null}
        </section>
      ) : null}
      {po.po.status === "cancelled" ? (
        <p className="mt-6 text-sm text-ink-700">
          This order is cancelled: nothing is received against it, and what it was for is back on
          the{" "}
          <Link href="/purchasing" className="text-copper-700 underline">
            reorder list
          </Link>
          .
        </p>
      ) : null}
      {write && PO_RECEIVABLE.includes(po.po.status) && open.length ? (
        <section className="mt-8" aria-labelledby="recv-h">
          <h2 id="recv-h" className="mb-1 text-lg font-semibold text-ink-900">
            Receive
          </h2>
          <p className="mb-3 text-sm text-ink-600">
            What arrived goes on the shelf and to back-ordered quotes, oldest acceptance first.
          </p>
          <QuantityForm
            kind="receive"
            action={receivePurchaseOrderAction}
            id={po.po.id}
            rows={open.map((l) => ({
              key: l.id,
              label: `${l.sku} (of ${l.quantity - l.receivedQty} outstanding)`,
              start: l.quantity - l.receivedQty,
              max: l.quantity - l.receivedQty,
            }))}
            confirm="Put these into stock?"
            submitLabel="Receive"
          />
        </section>
      ) : null}
      <section className="mt-8" aria-labelledby="mail-h">
        <h2 id="mail-h" className="mb-2 text-lg font-semibold text-ink-900">
          E-mails about this order
        </h2>
        <MailLog rows={mail} />
      </section>
    </>
  );
}
