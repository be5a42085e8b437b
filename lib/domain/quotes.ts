/** The quote's vocabulary: statuses, the moves between them, line kinds, payments, labels. */

import { calendarDay } from "@/lib/format/dates";

export const QUOTE_STATUSES = [
  "draft",
  "sent",
  "accepted",
  "deposit_paid",
  "ordered",
  "declined",
  "expired",
  "superseded",
] as const;
export type QuoteStatus = (typeof QUOTE_STATUSES)[number];

/**
 * Where a quote may go next. Accepted quotes hold stock; declining or expiring one releases it.
 * A sent quote never goes back to draft: what the customer was sent is changed only by a new
 * revision (see QUOTE_REVISED_ON_EDIT).
 */
export const QUOTE_NEXT: Record<QuoteStatus, readonly QuoteStatus[]> = {
  draft: ["sent"],
  sent: ["accepted", "declined", "expired"],
  accepted: ["deposit_paid", "declined", "expired"],
  deposit_paid: ["ordered"],
  ordered: [],
  declined: [],
  expired: [],
  superseded: [],
};
/** Edited in place: only a draft, which the customer has never seen. */
export const QUOTE_EDITABLE: readonly QuoteStatus[] = ["draft"];
/**
 * Editing one of these makes its next revision (same number, revision + 1, a draft to be sent
 * again) and supersedes it, in one transaction: the customer keeps what they were sent.
 */
export const QUOTE_REVISED_ON_EDIT: readonly QuoteStatus[] = ["sent"];
export const QUOTE_HOLDS_STOCK: readonly QuoteStatus[] = ["accepted", "deposit_paid", "ordered"];

export const QUOTE_STATUS_LABELS: Record<QuoteStatus, string> = {
  draft: "Draft",
  sent: "Sent",
  accepted: "Accepted",
  deposit_paid: "Deposit paid",
  ordered: "Ordered",
  declined: "Declined",
  expired: "Expired",
  superseded: "Replaced by a revision",
};

/**
 * A day as YYYY-MM-DD on the shop's calendar (its time zone): the day a quote's validity is
 * judged on, as the clock's sweep (expireQuotes) judges it. Server code asks `shopToday`.
 */
export const isoDay = (at: Date = new Date(), timeZone = "UTC") => calendarDay(at, timeZone);

/** Statuses whose validity still runs: an open offer, and an acceptance awaiting its deposit. */
export const QUOTE_LAPSES: readonly QuoteStatus[] = ["sent", "accepted"];

type Dated = { status: QuoteStatus; validUntil: string };

/** A sent or accepted quote whose valid-until day (valid through that day) is before `today`. */
export const pastValidity = (q: Dated, today: string) =>
  QUOTE_LAPSES.includes(q.status) && q.validUntil < today;

/**
 * The status as of `today`: a sent or accepted quote past its date is expired whatever the
 * stored status says (expireDueQuotes writes the expiry later; reads never write it).
 */
export const quoteStatusOn = (q: Dated, today: string): QuoteStatus =>
  pastValidity(q, today) ? "expired" : q.status;

/** The moves that answer an offer: none of them once its date has passed. */
const ANSWERS: readonly QuoteStatus[] = ["accepted", "declined", "deposit_paid"];

/** Where a quote may go on `today`: QUOTE_NEXT, less accepting, declining and deposits once past its date. */
export const quoteMovesOn = (q: Dated, today: string): readonly QuoteStatus[] =>
  pastValidity(q, today)
    ? QUOTE_NEXT[q.status].filter((s) => !ANSWERS.includes(s))
    : QUOTE_NEXT[q.status];

export const QUOTE_LINE_KINDS = ["part", "labour", "fee"] as const;

export const PAYMENT_STATUSES = ["pending", "paid", "expired"] as const;
export type PaymentStatus = (typeof PAYMENT_STATUSES)[number];

/** Q-0007, or Q-0007-r2 for a later revision. */
export const quoteLabel = (number: number, revision: number) =>
  `Q-${String(number).padStart(4, "0")}${revision > 1 ? `-r${revision}` : ""}`;

/** How the quotes list sorts (its filter and the API's `sort`). */
export const QUOTE_SORTS = ["newest", "oldest", "total", "valid", "customer"] as const;
export type QuoteSort = (typeof QUOTE_SORTS)[number];
export const QUOTE_SORT_LABELS: Record<QuoteSort, string> = {
  newest: "Newest first",
  oldest: "Oldest first",
  total: "Total, highest first",
  valid: "Valid until, soonest first",
  customer: "Customer name",
};
