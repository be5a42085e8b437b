import { deleteLogo, getLogo, setLogo } from "@/db/queries/logos";
import { requireMember } from "@/lib/auth/member";
import { NotFound } from "@/lib/domain/errors";
import { readBytes } from "@/lib/http/body";
import { handle } from "@/lib/http/handler";
import { HttpError } from "@/lib/http/http-error";
import { checkLogo, LOGO_MAX_BYTES } from "@/lib/images/logo";

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

/** PUT (the image's bytes as the body) — upload or replace the logo: PNG or JPEG, at most 1 MB. */
export const PUT = handle(async (req) => {
  const m = await requireMember("settings:update");
  const bytes = await readBytes(req, LOGO_MAX_BYTES, "logo");
  const checked = checkLogo(bytes);
  if (!checked.ok) throw new HttpError(415, "bad_image", checked.message);
  return Response.json({ logo: await setLogo(m.shopId, m.user.id, bytes, checked.info) });
});

/** DELETE — remove the logo. */
export const DELETE = handle(async () => {
  const m = await requireMember("settings:update");
  if (!(await deleteLogo(m.shopId))) throw new NotFound("The shop's logo");
  return new Response(null, { status: 204 });
});
