"use server";

import { APIError } from "better-auth/api";
import { revalidatePath } from "next/cache";
import { headers } from "next/headers";

import {
  countOwners,
  getMember,
  removeMember,
  setMemberRole,
  updateShopSettings,
} from "@/db/queries/shops";
import { memberAction } from "@/lib/actions/member-action";
import { auth } from "@/lib/auth";
import { PATHS } from "@/lib/cache-tags";
import { Forbidden, NotFound } from "@/lib/domain/errors";
import {
  InviteSchema,
  MemberRemoveSchema,
  MemberRoleSchema,
  ShopSettingsSchema,
} from "@/lib/validations/settings";

export const updateSettingsAction = memberAction(
  "settings:update",
  ShopSettingsSchema,
  async ({ shopName, taxRatePct, labourRate, depositPct, ...rest }, m) => {
    await updateShopSettings(m.shopId, shopName, {
      ...rest,
      taxRateBp: Math.round(taxRatePct * 100),
      labourRateMinor: Math.round(labourRate * 100),
      depositBp: Math.round(depositPct * 100),
      address: rest.address || null,
      phone: rest.phone || null,
    });
    revalidatePath(PATHS.settings);
    return { ok: true, message: "Shop settings saved" };
  },
);

export const inviteMemberAction = memberAction(
  "members:manage",
  InviteSchema,
  async ({ email, role }, m) => {
    try {
      await auth.api.createInvitation({
        body: { email, role, organizationId: m.shopId },
        headers: await headers(),
      });
    } catch (e) {
      if (e instanceof APIError)
        return {
          ok: false,
          message: e.message || "The invitation was refused",
          fieldErrors: { email: [e.message || "Refused"] },
          values: { email, role },
        };
      throw e;
    }
    revalidatePath(PATHS.settings);
    return { ok: true, message: `Invitation sent to ${email}` };
  },
);

async function guardLastOwner(shopId: string, memberId: string) {
  const target = await getMember(shopId, memberId);
  if (!target) throw new NotFound("That member");
  if (target.role === "owner" && (await countOwners(shopId)) <= 1)
    throw new Forbidden("The shop needs at least one owner");
  return target;
}

export const changeRoleAction = memberAction(
  "members:manage",
  MemberRoleSchema,
  async ({ memberId, role }, m) => {
    const target = await guardLastOwner(m.shopId, memberId);
    if (target.role === "owner" && role === "owner") return { ok: true, message: "No change" };
    await setMemberRole(m.shopId, memberId, role);
    revalidatePath(PATHS.settings);
    return { ok: true, message: "Role changed" };
  },
);

export const removeMemberAction = memberAction(
  "members:manage",
  MemberRemoveSchema,
  async ({ memberId }, m) => {
    await guardLastOwner(m.shopId, memberId);
    await removeMember(m.shopId, memberId);
    revalidatePath(PATHS.settings);
    return { ok: true, message: "Member removed" };
  },
);
