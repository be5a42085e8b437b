#!/usr/bin/env node
// node scripts/icons.mjs — the app icons in public/ from public/icon.svg (the mark: a fuel drop
// under a gauge arc with its needle, in the palette of tailwind.config.ts). Rasterised with
// sharp (installed with Next); favicon.ico wraps PNG images of 16, 32 and 48 px, which every
// current browser reads. Run it again after changing the SVG and commit the results.
import { readFileSync, writeFileSync } from "node:fs";
import path from "node:path";

import sharp from "sharp";

const pub = path.join(import.meta.dirname, "..", "public");
const svg = readFileSync(path.join(pub, "icon.svg"));

// Home screens round the corners themselves: the touch icon is the full square.
const square = Buffer.from(svg.toString("utf8").replace('rx="112"', 'rx="0"'));

const png = (size, source = svg) =>
  sharp(source, { density: Math.max(72, Math.ceil((72 * size) / 512) * 4) })
    .resize(size, size)
    .png({ compressionLevel: 9 })
    .toBuffer();

/** An ICO file (ICONDIR, one ICONDIRENTRY per image, then the images) holding PNG images. */
function ico(images) {
  const header = Buffer.alloc(6 + 16 * images.length);
  header.writeUInt16LE(0, 0); // reserved
  header.writeUInt16LE(1, 2); // 1 = icon
  header.writeUInt16LE(images.length, 4);
  let offset = header.length;
  images.forEach(({ size, data }, i) => {
    const e = 6 + 16 * i;
    header.writeUInt8(size >= 256 ? 0 : size, e); // width (0 means 256)
    header.writeUInt8(size >= 256 ? 0 : size, e + 1); // height
    header.writeUInt8(0, e + 2); // no palette
    header.writeUInt8(0, e + 3); // reserved
    header.writeUInt16LE(1, e + 4); // colour planes
    header.writeUInt16LE(32, e + 6); // bits per pixel
    header.writeUInt32LE(data.length, e + 8);
    header.writeUInt32LE(offset, e + 12);
    offset += data.length;
  });
  return Buffer.concat([header, ...images.map((i) => i.data)]);
}

const outputs = { "icon-192.png": 192, "icon-512.png": 512 };
for (const [name, size] of Object.entries(outputs)) {
  writeFileSync(path.join(pub, name), await png(size));
}
writeFileSync(path.join(pub, "apple-touch-icon.png"), await png(180, square));
const small = await Promise.all(
  [16, 32, 48].map(async (size) => ({ size, data: await png(size) })),
);
writeFileSync(path.join(pub, "favicon.ico"), ico(small));
console.log(
  `icons: ${Object.keys(outputs).join(", ")}, apple-touch-icon.png, favicon.ico (16, 32, 48 px) in ${pub}`,
);
