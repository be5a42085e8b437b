import "server-only";

import { getShopSettings } from "@/db/queries/shops";

import { LIBRARY_SIZING_SETTINGS, sizingSettingsOf, type SizingSettings } from "./effective-inputs";

/** The shop's sizing settings as they are today (a shop without a settings row: the library's). */
export async function shopSizingSettings(shopId: string): Promise<SizingSettings> {
  const s = await getShopSettings(shopId);
  return s ? sizingSettingsOf(s.settings) : LIBRARY_SIZING_SETTINGS;
}
