import { describe, expect, it } from "vitest";

import {
  allowedMoves,
  canVerifyWithLog,
  refusedMove,
  statusMoves,
  type BuildStatusFacts,
} from "@/lib/domain/builds";
import { pastValidity, quoteMovesOn, quoteStatusOn, type QuoteStatus } from "@/lib/domain/quotes";

/** The status rules of lib/domain: what the commands enforce and the controls offer. */

const TODAY = "2025-06-15";
const facts = (quotes: [QuoteStatus, string][] = [], verifiedLog = false): BuildStatusFacts => ({
  quotes: quotes.map(([status, validUntil]) => ({ status, validUntil })),
  verifiedLog,
  today: TODAY,
});

describe("quote validity, judged on the day", () => {
  it("a sent or accepted quote is valid through its valid-until day, expired after it", () => {
    expect(pastValidity({ status: "sent", validUntil: "2025-06-15" }, TODAY)).toBe(false);
    expect(pastValidity({ status: "sent", validUntil: "2025-06-14" }, TODAY)).toBe(true);
    expect(quoteStatusOn({ status: "accepted", validUntil: "2025-06-14" }, TODAY)).toBe("expired");
    // A draft never went out, and a paid deposit or an order is past the offer: no expiry.
    for (const status of ["draft", "deposit_paid", "ordered", "declined"] as const)
      expect(quoteStatusOn({ status, validUntil: "2000-01-01" }, TODAY)).toBe(status);
  });

  it("past its date a quote can no longer be accepted, declined or paid, only marked expired", () => {
    expect(quoteMovesOn({ status: "sent", validUntil: "2025-06-14" }, TODAY)).toEqual(["expired"]);
    expect(quoteMovesOn({ status: "accepted", validUntil: "2025-06-14" }, TODAY)).toEqual([
      "expired",
    ]);
    expect(quoteMovesOn({ status: "sent", validUntil: TODAY }, TODAY)).toEqual([
      "accepted",
      "declined",
      "expired",
    ]);
    expect(quoteMovesOn({ status: "deposit_paid", validUntil: "2000-01-01" }, TODAY)).toEqual([
      "ordered",
    ]);
  });

  it("a sent quote never goes back to draft (a change is a new revision)", () => {
    expect(quoteMovesOn({ status: "sent", validUntil: "2099-01-01" }, TODAY)).not.toContain(
      "draft",
    );
  });
});

describe("build status moves and their preconditions", () => {
  it("a draft build may only be sized; never verified", () => {
    expect(allowedMoves("draft", facts([], true))).toEqual(["sized"]);
    expect(refusedMove("draft", "verified", facts([], true))).toBe(
      "A build cannot go from Draft to Verified",
    );
    expect(canVerifyWithLog("draft", facts())).toBe(false);
  });

  it("quoted needs a quote for the build sent and still valid", () => {
    expect(refusedMove("sized", "quoted", facts())).toMatch(/there is no quote for it yet/);
    expect(refusedMove("sized", "quoted", facts([["draft", "2099-01-01"]]))).toMatch(
      /still a draft; send it first/,
    );
    expect(refusedMove("sized", "quoted", facts([["sent", "2025-06-01"]]))).toMatch(
      /declined or expired/,
    );
    expect(refusedMove("sized", "quoted", facts([["sent", "2099-01-01"]]))).toBeNull();
    expect(refusedMove("sized", "quoted", facts([["ordered", "2000-01-01"]]))).toBeNull();
    expect(allowedMoves("sized", facts())).toEqual(["draft"]);
  });

  it("ordered and fitted need the quote accepted (within its date), its deposit paid, or ordered", () => {
    expect(refusedMove("quoted", "ordered", facts([["sent", "2099-01-01"]]))).toMatch(
      /sent and waiting for the customer/,
    );
    expect(refusedMove("quoted", "ordered", facts([["accepted", "2025-06-14"]]))).toMatch(
      /Ordered needs/,
    );
    for (const s of ["accepted", "deposit_paid", "ordered"] as const) {
      expect(refusedMove("quoted", "ordered", facts([[s, "2099-01-01"]]))).toBeNull();
      expect(refusedMove("ordered", "fitted", facts([[s, "2099-01-01"]]))).toBeNull();
    }
    expect(refusedMove("ordered", "fitted", facts([["declined", "2099-01-01"]]))).toMatch(
      /Fitted needs the order to stand/,
    );
    expect(refusedMove("ordered", "verified", facts([["ordered", "2099-01-01"]], true))).toBe(
      "A build cannot go from Ordered to Verified",
    );
  });

  it("verified needs a verified dyno log; the dyno screen's mark is that log", () => {
    expect(refusedMove("fitted", "verified", facts())).toMatch(/needs a verified dyno log/);
    expect(refusedMove("fitted", "verified", facts([], true))).toBeNull();
    expect(canVerifyWithLog("fitted", facts())).toBe(true);
    expect(canVerifyWithLog("verified", facts())).toBe(true);
    expect(canVerifyWithLog("quoted", facts())).toBe(false);
  });

  it("back to draft is always allowed where the workflow has it; staying put is no move", () => {
    for (const from of ["sized", "quoted", "verified"] as const)
      expect(refusedMove(from, "draft", facts())).toBeNull();
    expect(refusedMove("ordered", "ordered", facts())).toBeNull();
    expect(statusMoves("fitted", facts())).toEqual([
      {
        to: "verified",
        allowed: false,
        reason: expect.stringMatching(/^Verified needs a verified dyno log/),
      },
    ]);
  });
});
