#!/usr/bin/env node
/**
 * npm run fonts:pdf — writes the PDF fonts (lib/pdf/fonts/*.ttf) from the shipped @fontsource
 * WOFF files. The PDF renderer inflates a WOFF's tables again on every render, which was most of
 * a spec sheet's render time; plain TrueType files are read as they are. The OpenType layout
 * tables (GSUB: contextual alternates and ligatures; GPOS: kerning) are left out too: shaping
 * with them was the next largest cost (render p50 468 → 182 ms), and a spec sheet reads well
 * without them.
 */
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

const require = createRequire(import.meta.url);
const { toSfnt } = require("woff2sfnt-sfnt2woff");
const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const out = join(root, "lib/pdf/fonts");
mkdirSync(out, { recursive: true });

/** An SFNT without the named tables: a new table directory, the kept tables copied 4-byte aligned. */
function withoutTables(font, drop) {
  const n = font.readUInt16BE(4);
  const tables = [];
  for (let i = 0; i < n; i++) {
    const at = 12 + i * 16;
    const tag = font.toString("latin1", at, at + 4);
    if (!drop.includes(tag))
      tables.push({
        tag,
        checksum: font.readUInt32BE(at + 4),
        data: font.subarray(
          font.readUInt32BE(at + 8),
          font.readUInt32BE(at + 8) + font.readUInt32BE(at + 12),
        ),
      });
  }
  const head = Buffer.alloc(12 + tables.length * 16);
  font.copy(head, 0, 0, 4);
  const m = tables.length;
  const pow = 2 ** Math.floor(Math.log2(m));
  head.writeUInt16BE(m, 4);
  head.writeUInt16BE(pow * 16, 6);
  head.writeUInt16BE(Math.log2(pow), 8);
  head.writeUInt16BE(m * 16 - pow * 16, 10);
  const bodies = [];
  let offset = head.length;
  tables.forEach((t, i) => {
    const at = 12 + i * 16;
    head.write(t.tag, at, "latin1");
    head.writeUInt32BE(t.checksum, at + 4);
    head.writeUInt32BE(offset, at + 8);
    head.writeUInt32BE(t.data.length, at + 12);
    const padded = Buffer.alloc((t.data.length + 3) & ~3);
    t.data.copy(padded);
    bodies.push(padded);
    offset += padded.length;
  });
  return Buffer.concat([head, ...bodies]);
}
for (const [pkg, file] of [
  ["inter", "inter-latin-400-normal"],
  ["inter", "inter-latin-700-normal"],
  ["barlow", "barlow-latin-700-normal"],
]) {
  const woff = readFileSync(join(root, "node_modules/@fontsource", pkg, "files", `${file}.woff`));
  writeFileSync(
    join(out, `${file}.ttf`),
    withoutTables(Buffer.from(toSfnt(woff)), ["GSUB", "GPOS"]),
  );
  console.log(`lib/pdf/fonts/${file}.ttf`);
}
