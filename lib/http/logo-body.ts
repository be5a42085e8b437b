import { checkLogo, LOGO_MAX_BYTES, type ImageInfo } from "@/lib/images/logo";

import { readBytes } from "./body";
import { HttpError } from "./http-error";

/**
 * Reads a logo upload, judged by its bytes (never its name or declared type): larger than
 * 1 MB → 413, empty → 400, not a whole PNG or JPEG of a usable size → 415 with what to do.
 */
export async function readLogo(req: Request): Promise<{ bytes: Buffer; info: ImageInfo }> {
  const bytes = await readBytes(req, LOGO_MAX_BYTES, "logo");
  const checked = checkLogo(bytes);
  if (!checked.ok) throw new HttpError(415, "bad_image", checked.message);
  return { bytes, info: checked.info };
}
