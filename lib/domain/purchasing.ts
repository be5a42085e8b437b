/**
 * Purchasing rules (pure: no clock, no database): what to reorder, what a receipt may take in,
 * and which back-ordered quote lines arriving stock goes to — in the order the quotes were
 * accepted.
 */

import type { FieldIssue } from "./errors";
import type { PoStatus } from "./operations";

/** A part as the reorder list reads it. */
export interface ReorderPart {
  id: string;
  stock: number;
  reserved: number;
  /** The minimum free units the shop keeps on the shelf (0: none). */
  reorderLevel: number;
}

export interface ReorderRow {
  partId: string;
  free: number;
  /** Units accepted quotes want that no stock holds yet. */
  backOrdered: number;
  /** Units under the part's minimum (free stock counted). */
  belowMinimum: number;
  /** Units on purchase orders not yet received. */
  onOrder: number;
  /** What to order now: back-orders plus the minimum, less what is free or on order. */
  suggested: number;
}

/**
 * The reorder list: each part with back-orders or free stock under its minimum, and how many to
 * order — back-ordered + minimum − (free + on order), at least 0. Parts with nothing to order
 * are left out.
 *
 * @example reorderList([{ id: "p", stock: 1, reserved: 1, reorderLevel: 2 }], new Map([["p", 3]]), new Map())
 * // → [{ partId: "p", free: 0, backOrdered: 3, belowMinimum: 2, onOrder: 0, suggested: 5 }]
 */
export function reorderList(
  parts: ReorderPart[],
  backOrdered: Map<string, number>,
  onOrder: Map<string, number>,
): ReorderRow[] {
  return parts.flatMap((p) => {
    const free = Math.max(0, p.stock - p.reserved);
    const back = backOrdered.get(p.id) ?? 0;
    const below = Math.max(0, p.reorderLevel - free);
    if (back === 0 && below === 0) return [];
    const ordered = onOrder.get(p.id) ?? 0;
    const suggested = Math.max(0, back + p.reorderLevel - free - ordered);
    return [
      { partId: p.id, free, backOrdered: back, belowMinimum: below, onOrder: ordered, suggested },
    ];
  });
}

export interface PoLineState {
  id: string;
  quantity: number;
  receivedQty: number;
}

/**
 * A receipt checked against the order: each line named once, on this order, a whole number of
 * units no more than is still outstanding. Returns the field issues (empty: fine).
 */
export function receiptIssues(
  lines: PoLineState[],
  receive: { lineId: string; quantity: number }[],
): FieldIssue[] {
  const byId = new Map(lines.map((l) => [l.id, l]));
  const seen = new Set<string>();
  const issues: FieldIssue[] = [];
  receive.forEach((r, i) => {
    const l = byId.get(r.lineId);
    if (!l) issues.push({ path: `lines.${i}.lineId`, message: "That line is not on this order" });
    else if (seen.has(r.lineId))
      issues.push({ path: `lines.${i}.lineId`, message: "That line is named twice" });
    else if (r.quantity > l.quantity - l.receivedQty)
      issues.push({
        path: `lines.${i}.quantity`,
        message: `Only ${l.quantity - l.receivedQty} still outstanding on this line`,
      });
    seen.add(r.lineId);
  });
  if (receive.every((r) => r.quantity === 0) && issues.length === 0)
    issues.push({ path: "lines", message: "Receive at least one unit" });
  return issues;
}

/** The order's status once its lines have received what they have. */
export function poStatusAfterReceipt(lines: PoLineState[]): PoStatus {
  const any = lines.some((l) => l.receivedQty > 0);
  const all = lines.every((l) => l.receivedQty >= l.quantity);
  return all ? "received" : any ? "partly_received" : "sent";
}

/**
 * Why an order cannot be cancelled, or null when it can: only a draft or sent order that has
 * received nothing (what arrived stays booked against its order).
 */
export function cancelRefusal(status: PoStatus, lines: PoLineState[]): string | null {
  if (status === "cancelled") return "This purchase order is cancelled already";
  if (status === "received" || status === "partly_received" || lines.some((l) => l.receivedQty > 0))
    return "Parts were received against this purchase order; it can no longer be cancelled";
  return null;
}

/** A quote line waiting for stock: what it wants, what it holds, when its quote was accepted. */
export interface BackOrder {
  lineId: string;
  quoteId: string;
  partId: string;
  position: number;
  wanted: number;
  held: number;
  /** ISO time the quote was accepted. */
  acceptedAt: string;
}

/**
 * Which back-orders the free units go to: oldest acceptance first (then quote, then line
 * position), each line given at most what it still lacks. Returns the units to add per line.
 *
 * @example releaseBackOrders([{ lineId: "b", acceptedAt: "2026-02-02…", wanted: 2, held: 0, … },
 *   { lineId: "a", acceptedAt: "2026-02-01…", wanted: 1, held: 0, … }], new Map([["p", 2]]))
 * // → Map { "a" → 1, "b" → 1 }
 */
export function releaseBackOrders(
  backOrders: BackOrder[],
  free: Map<string, number>,
): Map<string, number> {
  const left = new Map(free);
  const out = new Map<string, number>();
  const ordered = [...backOrders].sort(
    (a, b) =>
      a.acceptedAt.localeCompare(b.acceptedAt) ||
      a.quoteId.localeCompare(b.quoteId) ||
      a.position - b.position,
  );
  for (const b of ordered) {
    const have = left.get(b.partId) ?? 0;
    const give = Math.min(have, Math.max(0, b.wanted - b.held));
    if (give <= 0) continue;
    left.set(b.partId, have - give);
    out.set(b.lineId, give);
  }
  return out;
}
