/** Paper a shop prints its documents on (spec sheets, quotes). */
export const PAPER_SIZES = ["letter", "a4"] as const;
export type PaperSize = (typeof PAPER_SIZES)[number];

export const PAPER_SIZE_LABELS: Record<PaperSize, string> = {
  letter: "US Letter (8.5 × 11 in)",
  a4: "A4 (210 × 297 mm)",
};

/** The page size name @react-pdf/renderer takes: Letter 612 × 792 pt, A4 595.28 × 841.89 pt. */
export const PDF_PAGE_SIZE: Record<PaperSize, "LETTER" | "A4"> = { letter: "LETTER", a4: "A4" };
