import { execFileSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

const dir = mkdtempSync(join(tmpdir(), "fw-pdf-"));
let n = 0;

/**
 * Text, page count, each page's size in points ("612x792") and embedded image count of a PDF,
 * through poppler-utils (pdftotext, pdfinfo, pdfimages).
 */
export function inspectPdf(pdf: Buffer) {
  const file = join(dir, `${++n}.pdf`);
  writeFileSync(file, pdf);
  const text = execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
  const info = execFileSync("pdfinfo", [file], { encoding: "utf8" });
  const pages = Number(/Pages:\s+(\d+)/.exec(info)![1]);
  const title = /Title:\s+(.*)/.exec(info)?.[1]?.trim() ?? "";
  const sizes = execFileSync("pdfinfo", ["-f", "1", "-l", String(pages), file], {
    encoding: "utf8",
  });
  const pageSizes = [...sizes.matchAll(/Page\s+\d+ size:\s+([\d.]+) x ([\d.]+) pts/g)].map(
    (m) => `${Math.round(Number(m[1]))}x${Math.round(Number(m[2]))}`,
  );
  const images = execFileSync("pdfimages", ["-list", file], { encoding: "utf8" })
    .trim()
    .split("\n")
    .slice(2)
    .filter(Boolean).length;
  return { text, pages, title, images, pageSizes };
}
