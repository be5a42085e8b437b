import type { z } from "zod";

import { deleteLogo, setLogo } from "@/db/queries/logos";
import { updateShopSettings } from "@/db/queries/shops";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { NotFound } from "@/lib/domain/errors";
import type { ImageInfo } from "@/lib/images/logo";
import type { ShopSettingsSchema } from "@/lib/validations/settings";

export type ShopSettingsInput = z.output<typeof ShopSettingsSchema>;

/** The shop's name and defaults, as the owner saves them; money and rates kept as integers. */
export async function saveShopSettings(member: Member, input: ShopSettingsInput): Promise<void> {
  authorize(member, "settings:update");
  const { shopName, taxRatePct, labourRate, depositPct, address, phone, ...rest } = input;
  await updateShopSettings(member.shopId, shopName, {
    ...rest,
    taxRateBp: Math.round(taxRatePct * 100),
    labourRateMinor: Math.round(labourRate * 100),
    depositBp: Math.round(depositPct * 100),
    // Sent empty clears the line; not sent leaves it as it is.
    ...(address === undefined ? {} : { address: address || null }),
    ...(phone === undefined ? {} : { phone: phone || null }),
  });
}

/** Uploads or replaces the shop's logo (bytes already judged by lib/images/logo). */
export async function setShopLogo(member: Member, input: { bytes: Buffer; info: ImageInfo }) {
  authorize(member, "settings:update");
  return setLogo(member.shopId, member.user.id, input.bytes, input.info);
}

/** Removes the shop's logo; NotFound when there is none. */
export async function removeShopLogo(member: Member): Promise<void> {
  authorize(member, "settings:update");
  if (!(await deleteLogo(member.shopId))) throw new NotFound("The shop's logo");
}
