import "server-only";

import { getJob } from "@/db/queries/jobs";
import { getPartsByIds } from "@/db/queries/parts";
import {
  cancelPurchaseOrderRow,
  deleteSupplier as deleteSupplierRow,
  getPurchaseOrder,
  getSupplier,
  insertPurchaseOrder,
  insertSupplier,
  markPurchaseOrderSent,
  receivePurchaseOrder as receiveRow,
  updateSupplier as updateSupplierRow,
} from "@/db/queries/purchasing";
import { getShopSettings } from "@/db/queries/shops";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { Invalid, InvalidTransition, NotFound, Unavailable } from "@/lib/domain/errors";
import { jobLabel, PO_RECEIVABLE, poLabel } from "@/lib/domain/operations";
import { cancelRefusal, receiptIssues } from "@/lib/domain/purchasing";
import { serverEnv } from "@/lib/env";
import { deliverNotice, notifyShop } from "@/lib/notices/notice-commands";
import { noticeFiles } from "@/lib/notices/notice-files";
import { ledgerPdfName, purchaseOrderSheetTitle } from "@/lib/pdf/ledger-sheet-data";
import type {
  PurchaseOrderCancel,
  PurchaseOrderCreate,
  PurchaseOrderReceive,
  SupplierCreate,
  SupplierUpdate,
} from "@/lib/validations/operations";

/**
 * Every write on suppliers and purchase orders (staff only: `purchasing:write`). Receiving puts
 * stock in and gives it to back-orders in the order their quotes were accepted; the customers of
 * jobs that got parts and the shop's subscribers are told afterwards.
 */

export async function createSupplier(m: Member, input: SupplierCreate) {
  authorize(m, "purchasing:write");
  const s = await insertSupplier(m.shopId, input);
  return (await getSupplier(m.shopId, s.id))!;
}

export async function updateSupplier(m: Member, input: SupplierUpdate) {
  authorize(m, "purchasing:write");
  await updateSupplierRow(m.shopId, input);
  return (await getSupplier(m.shopId, input.id))!;
}

export async function deleteSupplier(m: Member, input: { id: string }) {
  authorize(m, "purchasing:write");
  await deleteSupplierRow(m.shopId, input.id);
  return { deleted: input.id };
}

/** A draft purchase order for a supplier (parts from the shop's catalog), priced at their cost. */
export async function createPurchaseOrder(m: Member, input: PurchaseOrderCreate) {
  authorize(m, "purchasing:write");
  const s = await getSupplier(m.shopId, input.supplierId);
  if (!s) throw Invalid.field("supplierId", "That supplier is not in this shop");
  const found = new Set(
    (await getPartsByIds(m.shopId, [...new Set(input.lines.map((l) => l.partId))])).map(
      (p) => p.id,
    ),
  );
  const issues = input.lines.flatMap((l, i) =>
    found.has(l.partId)
      ? []
      : [{ path: `lines.${i}.partId`, message: "That part is not in this shop's catalog" }],
  );
  if (issues.length) throw new Invalid(issues[0]!.message, issues);
  const currency = (await getShopSettings(m.shopId))?.settings.currency ?? "USD";
  const po = await insertPurchaseOrder(m.shopId, m.user.id, { ...input, currency });
  return (await getPurchaseOrder(m.shopId, po.id))!;
}

/**
 * E-mails a draft purchase order to its supplier (with its PDF); it is sent only once the mail
 * server took it — a failed send is logged on the order and changes nothing.
 */
export async function sendPurchaseOrder(m: Member, input: { id: string }) {
  authorize(m, "purchasing:write");
  const po = await getPurchaseOrder(m.shopId, input.id);
  if (!po) throw new NotFound("That purchase order");
  if (po.po.status !== "draft")
    throw new InvalidTransition("Only a draft purchase order is sent to the supplier");
  if (!po.supplierEmail)
    throw new Invalid(
      `${po.supplierName} has no e-mail address; add one on the supplier's page`,
      [],
      "no_email",
    );
  const label = poLabel(po.po.number);
  const files = noticeFiles("po_to_supplier", m.shopId, po.po.id);
  const [outcome] = await deliverNotice(
    { shopId: m.shopId, recordKind: "purchase_order", recordId: po.po.id },
    [po.supplierEmail],
    {
      kind: "po_to_supplier",
      shopName: m.shopName,
      supplierName: po.supplierContact ?? po.supplierName,
      po: label,
      lines: po.lines.map((l) => `${l.quantity} × ${l.supplierSku ?? l.sku} — ${l.description}`),
      attachments: files ? [ledgerPdfName(purchaseOrderSheetTitle(po.po.number))] : [],
    },
    files,
  );
  if (outcome !== "sent" && outcome !== "already")
    throw new Unavailable(
      "The purchase order was not sent: the mail server did not take it. It is still a draft; try again from its e-mail log.",
      "mail_failed",
      "upstream",
    );
  await markPurchaseOrderSent(m.shopId, po.po.id);
  return (await getPurchaseOrder(m.shopId, po.po.id))!;
}

