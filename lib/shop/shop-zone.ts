import "server-only";

import { cache } from "react";

import { getShopSettings } from "@/db/queries/shops";
import { calendarDay } from "@/lib/format/dates";

/** The shop's time zone (an IANA name), once per request; UTC for a shop without settings. */
export const shopTimeZone = cache(async (shopId: string): Promise<string> => {
  const s = await getShopSettings(shopId);
  return s?.settings.timeZone ?? "UTC";
});

/** Today on the shop's calendar (YYYY-MM-DD in its time zone): what quote validity is judged on. */
export async function shopToday(shopId: string, at: Date = new Date()): Promise<string> {
  return calendarDay(at, await shopTimeZone(shopId));
}
