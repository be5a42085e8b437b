import { getLogo } from "@/db/queries/logos";
import { requireMember } from "@/lib/auth/member";
import { NotFound } from "@/lib/domain/errors";
import { handle } from "@/lib/http/handler";
import { readLogo } from "@/lib/http/logo-body";
import { removeShopLogo, setShopLogo } from "@/lib/shop/shop-commands";

/** GET — the shop's logo image (any member of the shop, customers included: it is on their PDFs). */
export const GET = handle(async () => {
  const m = await requireMember("builds:view");
  const logo = await getLogo(m.shopId);
  if (!logo) throw new NotFound("The shop's logo");
  return new Response(new Uint8Array(logo.bytes), {
    headers: {
      "content-type": logo.contentType,
      "cache-control": "private, max-age=60",
      etag: `"${logo.sha256}"`,
      "x-content-type-options": "nosniff",
    },
  });
});

const IMAGE_UPLOAD = {
  accepts: {
    types: ["image/png", "image/jpeg", "application/octet-stream"],
    message: "Upload the logo as a PNG or JPEG image",
  },
};

/** PUT (the image's bytes as the body) — upload or replace the logo: PNG or JPEG, at most 1 MB. */
export const PUT = handle(async (req) => {
  // Refused before a megabyte is read; the command checks the role again.
  const m = await requireMember("settings:update");
  return Response.json({ logo: await setShopLogo(m, await readLogo(req)) });
}, IMAGE_UPLOAD);

/** DELETE — remove the logo. */
export const DELETE = handle(async () => {
  const m = await requireMember();
  await removeShopLogo(m);
  return new Response(null, { status: 204 });
});