/**
 * Cancels an order nothing was received against (a draft, or one sent to the supplier): its
 * units no longer count as on order, so what they were for is back on the reorder list. An order
 * with anything received is refused (422 `not_cancellable`), a stale version is a 409.
 */
export async function cancelPurchaseOrder(m: Member, input: PurchaseOrderCancel) {
  authorize(m, "purchasing:write");
  const po = await getPurchaseOrder(m.shopId, input.id);
  if (!po) throw new NotFound("That purchase order");
  const refused = cancelRefusal(po.po.status, po.lines);
  if (refused) throw new InvalidTransition(refused, "not_cancellable");
  await cancelPurchaseOrderRow(m.shopId, po.po.id, input.version);
  return (await getPurchaseOrder(m.shopId, po.po.id))!;
}

/**
 * Receives stock against an order, in part or in full: each line at most what is outstanding
 * (422 with the line's field otherwise). Then tells the customers of jobs that got parts (parts
 * arrived, or ready to fit) and the shop's subscribers.
 */
export async function receivePurchaseOrder(m: Member, input: PurchaseOrderReceive) {
  authorize(m, "purchasing:write");
  const po = await getPurchaseOrder(m.shopId, input.id);
  if (!po) throw new NotFound("That purchase order");
  if (!PO_RECEIVABLE.includes(po.po.status))
    throw new InvalidTransition(
      po.po.status === "received"
        ? "Everything on this purchase order is received"
        : "A cancelled purchase order receives nothing",
    );
  const issues = receiptIssues(po.lines, input.lines);
  if (issues.length) throw new Invalid(issues[0]!.message, issues);
  const outcome = await receiveRow(m.shopId, po.po.id, input.lines);
  await tellAboutReceipt(m, po, outcome);
  return {
    purchaseOrder: (await getPurchaseOrder(m.shopId, po.po.id))!,
    released: outcome.released,
  };
}

async function tellAboutReceipt(
  m: Member,
  po: NonNullable<Awaited<ReturnType<typeof getPurchaseOrder>>>,
  outcome: Awaited<ReturnType<typeof receiveRow>>,
) {
  const appUrl = serverEnv().APP_URL;
  const bySku = new Map(po.lines.map((l) => [l.partId, l]));
  const label = poLabel(po.po.number);
  const occasion = `${po.po.id}:${outcome.po.version}`;
  const readyLabels: string[] = [];
  for (const jobId of outcome.jobsWithArrivals) {
    const job = await getJob(m.shopId, jobId);
    if (!job) continue;
    const ready = outcome.jobsReady.includes(jobId);
    if (ready) readyLabels.push(jobLabel(job.job.number));
    const arrived = outcome.released
      .filter((r) => r.quoteId === job.job.quoteId)
      .map((r) => `${r.quantity} × ${bySku.get(r.partId)?.description ?? "part"}`);
    await deliverNotice(
      {
        shopId: m.shopId,
        recordKind: "job",
        recordId: jobId,
        occasion: ready ? "" : occasion,
      },
      [job.customerEmail],
      {
        kind: ready ? "ready_to_fit" : "parts_arrived",
        shopName: m.shopName,
        customerName: job.customerName,
        job: jobLabel(job.job.number),
        buildTitle: job.buildTitle,
        parts: arrived,
        link: `${appUrl}/my/jobs/${jobId}`,
      },
    );
  }
  await notifyShop(
    { shopId: m.shopId, recordKind: "purchase_order", recordId: po.po.id, occasion },
    {
      kind: "staff_po_received",
      shopName: m.shopName,
      supplierName: po.supplierName,
      po: label,
      received: outcome.received.map(
        (r) => `${r.quantity} × ${bySku.get(r.partId)?.sku ?? "part"}`,
      ),
      jobsReady: readyLabels,
      link: `${appUrl}/purchasing/orders/${po.po.id}`,
    },
  );
}
