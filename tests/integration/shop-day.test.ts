import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { calendarDay } from "@/lib/format/dates";
import { sweepExpiredQuotes } from "@/lib/quotes/quote-commands";

import { makeOtherShop, sql } from "../helpers/db";
import { request, signIn, type Client } from "../helpers/http";

/**
 * A quote is valid through its valid-until day on the shop's own calendar: the screens, the
 * API and the clock's sweep read "today" in the shop's time zone, never in UTC. A shop in Los
 * Angeles at 5 pm on the 3rd (already the 4th in UTC) still has an open quote valid until the 3rd.
 */

let owner: Client;
let shopId: string;
let customerId: string;

beforeAll(async () => {
  const shop = await makeOtherShop();
  shopId = shop.shopId;
  owner = await signIn(shop.email, shop.password);
  const r = await request(owner, "POST", "/api/v1/customers", { name: "Zone Test Customer" });
  expect(r.status).toBe(201);
  customerId = r.json.customer.id;
});
afterAll(async () => {
  await sql.end();
});

/** A sent quote of the test shop valid through `day`, written directly (its status is the point). */
async function sentQuoteValidThrough(day: string): Promise<string> {
  const r = await request(owner, "POST", "/api/v1/quotes", { customerId });
  expect(r.status).toBe(201);
  const id = r.json.quote.id as string;
  await sql`update quotes set status = 'sent', valid_until = ${day} where id = ${id}`;
  return id;
}
const setZone = (zone: string) =>
  sql`update shop_settings set time_zone = ${zone} where shop_id = ${shopId}`;

describe("quote validity on the shop's calendar", () => {
  it("the sweep judges each shop's day in its own zone", async () => {
    await setZone("America/Los_Angeles");
    const id = await sentQuoteValidThrough("2026-03-03");
    // 2026-03-04T01:00Z is 17:00 on the 3rd in Los Angeles (PST, UTC−8): still valid.
    const early = await sweepExpiredQuotes(new Date("2026-03-04T01:00:00Z"));
    expect(early.expired).not.toContain(id);
    const [kept] = await sql`select status from quotes where id = ${id}`;
    expect(kept!.status).toBe("sent");
    // 2026-03-04T09:00Z is 01:00 on the 4th there: past its day, expired by the sweep.
    const late = await sweepExpiredQuotes(new Date("2026-03-04T09:00:00Z"));
    expect(late.expired).toContain(id);
    const [gone] = await sql`select status from quotes where id = ${id}`;
    expect(gone!.status).toBe("expired");
  });

  it("the API lists a quote as open or expired by the shop's day, not UTC's", async () => {
    // Whatever the hour, one of these two zones is on a different calendar day from UTC
    // (UTC−12 before noon UTC, UTC+14 from 10:00 UTC): the day the shop and UTC disagree on.
    const now = new Date();
    const utcDay = calendarDay(now, "UTC");
    const west = calendarDay(now, "Etc/GMT+12");
    const zone = west !== utcDay ? "Etc/GMT+12" : "Pacific/Kiritimati";
    const shopDay = calendarDay(now, zone);
    expect(shopDay).not.toBe(utcDay);
    await setZone(zone);
    // Valid through the earlier of the two days: open for a shop whose today it is, else expired.
    const earlier = shopDay < utcDay ? shopDay : utcDay;
    const id = await sentQuoteValidThrough(earlier);
    const r = await request(owner, "GET", "/api/v1/quotes");
    expect(r.status).toBe(200);
    const listed = (r.json.quotes as { id: string; status: string }[]).find((q) => q.id === id);
    expect(listed?.status).toBe(shopDay === earlier ? "sent" : "expired");
  });
});
