/** What an uploaded logo is, judged by its bytes (never by its name or declared type). */
export interface ImageInfo {
  contentType: "image/png" | "image/jpeg";
  width: number;
  height: number;
}

export const LOGO_MAX_BYTES = 1024 * 1024;
export const LOGO_MAX_SIDE = 4000;

const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

/** PNG (signature + IHDR) or baseline/progressive JPEG (SOFn marker); null for anything else. */
export function imageInfo(b: Buffer): ImageInfo | null {
  if (
    b.length >= 24 &&
    b.subarray(0, 8).equals(PNG_SIGNATURE) &&
    b.toString("latin1", 12, 16) === "IHDR"
  ) {
    return { contentType: "image/png", width: b.readUInt32BE(16), height: b.readUInt32BE(20) };
  }
  if (b.length >= 4 && b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff) {
    let i = 2;
    while (i + 9 < b.length) {
      if (b[i] !== 0xff) return null;
      const marker = b[i + 1]!;
      if (marker === 0xd8 || marker === 0x01 || (marker >= 0xd0 && marker <= 0xd7)) {
        i += 2;
        continue;
      }
      const len = b.readUInt16BE(i + 2);
      const isSof = marker >= 0xc0 && marker <= 0xcf && ![0xc4, 0xc8, 0xcc].includes(marker);
      if (isSof)
        return {
          contentType: "image/jpeg",
          height: b.readUInt16BE(i + 5),
          width: b.readUInt16BE(i + 7),
        };
      i += 2 + len;
    }
  }
  return null;
}

const PNG_IEND = Buffer.from([
  0x00, 0x00, 0x00, 0x00, 0x49, 0x45, 0x4e, 0x44, 0xae, 0x42, 0x60, 0x82,
]);

/**
 * Is the file whole? A PNG ends with its empty IEND chunk (PNG spec, ISO/IEC 15948, 11.2.5);
 * a JPEG's image ends with the EOI marker FF D9 (ITU-T T.81, B.2.1), which some writers follow
 * with padding, so it is looked for near the end.
 */
export function isComplete(b: Buffer, info: ImageInfo): boolean {
  if (info.contentType === "image/png")
    return (
      b.length >= PNG_IEND.length + 33 && b.subarray(b.length - PNG_IEND.length).equals(PNG_IEND)
    );
  const eoi = b.lastIndexOf(Buffer.from([0xff, 0xd9]));
  return eoi > 2 && b.length - eoi <= 4096;
}

/** Checks a logo upload; the message says what to do instead. */
export function checkLogo(
  b: Buffer,
): { ok: true; info: ImageInfo } | { ok: false; message: string } {
  if (b.length > LOGO_MAX_BYTES)
    return { ok: false, message: "The logo is larger than 1 MB; save it smaller" };
  const info = imageInfo(b);
  if (!info) return { ok: false, message: "The logo must be a PNG or JPEG image" };
  if (!isComplete(b, info))
    return {
      ok: false,
      message:
        "The logo file is cut short (the upload was incomplete or the file is damaged); save it again",
    };
  if (info.width < 16 || info.height < 16)
    return { ok: false, message: "The logo is smaller than 16 × 16 pixels" };
  if (info.width > LOGO_MAX_SIDE || info.height > LOGO_MAX_SIDE)
    return { ok: false, message: `The logo is larger than ${LOGO_MAX_SIDE} pixels on a side` };
  return { ok: true, info };
}
