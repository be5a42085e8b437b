import { and, eq } from "drizzle-orm";

import { db } from "@/db";
import { shopSettings, user } from "@/db/schema";
import type { UnitSystem } from "@/lib/calc";

import { differs } from "./unchanged";

/** The units this person sees: their own choice, else the shop's setting, else metric. */
export async function unitSystemOf(userId: string, shopId: string): Promise<UnitSystem> {
  const [u] = await db
    .select({ units: user.unitSystem })
    .from(user)
    .where(eq(user.id, userId))
    .limit(1);
  if (u?.units) return u.units;
  const [s] = await db
    .select({ units: shopSettings.units })
    .from(shopSettings)
    .where(eq(shopSettings.shopId, shopId))
    .limit(1);
  return s?.units ?? "metric";
}

/** The person's units; choosing the ones they have writes nothing. */
export async function setUnitSystem(userId: string, units: UnitSystem) {
  await db
    .update(user)
    .set({ unitSystem: units, updatedAt: new Date() })
    .where(and(eq(user.id, userId), differs(user, { unitSystem: units })));
}

/** A person's display name (for "saved by …"), or null. */
export async function userName(userId: string | null): Promise<string | null> {
  if (!userId) return null;
  const [u] = await db.select({ name: user.name }).from(user).where(eq(user.id, userId)).limit(1);
  return u?.name ?? null;
}
