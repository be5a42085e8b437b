import type { z } from "zod";

import { deleteLogo, setLogo } from "@/db/queries/logos";
import { getShopSettings, updateShopSettings } from "@/db/queries/shops";
import type { ShopSettings } from "@/db/schema";
import type { Member } from "@/lib/auth/member";
import { authorize } from "@/lib/auth/permissions";
import { Invalid, NotFound } from "@/lib/domain/errors";
import type { ImageInfo } from "@/lib/images/logo";
import { shopSettingsView, type ShopSettingsView } from "@/lib/shop/settings-view";
import { shopLimitsAfter } from "@/lib/tune/limits";
import {
  DESIGN_ORDER_MESSAGE,
  dutyOrderIssue,
  type ShopSettingsPatchSchema,
  type ShopSettingsSchema,
} from "@/lib/validations/settings";

export type ShopSettingsInput = z.output<typeof ShopSettingsSchema>;
export type ShopSettingsPatch = Partial<ShopSettingsInput> & {
  tuneLimits?: z.output<typeof ShopSettingsPatchSchema>["tuneLimits"];
};

/** The shop's settings as the form and the API show them (any staff member reads them). */
export async function readShopSettings(member: Member): Promise<ShopSettingsView> {
  authorize(member, "settings:read");
  const s = await getShopSettings(member.shopId);
  if (!s) throw new NotFound("The shop's settings");
  return shopSettingsView(s.name, s.settings);
}

/**
 * The shop's name and defaults as the owner saves them — every field from the form, any of them
 * from the API; a setting not sent keeps its value. Money and rates are kept as integers. The
 * rules across fields are checked on the settings as they will be.
 */
export async function saveShopSettings(
  member: Member,
  input: ShopSettingsPatch,
): Promise<ShopSettingsView> {
  authorize(member, "settings:update");
  const current = await getShopSettings(member.shopId);
  if (!current) throw new NotFound("The shop's settings");
  const caution = input.dutyCautionPct ?? current.settings.dutyCautionPct;
  const danger = input.dutyDangerPct ?? current.settings.dutyDangerPct;
  if (caution > danger) {
    // On the field sent; both sent: the caution level (the message says why).
    const issue = dutyOrderIssue(
      { caution: input.dutyCautionPct !== undefined, danger: input.dutyDangerPct !== undefined },
      caution,
      danger,
    );
    throw Invalid.field(issue.path, issue.message);
  }
  const design = input.designDutyPct ?? current.settings.designDutyPct;
  const touched = (["designDutyPct", "dutyCautionPct"] as const).filter(
    (k) => input[k] !== undefined,
  );
  if (touched.length > 0 && design > caution)
    throw new Invalid(
      DESIGN_ORDER_MESSAGE,
      touched.map((path) => ({ path, message: DESIGN_ORDER_MESSAGE })),
    );
  const { shopName, taxRatePct, labourRate, depositPct, address, phone } = input;
  const picked = Object.fromEntries(
    COLUMNS_BY_NAME.flatMap((k) => (input[k] === undefined ? [] : [[k, input[k]]])),
  );
  // The tune limits: the fields sent over the shop's; the library's defaults saved as they are
  // stay the library's (nothing written).
  const limits =
    input.tuneLimits === undefined
      ? { write: false, limits: null }
      : shopLimitsAfter(current.settings.tuneLimits, input.tuneLimits);
  await updateShopSettings(member.shopId, shopName, {
    ...picked,
    ...(limits.write ? { tuneLimits: limits.limits } : {}),
    ...(taxRatePct === undefined ? {} : { taxRateBp: Math.round(taxRatePct * 100) }),
    ...(labourRate === undefined ? {} : { labourRateMinor: Math.round(labourRate * 100) }),
    ...(depositPct === undefined ? {} : { depositBp: Math.round(depositPct * 100) }),
    // Sent empty clears the line; not sent leaves it as it is.
    ...(address === undefined ? {} : { address: address || null }),
    ...(phone === undefined ? {} : { phone: phone || null }),
  });
  return readShopSettings(member);
}

/** Settings stored under the name the form uses. */
const COLUMNS_BY_NAME = [
  "currency",
  "country",
  "units",
  "paperSize",
  "timeZone",
  "bsfcGasolineNa",
  "bsfcGasolineBoosted",
  "bsfcE85Na",
  "bsfcE85Boosted",
  "designDutyPct",
  "dutyCautionPct",
  "dutyDangerPct",
  "minPumpMarginPct",
  "maxLineDropKpa",
  "lossManualPct",
  "lossAutomaticPct",
  "lossAwdPct",
  "gasolineDensityKgPerL",
  "gasolineStoichAfr",
  "ethanolDensityKgPerL",
  "ethanolStoichAfr",
  "quoteValidDays",
] as const satisfies readonly (keyof ShopSettingsInput & keyof ShopSettings)[];

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
