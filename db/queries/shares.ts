import { createHash, createHmac, randomBytes, timingSafeEqual } from "node:crypto";

import { and, desc, eq, sql } from "drizzle-orm";

import { db } from "@/db";
import { builds, shareLinks } from "@/db/schema";
import { NotFound } from "@/lib/domain/errors";
import { serverEnv } from "@/lib/env";

const sha256 = (s: string) => createHash("sha256").update(s).digest("hex");
const sign = (body: string) =>
  createHmac("sha256", serverEnv().BETTER_AUTH_SECRET)
    .update(`share:${body}`)
    .digest("base64url")
    .slice(0, 22);

/**
 * A new link to one of the shop's builds (NotFound when the build is not the shop's), in one
 * transaction. Token = <random 32 bytes>.<HMAC of it>: a tampered token fails the signature
 * before any database look-up; the database keeps only the SHA-256 of the whole token.
 */
export async function insertShareLink(
  shopId: string,
  buildId: string,
  userId: string,
  days: number,
) {
  const body = randomBytes(32).toString("base64url");
  const token = `${body}.${sign(body)}`;
  return db.transaction(async (tx) => {
    const [build] = await tx
      .select({ id: builds.id })
      .from(builds)
      .where(and(eq(builds.shopId, shopId), eq(builds.id, buildId)))
      .limit(1);
    if (!build) throw new NotFound("That build");
    const [row] = await tx
      .insert(shareLinks)
      .values({
        shopId,
        buildId,
        tokenHash: sha256(token),
        expiresAt: new Date(Date.now() + days * 86400000),
        createdBy: userId,
      })
      .returning();
    return { link: row!, token };
  });
}

export type ShareCheck =
  | { ok: true; link: typeof shareLinks.$inferSelect }
  | { ok: false; reason: "invalid" | "expired" | "revoked" };

export async function checkShareToken(token: string): Promise<ShareCheck> {
  const [body, mac] = token.split(".");
  if (!body || !mac || body.length > 64) return { ok: false, reason: "invalid" };
  const good = Buffer.from(sign(body));
  const given = Buffer.from(mac);
  if (good.length !== given.length || !timingSafeEqual(good, given))
    return { ok: false, reason: "invalid" };
  const [link] = await db
    .select()
    .from(shareLinks)
    .where(eq(shareLinks.tokenHash, sha256(token)))
    .limit(1);
  if (!link) return { ok: false, reason: "invalid" };
  if (link.revokedAt) return { ok: false, reason: "revoked" };
  if (link.expiresAt.getTime() <= Date.now()) return { ok: false, reason: "expired" };
  return { ok: true, link };
}

export async function listShareLinks(shopId: string, buildId: string) {
  return db
    .select({
      id: shareLinks.id,
      expiresAt: shareLinks.expiresAt,
      revokedAt: shareLinks.revokedAt,
      createdAt: shareLinks.createdAt,
      active: sql<boolean>`(${shareLinks.revokedAt} is null and ${shareLinks.expiresAt} > now())`,
    })
    .from(shareLinks)
    .where(and(eq(shareLinks.shopId, shopId), eq(shareLinks.buildId, buildId)))
    .orderBy(desc(shareLinks.createdAt));
}

/** Withdraws one of the shop's links (the first withdrawal's time is kept); NotFound if none. */
export async function markShareLinkRevoked(shopId: string, id: string): Promise<void> {
  const rows = await db
    .update(shareLinks)
    .set({ revokedAt: sql`coalesce(${shareLinks.revokedAt}, now())` })
    .where(and(eq(shareLinks.shopId, shopId), eq(shareLinks.id, id)))
    .returning({ id: shareLinks.id });
  if (rows.length === 0) throw new NotFound("That link");
}
