import { formatCalendarDate } from "@/lib/format/dates";

/**
 * Stock promised once (pure: no clock, no database). A quote holds only stock that is free
 * (available = stock − reserved); what it cannot hold is back-ordered, with the day the part is
 * expected. The accept transaction (db/queries/quotes.ts) holds with `allocate`; the quote page,
 * the portal and the kit say the same with `promiseLines` and `promiseText`.
 */

/** Whole units of a part line (quantities are kept in thousandths; part of a unit is a unit). */
export const unitsOf = (quantityMilli: number) => Math.max(0, Math.ceil(quantityMilli / 1000));

/** A part's stock as the promise needs it. */
export interface StockFacts {
  stock: number;
  reserved: number;
  /** Days from ordering to the shelf; null: not known. */
  leadTimeDays: number | null;
  /** The day a restock is announced for ("YYYY-MM-DD"); null: none. */
  restockOn: string | null;
}

/** Free units: stock less what accepted quotes hold (never below 0). */
export const freeOf = (p: Pick<StockFacts, "stock" | "reserved">) =>
  Math.max(0, p.stock - p.reserved);

/** "YYYY-MM-DD" + n days. */
export function addDays(isoDay: string, n: number): string {
  const d = new Date(`${isoDay}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
}

/**
 * The day a part not on the shelf is expected, counted from `today` (the shop's calendar day): an
 * announced restock that is not past, else today + the lead time, else null (to be confirmed).
 */
export function expectedOn(
  p: Pick<StockFacts, "leadTimeDays" | "restockOn">,
  today: string,
): string | null {
  if (p.restockOn && p.restockOn >= today) return p.restockOn;
  if (p.leadTimeDays !== null && p.leadTimeDays !== undefined)
    return addDays(today, p.leadTimeDays);
  return null;
}

/** A quote line as the promise sees it. */
export interface PromiseLine {
  kind: string;
  partId: string | null;
  quantityMilli: number;
}

/**
 * Units each line can hold now, in line order: part lines share their part's free units, first
 * come first served; other lines hold nothing. `free` is read under the parts' row locks by the
 * accept transaction, so two accepts never hold the same unit.
 */
export function allocate(lines: PromiseLine[], free: Map<string, number>): number[] {
  const left = new Map(free);
  return lines.map((l) => {
    if (l.kind !== "part" || !l.partId) return 0;
    const have = left.get(l.partId) ?? 0;
    const held = Math.min(unitsOf(l.quantityMilli), have);
    left.set(l.partId, have - held);
    return held;
  });
}

/** What a part line is promised: held (or holdable) units, back-ordered units and when. */
export interface LinePromise {
  wanted: number;
  held: number;
  backOrdered: number;
  /** When the back-ordered units are expected; null: to be confirmed (or nothing back-ordered). */
  expectedOn: string | null;
}

/**
 * Per line (null for labour and fees, and for a part no longer in the catalog): for a quote that
 * holds stock, what it holds (`heldQty`, stored at acceptance); otherwise what accepting it now
 * would hold, from the parts' free units.
 */
export function promiseLines(
  lines: (PromiseLine & { heldQty: number })[],
  parts: Map<string, StockFacts>,
  opts: { holding: boolean; today: string },
): (LinePromise | null)[] {
  const free = new Map([...parts].map(([id, p]) => [id, freeOf(p)]));
  const wouldHold = allocate(lines, free);
  return lines.map((l, i) => {
    if (l.kind !== "part" || !l.partId) return null;
    const part = parts.get(l.partId);
    if (!part) return null;
    const wanted = unitsOf(l.quantityMilli);
    const held = Math.min(wanted, opts.holding ? l.heldQty : wouldHold[i]!);
    const backOrdered = wanted - held;
    return {
      wanted,
      held,
      backOrdered,
      expectedOn: backOrdered > 0 ? expectedOn(part, opts.today) : null,
    };
  });
}

const byDate = (day: string | null) =>
  day ? `expected by ${formatCalendarDate(day)}` : "expected date to be confirmed by the shop";

/**
 * One line's promise as a person reads it. Offered (before accepting): "1 of 2 in stock; the
 * other expected by 12 Mar 2026". Held: "2 held" / "1 of 2 held; the other expected by …".
 */
export function promiseText(p: LinePromise, holding: boolean): string {
  const have = holding ? "held" : "in stock";
  if (p.backOrdered === 0) return p.wanted === 1 ? `${have}` : `all ${p.wanted} ${have}`;
  if (p.held === 0)
    return `${holding ? "none held" : "not in stock"}: back-ordered, ${byDate(p.expectedOn)}`;
  const rest = p.backOrdered === 1 ? "the other" : `the other ${p.backOrdered}`;
  return `${p.held} of ${p.wanted} ${have}; ${rest} ${byDate(p.expectedOn)}`;
}

/**
 * What accepting holds, in one sentence for the customer's confirmation and the portal: "The
 * shop will hold 1 × Pump A for you; 1 × Pump A is back-ordered, expected by 12 Mar 2026."
 */
export function holdSummary(
  lines: { description: string }[],
  promises: (LinePromise | null)[],
): string {
  const held: string[] = [];
  const later: string[] = [];
  promises.forEach((p, i) => {
    if (!p) return;
    const name = lines[i]!.description;
    if (p.held > 0) held.push(`${p.held} × ${name}`);
    if (p.backOrdered > 0) later.push(`${p.backOrdered} × ${name} (${byDate(p.expectedOn)})`);
  });
  if (held.length === 0 && later.length === 0) return "This quote has no parts to hold.";
  const first = held.length
    ? `The shop will hold ${held.join(", ")} for you`
    : "Nothing on this quote is in stock now";
  return later.length ? `${first}; back-ordered: ${later.join(", ")}.` : `${first}.`;
}
