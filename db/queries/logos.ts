import { createHash } from "node:crypto";

import { eq } from "drizzle-orm";

import { db } from "@/db";
import { shopLogos } from "@/db/schema";
import type { ImageInfo } from "@/lib/images/logo";

import { differsFromExcluded } from "./unchanged";

export async function getLogo(shopId: string) {
  const [row] = await db.select().from(shopLogos).where(eq(shopLogos.shopId, shopId)).limit(1);
  return row ?? null;
}

/** The logo's facts without its bytes (for the settings page). */
export async function logoFacts(shopId: string) {
  const [row] = await db
    .select({
      contentType: shopLogos.contentType,
      sha256: shopLogos.sha256,
      width: shopLogos.width,
      height: shopLogos.height,
      uploadedAt: shopLogos.uploadedAt,
    })
    .from(shopLogos)
    .where(eq(shopLogos.shopId, shopId))
    .limit(1);
  return row ?? null;
}

export async function setLogo(shopId: string, userId: string, bytes: Buffer, info: ImageInfo) {
  const values = {
    contentType: info.contentType,
    bytes,
    sha256: createHash("sha256").update(bytes).digest("hex"),
    width: info.width,
    height: info.height,
    uploadedBy: userId,
    uploadedAt: new Date(),
  };
  const facts = {
    sha256: shopLogos.sha256,
    width: shopLogos.width,
    height: shopLogos.height,
    contentType: shopLogos.contentType,
  };
  // The same image again changes nothing (not even who uploaded it, or when).
  const [row] = await db
    .insert(shopLogos)
    .values({ shopId, ...values })
    .onConflictDoUpdate({
      target: shopLogos.shopId,
      set: values,
      setWhere: differsFromExcluded([shopLogos.sha256, shopLogos.contentType]),
    })
    .returning(facts);
  if (row) return row;
  const [same] = await db.select(facts).from(shopLogos).where(eq(shopLogos.shopId, shopId));
  return same!;
}

export async function deleteLogo(shopId: string) {
  const rows = await db
    .delete(shopLogos)
    .where(eq(shopLogos.shopId, shopId))
    .returning({ shopId: shopLogos.shopId });
  return rows.length > 0;
}

/** The logo in the form the PDF renderer takes. */
export async function pdfLogo(
  shopId: string,
): Promise<{ data: Buffer; format: "png" | "jpg" } | null> {
  const row = await getLogo(shopId);
  return row ? { data: row.bytes, format: row.contentType === "image/png" ? "png" : "jpg" } : null;
}
