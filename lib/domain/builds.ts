/** The build sheet's vocabulary: statuses, the moves between them, kit roles and labels. */

import { quoteStatusOn, type QuoteStatus } from "./quotes";

export const BUILD_STATUSES = [
  "needs_sizing",
  "draft",
  "sized",
  "quoted",
  "ordered",
  "fitted",
  "verified",
] as const;
export type BuildStatus = (typeof BUILD_STATUSES)[number];

export const KIT_ROLES = [
  "injector",
  "pump",
  "regulator",
  "feed-line",
  "return-line",
  /** Before the pump: a coarse strainer (30 µm and up). */
  "pre-filter",
  /** After the pump: the fine filter (below 30 µm). Kept as "filter" for choices stored before. */
  "filter",
  "sensor",
] as const;
export type KitRole = (typeof KIT_ROLES)[number];
export const KIT_ROLE_LABELS: Record<KitRole, string> = {
  injector: "injectors",
  pump: "fuel pump",
  regulator: "regulator",
  "feed-line": "feed line",
  "return-line": "return line",
  "pre-filter": "pre-pump strainer",
  filter: "post-pump filter",
  sensor: "ethanol content sensor",
};
/** A catalog part chosen for a build, with the figures it was chosen on. */
export interface ChosenPart {
  role: KitRole;
  partId: string;
  sku: string;
  name: string;
  quantity: number;
}

/**
 * Status moves: forward one step, or back to draft for a rework. Each forward move past sized
 * also has a precondition on the build's quotes or dyno logs: see `statusMoves`.
 */
export const STATUS_NEXT: Record<BuildStatus, readonly BuildStatus[]> = {
  // The counter's draft from a caller's goal: the tuner sizes it (or takes it on as a draft).
  needs_sizing: ["sized", "draft"],
  draft: ["sized"],
  sized: ["draft", "quoted"],
  quoted: ["draft", "ordered"],
  ordered: ["fitted"],
  fitted: ["verified"],
  verified: ["draft"],
};

export const STATUS_LABELS: Record<BuildStatus, string> = {
  needs_sizing: "Needs sizing",
  draft: "Draft",
  sized: "Sized",
  quoted: "Quoted",
  ordered: "Ordered",
  fitted: "Fitted",
  verified: "Verified",
};

/**
 * The fuel a caller names for a draft build, and the ethanol range (vol %) the tuner starts from:
 * pump gasoline up to E10 (common practice, no source: US pump gasoline is sold E0–E10), pump E85
 * at ASTM D5798's 51–83 % (lib/calc DEFAULT_E85_RANGE), flex fuel across both (0–83 %).
 */
export const FUEL_CHOICES = ["gasoline", "e85", "flex"] as const;
export type FuelChoice = (typeof FUEL_CHOICES)[number];
export const FUEL_CHOICE_LABELS: Record<FuelChoice, string> = {
  gasoline: "Pump gasoline (E0–E10)",
  e85: "E85 (51–83 % ethanol)",
  flex: "Flex fuel (gasoline to E85)",
};
export const FUEL_CHOICE_RANGES: Record<
  FuelChoice,
  { ethanolMinVolPct: number; ethanolMaxVolPct: number }
> = {
  gasoline: { ethanolMinVolPct: 0, ethanolMaxVolPct: 10 },
  e85: { ethanolMinVolPct: 51, ethanolMaxVolPct: 83 },
  flex: { ethanolMinVolPct: 0, ethanolMaxVolPct: 83 },
};

/** A vehicle as words, as builds keep it: "2004 Subaru Impreza WRX STI (EJ257)". */
export const vehicleText = (v: {
  year: number;
  make: string;
  model: string;
  engine?: string | null;
}) => `${v.year} ${v.make} ${v.model}${v.engine ? ` (${v.engine})` : ""}`.slice(0, 200);

/** What a build's status moves depend on besides the build itself. */
export interface BuildStatusFacts {
  /** The build's quotes (superseded revisions left out) with their validity. */
  quotes: readonly { status: QuoteStatus; validUntil: string }[];
  /** A dyno log of this build was marked verified after the build was last a draft. */
  verifiedLog: boolean;
  /** YYYY-MM-DD on the shop's calendar: the day quote validity is judged on (lib/shop/shop-zone#shopToday). */
  today: string;
}

