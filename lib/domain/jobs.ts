/**
 * Job rules (pure): when a job is ready to fit, what fitting issues from stock, and what the
 * invoice raised from it charges and how its balance adds up with the payments ledger.
 */

import { mulDivRound } from "@/lib/catalog/money";
import { quoteTotals } from "@/lib/catalog/quote-totals";

import type { FieldIssue } from "./errors";
import type { JobStatus } from "./operations";

export interface JobLineState {
  id: string;
  quoteLineId: string | null;
  partId: string | null;
  sku: string | null;
  description: string;
  quantity: number;
  allocatedQty: number;
  unitPriceMinor: number;
  discountBp: number;
}

/** Ready to fit when every part line has all its units; else waiting for parts. */
export function jobStatusFor(lines: Pick<JobLineState, "quantity" | "allocatedQty">[]): JobStatus {
  return lines.every((l) => l.allocatedQty >= l.quantity) ? "ready" : "waiting_parts";
}

export interface FittedPart {
  partId: string;
  quantity: number;
}

export interface FitPlan {
  /** Units fitted per job line (0: not fitted). */
  fitted: Map<string, number>;
  /** Parts fitted that no job line names (a substitute or an extra): new lines. */
  extra: FittedPart[];
  /** Units issued from stock per part: what was fitted. */
  issue: Map<string, number>;
  /** Units each part's `reserved` gives back: what the job held. */
  release: Map<string, number>;
}

/**
 * What fitting does with stock: each fitted part's units go first to the job's lines of that
 * part (in order), the rest become extra lines; stock is issued for every unit fitted, and the
 * job's holds are released (what was held and not fitted goes back to free stock).
 */
export function fitPlan(lines: JobLineState[], fittedParts: FittedPart[]): FitPlan {
  const want = new Map<string, number>();
  for (const f of fittedParts) want.set(f.partId, (want.get(f.partId) ?? 0) + f.quantity);
  const issue = new Map(want);
  const fitted = new Map<string, number>();
  const release = new Map<string, number>();
  for (const l of lines) {
    if (l.partId && l.allocatedQty > 0)
      release.set(l.partId, (release.get(l.partId) ?? 0) + l.allocatedQty);
    const left = l.partId ? (want.get(l.partId) ?? 0) : 0;
    const take = Math.min(left, l.quantity);
    fitted.set(l.id, take);
    if (l.partId) want.set(l.partId, left - take);
  }
  // What is left over after the lines of a part is added to its last line, else is extra.
  const extra: FittedPart[] = [];
  for (const [partId, qty] of want) {
    if (qty <= 0) continue;
    const last = [...lines].reverse().find((l) => l.partId === partId);
    if (last) fitted.set(last.id, (fitted.get(last.id) ?? 0) + qty);
    else extra.push({ partId, quantity: qty });
  }
  return { fitted, extra, issue, release };
}

/**
 * Stock a fit needs and does not have: for each part, units fitted may not exceed what is on the
 * shelf less what other quotes hold (stock − reserved + what this job holds).
 */
export function fitShortages(
  plan: FitPlan,
  parts: Map<string, { stock: number; reserved: number; sku: string }>,
  index: Map<string, number>,
): FieldIssue[] {
  const issues: FieldIssue[] = [];
  for (const [partId, qty] of plan.issue) {
    const p = parts.get(partId);
    const i = index.get(partId) ?? 0;
    if (!p) {
      issues.push({
        path: `parts.${i}.partId`,
        message: "That part is not in this shop's catalog",
      });
      continue;
    }
    const usable = p.stock - p.reserved + (plan.release.get(partId) ?? 0);
    if (qty > usable)
      issues.push({
        path: `parts.${i}.quantity`,
        message: `Only ${Math.max(0, usable)} of ${p.sku} on the shelf for this job`,
      });
  }
  return issues;
}

/** An invoice line in the quote's shape. */
export interface ChargeLine {
  kind: "part" | "labour" | "fee";
  partId: string | null;
  sku: string | null;
  description: string;
  quantityMilli: number;
  unitPriceMinor: number;
  discountBp: number;
}

/**
 * What a part line bills, in thousandths, for the whole units fitted. Stock moves in whole units
 * (part of a unit is a unit), but a quote may sell part of one (1.5 m of hose): the units fitted
 * up to the quoted ones bill at most the quoted quantity, and each unit beyond it bills whole.
 *
 * @example billedMilli(2, 2, 1500) // → 1500: fitted as quoted, billed as quoted
 * @example billedMilli(1, 2, 1500) // → 1000: one unit fitted
 * @example billedMilli(3, 2, 1500) // → 2500: the quoted 1.5 and one more
 */
