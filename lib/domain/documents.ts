/** Paper a shop prints its documents on (spec sheets, quotes). */
export const PAPER_SIZES = ["letter", "a4"] as const;
export type PaperSize = (typeof PAPER_SIZES)[number];

export const PAPER_SIZE_LABELS: Record<PaperSize, string> = {
  letter: "US Letter (8.5 × 11 in)",
  a4: "A4 (210 × 297 mm)",
};

/** The page size name @react-pdf/renderer takes: Letter 612 × 792 pt, A4 595.28 × 841.89 pt. */
export const PDF_PAGE_SIZE: Record<PaperSize, "LETTER" | "A4"> = { letter: "LETTER", a4: "A4" };

/**
 * An IANA time zone name as the runtime spells it ("europe/berlin" → "Europe/Berlin"), or null
 * when it is none: checked with Intl, offsets such as "+02:00" refused (they know no summer time).
 */
export function canonicalTimeZone(name: string): string | null {
  if (!name || name.length > 64 || !/^[A-Za-z][A-Za-z0-9_+\-]*(\/[A-Za-z0-9_+\-]+)*$/.test(name))
    return null;
  try {
    return new Intl.DateTimeFormat("en-GB", { timeZone: name }).resolvedOptions().timeZone;
  } catch {
    return null;
  }
}
