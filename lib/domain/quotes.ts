/** The quote's vocabulary: statuses, the moves between them, line kinds, payments, labels. */

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

/** Where a quote may go next. Accepted quotes hold stock; declining or expiring one releases it. */
export const QUOTE_NEXT: Record<QuoteStatus, readonly QuoteStatus[]> = {
  draft: ["sent"],
  sent: ["accepted", "declined", "expired", "draft"],
  accepted: ["deposit_paid", "declined", "expired"],
  deposit_paid: ["ordered"],
  ordered: [],
  declined: [],
  expired: [],
  superseded: [],
};
export const QUOTE_EDITABLE: readonly QuoteStatus[] = ["draft", "sent"];
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

export const QUOTE_LINE_KINDS = ["part", "labour", "fee"] as const;

export const PAYMENT_STATUSES = ["pending", "paid", "expired"] as const;
export type PaymentStatus = (typeof PAYMENT_STATUSES)[number];

/** Q-0007, or Q-0007-r2 for a later revision. */
export const quoteLabel = (number: number, revision: number) =>
  `Q-${String(number).padStart(4, "0")}${revision > 1 ? `-r${revision}` : ""}`;
