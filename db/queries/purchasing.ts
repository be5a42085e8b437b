import { and, asc, desc, eq, inArray, isNull, ne, or, sql } from "drizzle-orm";

import { db } from "@/db";
import {
  jobLines,
  jobs,
  parts,
  purchaseOrderLines,
  purchaseOrders,
  quoteLines,
  quotes,
  supplierParts,
  suppliers,
  type PurchaseOrder,
  type Supplier,
} from "@/db/schema";
import { unitsOf } from "@/lib/catalog/stock";
import { Conflict, NotFound } from "@/lib/domain/errors";
import { jobStatusFor } from "@/lib/domain/jobs";
import { PO_RECEIVABLE } from "@/lib/domain/operations";
import { poStatusAfterReceipt, releaseBackOrders, type BackOrder } from "@/lib/domain/purchasing";
import { QUOTE_HOLDS_STOCK } from "@/lib/domain/quotes";
import type { SupplierCreate, SupplierUpdate } from "@/lib/validations/operations";

import { nextShopNumber, type Tx } from "./counters";
import { differs } from "./unchanged";

// ---------------------------------------------------------------- suppliers

export type SupplierWithParts = Supplier & {
  parts: {
    partId: string;
    sku: string;
    name: string;
    supplierSku: string;
    costMinor: number | null;
  }[];
};

const nameTaken = (name: string) =>
  Conflict.field("name", `A supplier named ${name} is already listed`, "duplicate_name");

const isUniqueViolation = (e: unknown) =>
  (e as { code?: string; cause?: { code?: string } }).code === "23505" ||
  (e as { cause?: { code?: string } }).cause?.code === "23505";

async function checkParts(tx: Tx, shopId: string, ids: string[]) {
  if (ids.length === 0) return;
  const found = await tx
    .select({ id: parts.id })
    .from(parts)
    .where(and(eq(parts.shopId, shopId), inArray(parts.id, ids)));
  if (found.length !== new Set(ids).size)
    throw new Conflict("A part named here is not in this shop's catalog; nothing was saved");
}

async function writeSupplierParts(
  tx: Tx,
  shopId: string,
  supplierId: string,
  list: NonNullable<SupplierCreate["parts"]>,
) {
  await checkParts(
    tx,
    shopId,
    list.map((p) => p.partId),
  );
  await tx
    .delete(supplierParts)
    .where(and(eq(supplierParts.shopId, shopId), eq(supplierParts.supplierId, supplierId)));
  const seen = new Set<string>();
  const rows = list.filter((p) => !seen.has(p.partId) && seen.add(p.partId));
  if (rows.length)
    await tx.insert(supplierParts).values(
      rows.map((p) => ({
        shopId,
        supplierId,
        partId: p.partId,
        supplierSku: p.supplierSku,
        costMinor: p.costMinor ?? null,
      })),
    );
}

export async function listSuppliers(shopId: string) {
  return db
    .select()
    .from(suppliers)
    .where(eq(suppliers.shopId, shopId))
    .orderBy(asc(suppliers.name));
}

export async function getSupplier(shopId: string, id: string): Promise<SupplierWithParts | null> {
  const [s] = await db
    .select()
    .from(suppliers)
    .where(and(eq(suppliers.shopId, shopId), eq(suppliers.id, id)))
    .limit(1);
  if (!s) return null;
  const rows = await db
    .select({
      partId: supplierParts.partId,
      sku: parts.sku,
      name: parts.name,
      supplierSku: supplierParts.supplierSku,
      costMinor: supplierParts.costMinor,
    })
    .from(supplierParts)
    .innerJoin(parts, eq(parts.id, supplierParts.partId))
    .where(and(eq(supplierParts.shopId, shopId), eq(supplierParts.supplierId, id)))
    .orderBy(asc(parts.sku));
  return { ...s, parts: rows };
}