/** One move the status control may offer, and if it is not allowed now, why (a sentence). */
export interface StatusMove {
  to: BuildStatus;
  allowed: boolean;
  reason: string | null;
}

/** Quote statuses (as of today) that count as the customer having been quoted. */
const QUOTED: readonly QuoteStatus[] = ["sent", "accepted", "deposit_paid", "ordered"];
/** Quote statuses (as of today) an order of the build's parts rests on. */
const ORDER_STANDS: readonly QuoteStatus[] = ["accepted", "deposit_paid", "ordered"];

/** What is missing for a move into `to` (null: nothing). */
function missingFor(to: BuildStatus, facts: BuildStatusFacts): string | null {
  const now = facts.quotes.map((q) => quoteStatusOn(q, facts.today));
  const where =
    now.length === 0
      ? "there is no quote for it yet"
      : now.every((s) => s === "draft")
        ? "its quote is still a draft; send it first"
        : now.some((s) => s === "sent")
          ? "its quote is sent and waiting for the customer"
          : "none of its quotes is open (declined or expired)";
  switch (to) {
    case "quoted":
      return now.some((s) => QUOTED.includes(s))
        ? null
        : `Quoted needs a quote for this build sent to the customer and still valid: ${where}.`;
    case "ordered":
      return now.some((s) => ORDER_STANDS.includes(s))
        ? null
        : `Ordered needs this build's quote accepted by the customer (or its deposit paid): ${where}.`;
    case "fitted":
      return now.some((s) => ORDER_STANDS.includes(s))
        ? null
        : `Fitted needs the order to stand, a quote for this build accepted, deposit paid or ordered: ${where}.`;
    case "verified":
      return facts.verifiedLog
        ? null
        : "Verified needs a verified dyno log: upload a pull on the build's Dyno logs page, analyse it and mark it verified there.";
    default:
      return null;
  }
}

/**
 * The moves out of `from` (STATUS_NEXT), each allowed or not with the reason, given the facts.
 * The one rule the save command enforces and the status control shows:
 * - sized: from draft or needs sizing, nothing more (every save sizes the inputs);
 * - quoted: a quote for the build that is sent, accepted, deposit paid or ordered, where a sent or
 *   accepted one past its valid-until day counts as expired;
 * - ordered, fitted: a quote for the build accepted (within its validity), deposit paid or ordered;
 * - verified: a dyno log of the build marked verified since the build was last a draft (the dyno
 *   screen's "Mark verified" marks the log and moves the build in one go);
 * - back to draft: always, where STATUS_NEXT has it.
 */
export function statusMoves(from: BuildStatus, facts: BuildStatusFacts): StatusMove[] {
  return STATUS_NEXT[from].map((to) => {
    const reason = missingFor(to, facts);
    return { to, allowed: reason === null, reason };
  });
}

/**
 * Whether a build may rightly be in `status` given the facts: the precondition of the move into
 * it holds (what the seeded demo builds are checked against).
 */
export const statusHolds = (status: BuildStatus, facts: BuildStatusFacts): boolean =>
  missingFor(status, facts) === null;

/** The statuses a build in `from` may move to now. */
export const allowedMoves = (from: BuildStatus, facts: BuildStatusFacts): BuildStatus[] =>
  statusMoves(from, facts)
    .filter((m) => m.allowed)
    .map((m) => m.to);

/** Why the move `from` → `to` is refused now, or null if it is allowed (staying put always is). */
export function refusedMove(
  from: BuildStatus,
  to: BuildStatus,
  facts: BuildStatusFacts,
): string | null {
  if (from === to) return null;
  if (!STATUS_NEXT[from].includes(to))
    return `A build cannot go from ${STATUS_LABELS[from]} to ${STATUS_LABELS[to]}`;
  return missingFor(to, facts);
}

/**
 * The dyno screen's "Mark verified" with an analysed log: marking that log verified is what the
 * move needs, so it is allowed where a fitted build may become verified (or a verified one is
 * verified again with another log).
 */
export const canVerifyWithLog = (from: BuildStatus, facts: BuildStatusFacts): boolean =>
  from === "verified" || refusedMove(from, "verified", { ...facts, verifiedLog: true }) === null;
