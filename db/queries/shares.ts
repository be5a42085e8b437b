import { createHash, createHmac, randomBytes, timingSafeEqual } from "node:crypto";

import { and, desc, eq, sql } from "drizzle-orm";

import { db } from "@/db";
import { shareLinks } from "@/db/schema";
import { serverEnv } from "@/lib/env";

const sha256 = (s: string) => createHash("sha256").update(s).digest("hex");
const sign = (body: string) =>
  createHmac("sha256", serverEnv().BETTER_AUTH_SECRET)
    .update(`share:${body}`)
    .digest("base64url")
    .slice(0, 22);

/**
 * Token = <random 32 bytes>.<HMAC of it>: a tampered token fails the signature before any
 * database look-up; the database keeps only the SHA-256 of the whole token.
 */
export async function createShareLink(
  shopId: string,
  buildId: string,
  userId: string,
  days: number,
) {
  const body = randomBytes(32).toString("base64url");
  const token = `${body}.${sign(body)}`;
  const [row] = await db
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

export async function revokeShareLink(shopId: string, id: string) {
  const rows = await db
    .update(shareLinks)
    .set({ revokedAt: new Date() })
    .where(and(eq(shareLinks.shopId, shopId), eq(shareLinks.id, id)))
    .returning({ id: shareLinks.id });
  return rows.length > 0;
}