export function billedMilli(fitted: number, unitsWanted: number, quotedMilli: number | null) {
  if (quotedMilli === null) return fitted * 1000;
  return Math.min(fitted * 1000, quotedMilli) + Math.max(0, fitted - unitsWanted) * 1000;
}

/**
 * The invoice's lines from a fitted job: each part line as fitted (the quoted quantity for the
 * quoted units — `quotedMilli` by quote line, see `billedMilli` — at the quoted price and
 * discount; a part not fitted is left out; an extra part at its catalog price), the labour line
 * at the quoted rate for the hours used, exactly (the quote's hours when none are given), and
 * the quote's fees as quoted.
 */
export function invoiceLinesFromJob(
  job: { labourMilli: number | null },
  lines: (JobLineState & { fittedQty: number | null })[],
  quoteOther: ChargeLine[],
  quotedMilli: ReadonlyMap<string, number> = new Map(),
): ChargeLine[] {
  const out: ChargeLine[] = [];
  for (const l of lines) {
    const units = l.fittedQty ?? 0;
    if (units <= 0) continue;
    out.push({
      kind: "part",
      partId: l.partId,
      sku: l.sku,
      description: l.description,
      quantityMilli: billedMilli(
        units,
        l.quantity,
        l.quoteLineId ? (quotedMilli.get(l.quoteLineId) ?? null) : null,
      ),
      unitPriceMinor: l.unitPriceMinor,
      discountBp: l.discountBp,
    });
  }
  let labourDone = false;
  for (const q of quoteOther) {
    if (q.kind === "labour") {
      if (labourDone) continue;
      labourDone = true;
      const hours = job.labourMilli ?? q.quantityMilli;
      if (hours > 0) out.push({ ...q, quantityMilli: hours });
    } else if (q.kind === "fee") out.push(q);
  }
  return out;
}

/** The invoice's figures: quote arithmetic (tax once on the subtotal), then the deposit off. */
export function invoiceTotals(lines: ChargeLine[], taxRateBp: number, depositMinor: number) {
  const t = quoteTotals(lines, taxRateBp);
  return {
    subtotalMinor: t.subtotalMinor,
    discountMinor: t.discountMinor,
    taxMinor: t.taxMinor,
    totalMinor: t.totalMinor,
    depositMinor,
    dueMinor: t.totalMinor - depositMinor,
  };
}

/**
 * What is still owed on an issued invoice, from the ledger: total − deposit − credit notes −
 * balance payments received. Negative means the customer paid more than is owed (a refund due).
 *
 * @example invoiceBalance({ totalMinor: 10000, depositMinor: 3000, credits: [500], payments: [] })
 * // → { creditedMinor: 500, paidMinor: 0, balanceMinor: 6500 }
 */
export function invoiceBalance(v: {
  totalMinor: number;
  depositMinor: number;
  credits: number[];
  payments: number[];
}) {
  const creditedMinor = v.credits.reduce((s, x) => s + x, 0);
  const paidMinor = v.payments.reduce((s, x) => s + x, 0);
  return {
    creditedMinor,
    paidMinor,
    balanceMinor: v.totalMinor - v.depositMinor - creditedMinor - paidMinor,
  };
}

/**
 * The tax inside an amount that includes tax at `rateBp`: amount − amount ÷ (1 + rate), the net
 * rounded half up. 108.25 at 8.25 % → 8.25.
 */
export function taxInside(amountMinor: number, rateBp: number): number {
  return amountMinor - mulDivRound(amountMinor, 10_000, 10_000 + rateBp);
}

/**
 * What a fitted job did with its quote's parts, in one sentence for the quote's pages (which
 * then say no more about stock: the parts were issued). Lines in the job's order; a quoted part
 * fitted in no unit is named as not fitted.
 *
 * @example fittedSummary([{ description: "Pump A", quantity: 1, fittedQty: 1 }]) // "Fitted: 1 × Pump A."
 */
export function fittedSummary(
  lines: { description: string; quantity: number; fittedQty: number | null }[],
): string {
  const fitted = lines.filter((l) => (l.fittedQty ?? 0) > 0);
  const left = lines.filter((l) => l.quantity > 0 && (l.fittedQty ?? 0) === 0);
  const said = [
    fitted.length
      ? `Fitted: ${fitted.map((l) => `${l.fittedQty} × ${l.description}`).join(", ")}.`
      : "No parts were fitted.",
  ];
  if (left.length) said.push(`Quoted, not fitted: ${left.map((l) => l.description).join(", ")}.`);
  return said.join(" ");
}
