import { requireMember } from "@/lib/auth/member";
import { readJson } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { readShopSettings, saveShopSettings } from "@/lib/shop/shop-commands";
import { ShopSettingsPatchSchema } from "@/lib/validations/settings";

/** GET — the shop's settings by the settings form's names (staff). */
export const GET = handle(async () => {
  const m = await requireMember("settings:read");
  return Response.json({ settings: await readShopSettings(m) });
});

/**
 * PATCH — change any of the settings (owner): `{ designDutyPct: 75, bsfcE85Boosted: 520 }`;
 * those not sent keep their value, a null fuel property goes back to the library's. Numbers are
 * JSON numbers ("72" is a 422 on its field); otherwise validated like the form → `{ settings }`
 * as they are now.
 */
export const PATCH = handle(async (req) => {
  const m = await requireMember("settings:update");
  const input = ShopSettingsPatchSchema.parse(await readJson(req));
  return Response.json({ settings: await saveShopSettings(m, input) });
});
