import { describe, expect, it } from "vitest";

import { formatDate, formatDateTime } from "@/lib/format/dates";

// Expected strings: the en-GB patterns of the Unicode CLDR data Node and Chromium ship.
describe("formatDate", () => {
  it("gives day, short month name and year, in UTC by default", () => {
    expect(formatDate("2026-03-04T23:30:00Z")).toBe("4 Mar 2026");
  });

  it("gives the calendar day of the time zone asked for", () => {
    expect(formatDate("2026-03-04T23:30:00Z", { timeZone: "Europe/Berlin" })).toBe("5 Mar 2026");
    expect(formatDate("2026-03-05T02:00:00Z", { timeZone: "America/Los_Angeles" })).toBe(
      "4 Mar 2026",
    );
  });

  it("takes a Date, an ISO string or epoch milliseconds alike", () => {
    const d = new Date("2026-01-31T12:00:00Z");
    expect(formatDate(d)).toBe("31 Jan 2026");
    expect(formatDate(d.toISOString())).toBe("31 Jan 2026");
    expect(formatDate(d.getTime())).toBe("31 Jan 2026");
  });

  it("refuses what is not a date", () => {
    expect(() => formatDate("not a date")).toThrow(RangeError);
    expect(() => formatDate(Number.NaN)).toThrow(RangeError);
  });

  it("refuses an unknown time zone", () => {
    expect(() => formatDate("2026-03-04T00:00:00Z", { timeZone: "Mars/Olympus" })).toThrow(
      RangeError,
    );
  });

  it("does not change the Date it is given", () => {
    const d = new Date("2026-03-04T23:30:00Z");
    formatDate(d, { timeZone: "Asia/Tokyo" });
    expect(d.toISOString()).toBe("2026-03-04T23:30:00.000Z");
  });
});

describe("formatDateTime", () => {
  it("gives a 24-hour time with the zone's name, UTC by default", () => {
    expect(formatDateTime("2026-03-04T23:30:00Z")).toBe("4 Mar 2026, 23:30 UTC");
    expect(formatDateTime("2026-03-04T00:05:00Z")).toBe("4 Mar 2026, 00:05 UTC");
  });

  it("moves day and time into the zone asked for, summer time included", () => {
    expect(formatDateTime("2026-07-04T23:30:00Z", { timeZone: "Europe/Berlin" })).toBe(
      "5 Jul 2026, 01:30 CEST",
    );
    expect(formatDateTime("2026-01-04T23:30:00Z", { timeZone: "Europe/Berlin" })).toBe(
      "5 Jan 2026, 00:30 CET",
    );
  });

  it("refuses what is not a date", () => {
    expect(() => formatDateTime("2026-13-45")).toThrow(RangeError);
  });
});