const supplierColumns = (v: Partial<SupplierCreate>) => ({
  ...(v.name !== undefined ? { name: v.name } : {}),
  ...(v.contactName !== undefined ? { contactName: v.contactName || null } : {}),
  ...(v.email !== undefined ? { email: v.email || null } : {}),
  ...(v.phone !== undefined ? { phone: v.phone || null } : {}),
  ...(v.leadTimeDays !== undefined ? { leadTimeDays: v.leadTimeDays ?? null } : {}),
  ...(v.notes !== undefined ? { notes: v.notes || null } : {}),
});

export async function insertSupplier(shopId: string, v: SupplierCreate): Promise<Supplier> {
  try {
    return await db.transaction(async (tx) => {
      const [s] = await tx
        .insert(suppliers)
        .values({ shopId, name: v.name, ...supplierColumns(v) })
        .returning();
      if (v.parts) await writeSupplierParts(tx, shopId, s!.id, v.parts);
      return s!;
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw nameTaken(v.name);
    throw e;
  }
}

/** Writes the fields given; `parts` is the whole list. A stale version is a Conflict; an unchanged save writes nothing. */
export async function updateSupplier(shopId: string, v: SupplierUpdate): Promise<Supplier> {
  const { id, version, parts: list, ...fields } = v;
  try {
    return await db.transaction(async (tx) => {
      const [s] = await tx
        .select()
        .from(suppliers)
        .where(and(eq(suppliers.shopId, shopId), eq(suppliers.id, id)))
        .for("update")
        .limit(1);
      if (!s) throw new NotFound("That supplier");
      if (version !== undefined && version !== s.version)
        throw new Conflict(
          `Someone changed this supplier meanwhile (now version ${s.version}); nothing was overwritten`,
          "conflict",
          s,
        );
      let partsChanged = false;
      if (list) {
        const stored = await tx
          .select()
          .from(supplierParts)
          .where(and(eq(supplierParts.shopId, shopId), eq(supplierParts.supplierId, id)))
          .orderBy(asc(supplierParts.partId));
        const key = (p: { partId: string; supplierSku: string; costMinor?: number | null }) =>
          `${p.partId}|${p.supplierSku}|${p.costMinor ?? ""}`;
        const next = [...new Map(list.map((p) => [p.partId, p])).values()]
          .map(key)
          .sort()
          .join(",");
        partsChanged = stored.map(key).sort().join(",") !== next;
        if (partsChanged) await writeSupplierParts(tx, shopId, id, list);
      }
      const cols = supplierColumns(fields);
      const [done] = await tx
        .update(suppliers)
        .set({ ...cols, version: s.version + 1, updatedAt: new Date() })
        .where(and(eq(suppliers.id, id), partsChanged ? undefined : differs(suppliers, cols)))
        .returning();
      return done ?? s;
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw nameTaken(fields.name ?? "that");
    throw e;
  }
}

/** Removes a supplier with no purchase orders (409 supplier_in_use otherwise). */
export async function deleteSupplier(shopId: string, id: string) {
  return db.transaction(async (tx) => {
    const [used] = await tx
      .select({ id: purchaseOrders.id })
      .from(purchaseOrders)
      .where(and(eq(purchaseOrders.shopId, shopId), eq(purchaseOrders.supplierId, id)))
      .limit(1);
    if (used)
      throw new Conflict(
        "This supplier has purchase orders and stays on the list",
        "supplier_in_use",
      );
    const gone = await tx
      .delete(suppliers)
      .where(and(eq(suppliers.shopId, shopId), eq(suppliers.id, id)))
      .returning({ id: suppliers.id });
    if (!gone.length) throw new NotFound("That supplier");
  });
}

// ---------------------------------------------------------------- reorder list

/**
 * Per part: units accepted quotes want and no stock holds (quotes that hold stock, whose job is
 * not fitted yet), and units on purchase orders not yet received.
 */
export async function reorderFacts(shopId: string) {
  const [back, onOrder, catalog, offers] = await Promise.all([
    db
      .select({
        partId: quoteLines.partId,
        short: sql<number>`sum(greatest(0, ceil(${quoteLines.quantityMilli} / 1000.0)::int - ${quoteLines.heldQty}))::int`,
      })
      .from(quoteLines)
      .innerJoin(quotes, eq(quotes.id, quoteLines.quoteId))
      .leftJoin(jobs, eq(jobs.quoteId, quotes.id))
      .where(
        and(
          eq(quoteLines.shopId, shopId),
          eq(quoteLines.kind, "part"),
          inArray(quotes.status, [...QUOTE_HOLDS_STOCK]),
          or(isNull(jobs.id), ne(jobs.status, "fitted")),
        ),
      )
      .groupBy(quoteLines.partId),
    db
      .select({
        partId: purchaseOrderLines.partId,
        open: sql<number>`sum(${purchaseOrderLines.quantity} - ${purchaseOrderLines.receivedQty})::int`,
      })
      .from(purchaseOrderLines)
      .innerJoin(purchaseOrders, eq(purchaseOrders.id, purchaseOrderLines.purchaseOrderId))
      .where(
        and(
          eq(purchaseOrderLines.shopId, shopId),
          inArray(purchaseOrders.status, [...PO_RECEIVABLE]),
        ),
      )
      .groupBy(purchaseOrderLines.partId),
    db
      .select({
        id: parts.id,
        sku: parts.sku,
        name: parts.name,
        brand: parts.brand,
        stock: parts.stock,
        reserved: parts.reserved,
        reorderLevel: parts.reorderLevel,
        costMinor: parts.costMinor,
        leadTimeDays: parts.leadTimeDays,
      })
      .from(parts)
      .where(eq(parts.shopId, shopId))
      .orderBy(asc(parts.sku)),
    db
      .select({
        partId: supplierParts.partId,
        supplierId: supplierParts.supplierId,
        supplierName: suppliers.name,
        supplierSku: supplierParts.supplierSku,
        costMinor: supplierParts.costMinor,
      })
      .from(supplierParts)
      .innerJoin(suppliers, eq(suppliers.id, supplierParts.supplierId))
      .where(eq(supplierParts.shopId, shopId))
      .orderBy(asc(suppliers.name)),
  ]);
  return {
    parts: catalog,
    backOrdered: new Map(
      back.flatMap((b) => (b.partId && b.short > 0 ? [[b.partId, b.short]] : [])),
    ),
    onOrder: new Map(onOrder.map((o) => [o.partId, o.open])),
    offers,
  };
}

// ---------------------------------------------------------------- purchase orders

export async function listPurchaseOrders(shopId: string) {
  return db
    .select({ po: purchaseOrders, supplierName: suppliers.name })
    .from(purchaseOrders)
    .innerJoin(suppliers, eq(suppliers.id, purchaseOrders.supplierId))
    .where(eq(purchaseOrders.shopId, shopId))
    .orderBy(desc(purchaseOrders.number));
}

export async function getPurchaseOrder(shopId: string, id: string) {
  const [row] = await db
    .select({
      po: purchaseOrders,
      supplierName: suppliers.name,
      supplierEmail: suppliers.email,
      supplierContact: suppliers.contactName,
    })
    .from(purchaseOrders)
    .innerJoin(suppliers, eq(suppliers.id, purchaseOrders.supplierId))
    .where(and(eq(purchaseOrders.shopId, shopId), eq(purchaseOrders.id, id)))
    .limit(1);
  if (!row) return null;
  const lines = await db
    .select()
    .from(purchaseOrderLines)
    .where(and(eq(purchaseOrderLines.shopId, shopId), eq(purchaseOrderLines.purchaseOrderId, id)))
    .orderBy(asc(purchaseOrderLines.position));
  return { ...row, lines };
}

export type PurchaseOrderRow = NonNullable<Awaited<ReturnType<typeof getPurchaseOrder>>>;

/** A new purchase order with the shop's next number; lines at the supplier's cost, else the part's. */
export async function insertPurchaseOrder(
  shopId: string,
  userId: string,
  v: {
    supplierId: string;
    currency: string;
    notes?: string;
    lines: { partId: string; quantity: number; unitCostMinor?: number }[];
  },
): Promise<PurchaseOrder> {
  return db.transaction(async (tx) => {
    const [s] = await tx
      .select({ id: suppliers.id })
      .from(suppliers)
      .where(and(eq(suppliers.shopId, shopId), eq(suppliers.id, v.supplierId)))
      .limit(1);
    if (!s) throw new NotFound("That supplier");
    const ids = [...new Set(v.lines.map((l) => l.partId))];
    const found = await tx
      .select({
        id: parts.id,
        sku: parts.sku,
        brand: parts.brand,
        name: parts.name,
        costMinor: parts.costMinor,
        supplierSku: supplierParts.supplierSku,
        supplierCost: supplierParts.costMinor,
      })
      .from(parts)
      .leftJoin(
        supplierParts,
        and(eq(supplierParts.partId, parts.id), eq(supplierParts.supplierId, v.supplierId)),
      )
      .where(and(eq(parts.shopId, shopId), inArray(parts.id, ids)));
    const byId = new Map(found.map((p) => [p.id, p]));
    if (byId.size !== ids.length)
      throw new Conflict("A part on this order is not in this shop's catalog; nothing was saved");
    const number = await nextShopNumber(tx, shopId, "purchase_order");
    const lines = v.lines.map((l, i) => {
      const p = byId.get(l.partId)!;
      return {
        shopId,
        position: i + 1,
        partId: p.id,
        sku: p.sku,
        supplierSku: p.supplierSku,
        description: `${p.brand} ${p.name}`,
        quantity: l.quantity,
        unitCostMinor: l.unitCostMinor ?? p.supplierCost ?? p.costMinor,
      };
    });
    const totalMinor = lines.reduce((s, l) => s + l.quantity * l.unitCostMinor, 0);
    const [po] = await tx
      .insert(purchaseOrders)
      .values({
        shopId,
        number,
        supplierId: v.supplierId,
        currency: v.currency,
        notes: v.notes || null,
        totalMinor,
        createdBy: userId,
      })
      .returning();
    await tx
      .insert(purchaseOrderLines)
      .values(lines.map((l) => ({ ...l, purchaseOrderId: po!.id })));
    return po!;
  });
}

/** A draft order was e-mailed to the supplier: it is sent. */
export async function markPurchaseOrderSent(shopId: string, id: string) {
  await db
    .update(purchaseOrders)
    .set({
      status: "sent",
      sentAt: new Date(),
      version: sql`${purchaseOrders.version} + 1`,
      updatedAt: new Date(),
    })
    .where(
      and(
        eq(purchaseOrders.shopId, shopId),
        eq(purchaseOrders.id, id),
        eq(purchaseOrders.status, "draft"),
      ),
    );
}

/**
 * Cancels an order in one transaction, if it is still the version the person saw and nothing
 * was received against it (its lines locked); else Conflict, nothing written. Its units stop
 * counting as on order, so the back-orders they were for are on the reorder list again.
 */
export async function cancelPurchaseOrderRow(
  shopId: string,
  id: string,
  version: number,
): Promise<PurchaseOrder> {
  return db.transaction(async (tx) => {
    const [po] = await tx
      .select()
      .from(purchaseOrders)
      .where(and(eq(purchaseOrders.shopId, shopId), eq(purchaseOrders.id, id)))
      .for("update")
      .limit(1);
    if (!po) throw new NotFound("That purchase order");
    if (po.version !== version)
      throw new Conflict(
        `Someone changed this purchase order meanwhile (now version ${po.version}); it was not cancelled`,
        "conflict",
        po,
      );
    const lines = await tx
      .select({ receivedQty: purchaseOrderLines.receivedQty })
      .from(purchaseOrderLines)
      .where(eq(purchaseOrderLines.purchaseOrderId, id))
      .for("update");
    if ((po.status !== "draft" && po.status !== "sent") || lines.some((l) => l.receivedQty > 0))
      throw new Conflict("This purchase order can no longer be cancelled", "not_cancellable", po);
    const [done] = await tx
      .update(purchaseOrders)
      .set({ status: "cancelled", version: po.version + 1, updatedAt: new Date() })
      .where(eq(purchaseOrders.id, id))
      .returning();
    return done!;
  });
}

/** What a receipt did: the lines it filled and the jobs it moved. */
export interface ReceiptOutcome {
  po: PurchaseOrder;
  received: { partId: string; quantity: number }[];
  /** Back-ordered quote lines given stock, in the order they were given it. */
  released: { quoteId: string; quoteLineId: string; partId: string; quantity: number }[];
  /** Jobs that got parts, and those of them now ready to fit. */
  jobsWithArrivals: string[];
  jobsReady: string[];
}

/**
 * Takes stock in against an order, in one transaction: the order's lines (locked) must still
 * have the units outstanding (else Conflict, nothing written); each part's stock goes up; then
 * the free units go to back-ordered lines of quotes that hold stock, oldest acceptance first
 * (`releaseBackOrders`), raising the lines' `held_qty`, the parts' `reserved` and their jobs'
 * allocation; a job with every part in becomes ready to fit.
 */
export async function receivePurchaseOrder(
  shopId: string,
  id: string,
  receive: { lineId: string; quantity: number }[],
): Promise<ReceiptOutcome> {
  return db.transaction(async (tx) => {
    const [po] = await tx
      .select()
      .from(purchaseOrders)
      .where(and(eq(purchaseOrders.shopId, shopId), eq(purchaseOrders.id, id)))
      .for("update")
      .limit(1);
    if (!po) throw new NotFound("That purchase order");
    if (!PO_RECEIVABLE.includes(po.status))
      throw new Conflict(
        `This purchase order is ${po.status.replace("_", " ")}; nothing was received`,
        "not_receivable",
        po,
      );
    const lines = await tx
      .select()
      .from(purchaseOrderLines)
      .where(eq(purchaseOrderLines.purchaseOrderId, id))
      .orderBy(asc(purchaseOrderLines.position))
      .for("update");
    const byId = new Map(lines.map((l) => [l.id, l]));
    const intake = new Map<string, number>();
    for (const r of receive) {
      const l = byId.get(r.lineId);
      if (!l || r.quantity > l.quantity - l.receivedQty)
        throw new Conflict("This order changed meanwhile; nothing was received", "conflict", po);
      if (r.quantity === 0) continue;
      l.receivedQty += r.quantity;
      await tx
        .update(purchaseOrderLines)
        .set({ receivedQty: l.receivedQty })
        .where(eq(purchaseOrderLines.id, l.id));
      intake.set(l.partId, (intake.get(l.partId) ?? 0) + r.quantity);
    }
    const partIds = [...intake.keys()].sort();
    const locked = await tx
      .select({ id: parts.id, stock: parts.stock, reserved: parts.reserved })
      .from(parts)
      .where(and(eq(parts.shopId, shopId), inArray(parts.id, partIds)))
      .orderBy(asc(parts.id))
      .for("update");
    for (const p of locked) {
      p.stock += intake.get(p.id)!;
      await tx.update(parts).set({ stock: p.stock }).where(eq(parts.id, p.id));
    }
    const { released, jobsWithArrivals, jobsReady } = await fillBackOrders(
      tx,
      shopId,
      new Map(locked.map((p) => [p.id, Math.max(0, p.stock - p.reserved)])),
    );
    const status = poStatusAfterReceipt(lines);
    const [done] = await tx
      .update(purchaseOrders)
      .set({
        status,
        ...(status === "received" ? { receivedAt: new Date() } : {}),
        version: po.version + 1,
        updatedAt: new Date(),
      })
      .where(eq(purchaseOrders.id, id))
      .returning();
    return {
      po: done!,
      received: [...intake].map(([partId, quantity]) => ({ partId, quantity })),
      released,
      jobsWithArrivals,
      jobsReady,
    };
  });
}

/**
 * Gives free units (the parts' rows locked by the caller) to back-ordered quote lines, oldest
 * acceptance first, and moves their jobs' allocation and status with them.
 */
async function fillBackOrders(tx: Tx, shopId: string, free: Map<string, number>) {
  const partIds = [...free.keys()];
  const none = { released: [], jobsWithArrivals: [], jobsReady: [] };
  if (partIds.length === 0) return none;
  const waiting = await tx
    .select({
      lineId: quoteLines.id,
      quoteId: quoteLines.quoteId,
      partId: quoteLines.partId,
      position: quoteLines.position,
      quantityMilli: quoteLines.quantityMilli,
      held: quoteLines.heldQty,
      acceptedAt: quotes.acceptedAt,
      statusChangedAt: quotes.statusChangedAt,
    })
    .from(quoteLines)
    .innerJoin(quotes, eq(quotes.id, quoteLines.quoteId))
    .leftJoin(jobs, eq(jobs.quoteId, quotes.id))
    .where(
      and(
        eq(quoteLines.shopId, shopId),
        eq(quoteLines.kind, "part"),
        inArray(quoteLines.partId, partIds),
        inArray(quotes.status, [...QUOTE_HOLDS_STOCK]),
        or(isNull(jobs.id), ne(jobs.status, "fitted")),
        sql`${quoteLines.heldQty} < ceil(${quoteLines.quantityMilli} / 1000.0)`,
      ),
    )
    .for("update", { of: quoteLines });
  const backOrders: BackOrder[] = waiting.map((w) => ({
    lineId: w.lineId,
    quoteId: w.quoteId,
    partId: w.partId!,
    position: w.position,
    wanted: unitsOf(w.quantityMilli),
    held: w.held,
    acceptedAt: (w.acceptedAt ?? w.statusChangedAt ?? new Date(0)).toISOString(),
  }));
  const give = releaseBackOrders(backOrders, free);
  if (give.size === 0) return none;
  const released: ReceiptOutcome["released"] = [];
  const byPart = new Map<string, number>();
  const sorted = backOrders.filter((b) => give.has(b.lineId));
  sorted.sort(
    (a, b) =>
      a.acceptedAt.localeCompare(b.acceptedAt) ||
      a.quoteId.localeCompare(b.quoteId) ||
      a.position - b.position,
  );
  for (const b of sorted) {
    const qty = give.get(b.lineId)!;
    released.push({ quoteId: b.quoteId, quoteLineId: b.lineId, partId: b.partId, quantity: qty });
    byPart.set(b.partId, (byPart.get(b.partId) ?? 0) + qty);
    await tx
      .update(quoteLines)
      .set({ heldQty: b.held + qty })
      .where(eq(quoteLines.id, b.lineId));
    await tx
      .update(jobLines)
      .set({ allocatedQty: sql`${jobLines.allocatedQty} + ${qty}` })
      .where(and(eq(jobLines.shopId, shopId), eq(jobLines.quoteLineId, b.lineId)));
  }
  for (const [partId, qty] of byPart)
    await tx
      .update(parts)
      .set({ reserved: sql`${parts.reserved} + ${qty}` })
      .where(eq(parts.id, partId));
  const quoteIds = [...new Set(released.map((r) => r.quoteId))];
  const touched = await tx
    .select()
    .from(jobs)
    .where(and(eq(jobs.shopId, shopId), inArray(jobs.quoteId, quoteIds)))
    .for("update");
  const jobsReady: string[] = [];
  for (const j of touched) {
    if (j.status !== "waiting_parts") continue;
    const ls = await tx
      .select({ quantity: jobLines.quantity, allocatedQty: jobLines.allocatedQty })
      .from(jobLines)
      .where(eq(jobLines.jobId, j.id));
    if (jobStatusFor(ls) === "ready") {
      jobsReady.push(j.id);
      await tx
        .update(jobs)
        .set({
          status: "ready",
          readyAt: new Date(),
          version: j.version + 1,
          updatedAt: new Date(),
        })
        .where(eq(jobs.id, j.id));
    }
  }
  return { released, jobsWithArrivals: touched.map((j) => j.id), jobsReady };
}
