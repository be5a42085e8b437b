"use server";

import { revalidatePath } from "next/cache";

import { memberAction } from "@/lib/actions/member-action";
import { PATHS } from "@/lib/cache-tags";
import { changeMemberRole, inviteMember, removeMember } from "@/lib/members/member-commands";
import { settingsFromShown } from "@/lib/shop/settings-view";
import { readShopSettings, saveShopSettings } from "@/lib/shop/shop-commands";
import {
  InviteSchema,
  MemberRemoveSchema,
  MemberRoleSchema,
  ShopSettingsFormSchema,
} from "@/lib/validations/settings";

/** The settings form: typed in the viewer's units, saved canonical (a value left as shown kept). */
export const updateSettingsAction = memberAction(ShopSettingsFormSchema, async (m, input) => {
  const before = await readShopSettings(m);
  const after = await saveShopSettings(m, settingsFromShown(input, before));
  // A save that changes nothing writes nothing (not even `updatedAt`), and says so.
  if (JSON.stringify(after) === JSON.stringify(before))
    return { ok: true, message: "Nothing to save" };
  revalidatePath(PATHS.settings);
  return { ok: true, message: "Shop settings saved" };
});

export const inviteMemberAction = memberAction(InviteSchema, async (m, input) => {
  const { email } = await inviteMember(m, input);
  revalidatePath(PATHS.settings);
  return { ok: true, message: `Invitation sent to ${email}` };
});

export const changeRoleAction = memberAction(MemberRoleSchema, async (m, input) => {
  const { changed } = await changeMemberRole(m, input);
  revalidatePath(PATHS.settings);
  return { ok: true, message: changed ? "Role changed" : "No change" };
});

export const removeMemberAction = memberAction(MemberRemoveSchema, async (m, input) => {
  await removeMember(m, input);
  revalidatePath(PATHS.settings);
  return { ok: true, message: "Member removed" };
});
