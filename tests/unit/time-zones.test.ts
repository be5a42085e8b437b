import { describe, expect, it } from "vitest";

import {
  canonicalTimeZone,
  OLD_ZONE_NAMES,
  TIME_ZONES,
  timeZoneMessage,
} from "@/lib/domain/time-zones";

/**
 * The time zones a shop may choose: the tz database's zone.tab and UTC. Check names are the tz
 * database's own (zone.tab and "backward", tzdata 2025b; from memory).
 */
describe("time zones a shop may choose", () => {
  it("every listed zone formats a date with the runtime's Intl", () => {
    for (const z of TIME_ZONES)
      expect(() => new Intl.DateTimeFormat("en-GB", { timeZone: z }), z).not.toThrow();
  });

  it("are Area/Location names and UTC; no abbreviations, no old names", () => {
    expect(TIME_ZONES.length).toBeGreaterThan(400);
    for (const z of TIME_ZONES) expect(z === "UTC" || z.includes("/"), z).toBe(true);
    expect(TIME_ZONES).toEqual(expect.arrayContaining(["America/New_York", "Asia/Kolkata"]));
    for (const z of ["EST", "US/Eastern", "Asia/Calcutta", "GMT", "Etc/UTC"])
      expect(TIME_ZONES, z).not.toContain(z);
    // Every old name points at a listed zone.
    for (const [old, now] of Object.entries(OLD_ZONE_NAMES)) expect(TIME_ZONES, old).toContain(now);
  });

  it("reads a name without regard to case and spells it as listed", () => {
    expect(canonicalTimeZone(" europe/berlin ")).toBe("Europe/Berlin");
    expect(canonicalTimeZone("utc")).toBe("UTC");
    expect(canonicalTimeZone("EST")).toBeNull();
    expect(canonicalTimeZone("US/Eastern")).toBeNull();
    expect(canonicalTimeZone("constructor")).toBeNull();
  });

  it("says why a name is refused", () => {
    expect(timeZoneMessage("EST")).toMatch(/^Time zone EST is an abbreviation/);
    expect(timeZoneMessage("Asia/Calcutta")).toBe(
      "Time zone Asia/Calcutta is an old name: use Asia/Kolkata",
    );
    expect(timeZoneMessage("+02:00")).toMatch(/use UTC/);
    expect(timeZoneMessage("Mars/Olympus")).toMatch(/choose one from the list/);
  });
});
