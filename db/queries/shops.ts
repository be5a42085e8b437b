import { randomBytes, randomUUID } from "node:crypto";

import { and, eq, gt, isNull, sql } from "drizzle-orm";

import { db } from "@/db";
import {
  customers,
  invitation,
  member,
  organization,
  shopNoticeSubscribers,
  shopSettings,
  user,
} from "@/db/schema";
import { DEFAULT_BSFC } from "@/lib/calc";
import { NotFound } from "@/lib/domain/errors";

import { differs } from "./unchanged";

/** Default settings of a new shop (BSFC rules of thumb of calc-spec §2, in g/kWh). */
export const NEW_SHOP_SETTINGS = {
  bsfcGasolineNa: DEFAULT_BSFC.gasolineNaGPerKwh,
  bsfcGasolineBoosted: DEFAULT_BSFC.gasolineBoostedGPerKwh,
  bsfcE85Na: DEFAULT_BSFC.e85NaGPerKwh,
  bsfcE85Boosted: DEFAULT_BSFC.e85BoostedGPerKwh,
};

export function slugify(name: string): string {
  return (
    name
      .toLowerCase()
      .normalize("NFKD")
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-|-$/g, "")
      .slice(0, 40) || "shop"
  );
}

/**
 * Creates a shop with its settings and makes the user its owner, opted in to the shop's notices,
 * in one transaction.
 */
export async function createShopWithOwner(
  userId: string,
  shopName: string,
  opts: { id?: string; slug?: string } = {},
) {
  return db.transaction(async (tx) => {
    const id = opts.id ?? randomUUID();
    const slug = opts.slug ?? `${slugify(shopName)}-${id.slice(0, 6)}`;
    await tx.insert(organization).values({ id, name: shopName, slug });
    await tx.insert(shopSettings).values({ shopId: id, ...NEW_SHOP_SETTINGS });
    await tx.insert(member).values({ id: randomUUID(), organizationId: id, userId, role: "owner" });
    // The owner hears of accepted quotes, payments and receipts from the start (Settings turns it off).
    await tx.insert(shopNoticeSubscribers).values({ shopId: id, userId });
    return id;
  });
}

export async function getShopSettings(shopId: string) {
  const [row] = await db
    .select({ settings: shopSettings, name: organization.name })
    .from(shopSettings)
    .innerJoin(organization, eq(organization.id, shopSettings.shopId))
    .where(eq(shopSettings.shopId, shopId))
    .limit(1);
  return row ?? null;
}

/**
 * Writes the shop's name and settings, only the keys given (one transaction); values equal to
 * the stored ones are not written, so a save that changes nothing leaves both rows (and
 * `updated_at`) as they were. NotFound when the shop has no settings row.
 */
export async function updateShopSettings(
  shopId: string,
  name: string | undefined,
  values: Partial<Omit<typeof shopSettings.$inferInsert, "shopId" | "updatedAt">>,
) {
  await db.transaction(async (tx) => {
    const [stored] = await tx
      .select({ shopId: shopSettings.shopId })
      .from(shopSettings)
      .where(eq(shopSettings.shopId, shopId))
      .for("update")
      .limit(1);
    if (!stored) throw new NotFound("The shop");
    if (name !== undefined)
      await tx
        .update(organization)
        .set({ name })
        .where(and(eq(organization.id, shopId), differs(organization, { name })));
    await tx
      .update(shopSettings)
      .set({ ...values, updatedAt: new Date() })
      .where(and(eq(shopSettings.shopId, shopId), differs(shopSettings, values)));
  });
}

/** An invitation with its shop name, for the accept page (looked up by its unguessable id). */
export async function getInvitation(id: string) {
  const [row] = await db
    .select({ invitation, shopName: organization.name })
    .from(invitation)
    .innerJoin(organization, eq(organization.id, invitation.organizationId))
    .where(eq(invitation.id, id))
    .limit(1);
  return row ?? null;
}

export async function findUserByEmail(email: string) {
  const [row] = await db.select().from(user).where(eq(user.email, email)).limit(1);
  return row ?? null;
}

/** Joins an invited user to the shop: member row, invitation accepted, e-mail verified by the link. */
export async function acceptInvitationFor(userId: string, inv: typeof invitation.$inferSelect) {
  await db.transaction(async (tx) => {
    await tx.insert(member).values({
      id: randomUUID(),
      organizationId: inv.organizationId,
      userId,
      role: inv.role ?? "customer",
    });
    await tx.update(invitation).set({ status: "accepted" }).where(eq(invitation.id, inv.id));
    await tx.update(user).set({ emailVerified: true }).where(eq(user.id, userId));
    // A portal invitation: this sign-in now sees the shop's customer records with that e-mail.
    if ((inv.role ?? "customer") === "customer") {
      await tx
        .update(customers)
        .set({ userId, updatedAt: new Date() })
        .where(
          and(
            eq(customers.shopId, inv.organizationId),
            sql`lower(${customers.email}) = lower(${inv.email})`,
            isNull(customers.userId),
          ),
        );
    }
  });
}

/**
 * The pending portal invitation for this e-mail in the shop, or a new one (valid 14 days). The
 * link goes in the mail the caller sends, so the customer gets one message, not two.
 */
export async function ensurePortalInvitation(shopId: string, inviterId: string, email: string) {
  const normalized = email.trim().toLowerCase();
  const [open] = await db
    .select()
    .from(invitation)
    .where(
      and(
        eq(invitation.organizationId, shopId),
        eq(invitation.email, normalized),
        eq(invitation.role, "customer"),
        eq(invitation.status, "pending"),
        gt(invitation.expiresAt, new Date()),
      ),
    )
    .limit(1);
  if (open) return open;
  const [row] = await db
    .insert(invitation)
    .values({
      id: randomBytes(24).toString("base64url"),
      organizationId: shopId,
      email: normalized,
      role: "customer",
      status: "pending",
      expiresAt: new Date(Date.now() + 14 * 86_400_000),
      inviterId,
    })
    .returning();
  return row!;
}
