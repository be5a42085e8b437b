import { describe, expect, it } from "vitest";

import { DEMO_BUILDS, demoQuotes } from "@/db/seed";
import { statusHolds } from "@/lib/domain/builds";

/**
 * The demo builds obey the status rules the save command enforces (lib/domain/builds.ts): a
 * quoted build has a sent quote, an ordered or fitted one an accepted quote, a verified one a
 * verified dyno log (the seed makes none, so no demo build is verified).
 */
describe("seeded demo builds", () => {
  const quotes = demoQuotes();
  it.each(DEMO_BUILDS.map((b) => [b.title, b] as const))("%s is consistent", (_title, b) => {
    const facts = {
      quotes: quotes
        .filter((q) => q.build.id === b.id)
        .map((q) => ({ status: q.status, validUntil: q.validUntil })),
      verifiedLog: false,
      today: new Date().toISOString().slice(0, 10),
    };
    expect(statusHolds(b.status, facts)).toBe(true);
  });

  it("the rule would catch a seeded build verified without a log", () => {
    const facts = { quotes: [], verifiedLog: false, today: "2025-01-01" };
    expect(statusHolds("verified", facts)).toBe(false);
    expect(statusHolds("fitted", facts)).toBe(false);
  });
});
