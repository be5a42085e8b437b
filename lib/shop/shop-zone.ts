import "server-only";

import { cache } from "react";

import { getShopSettings } from "@/db/queries/shops";

/** The shop's time zone (an IANA name), once per request; UTC for a shop without settings. */
export const shopTimeZone = cache(async (shopId: string): Promise<string> => {
  const s = await getShopSettings(shopId);
  return s?.settings.timeZone ?? "UTC";
});
