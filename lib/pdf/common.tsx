import { join } from "node:path";

import { Font, Image, StyleSheet, Text, View } from "@react-pdf/renderer";

// TrueType made from the shipped @fontsource WOFF files by `npm run fonts:pdf` (WOFF tables are
// inflated again on every render; WOFF2 text is drawn invisibly).
const FONT_DIR = join(process.cwd(), "lib/pdf/fonts");
Font.register({
  family: "Inter",
  fonts: [
    { src: join(FONT_DIR, "inter-latin-400-normal.ttf") },
    { src: join(FONT_DIR, "inter-latin-700-normal.ttf"), fontWeight: 700 },
  ],
});
Font.register({
  family: "Barlow",
  fonts: [{ src: join(FONT_DIR, "barlow-latin-700-normal.ttf"), fontWeight: 700 }],
});
Font.registerHyphenationCallback((w) => [w]);

/** The shipped latin font lacks a few signs the library's text uses; spell those out. */
const GLYPHS: Record<string, string> = {
  λ: "lambda",
  Δ: "delta ",
  ρ: "rho",
  "√": "sqrt",
  "≤": "<=",
  "≥": ">=",
  "→": "->",
  "−": "-",
};
export const pdfText = (t: string) => t.replace(/[λΔρ√≤≥→−]/g, (c) => GLYPHS[c] ?? c);

export const INK = "#1f2933";
export const COPPER = "#b3592c";
export const MUTED = "#5b6672";
export const base = StyleSheet.create({
  page: { padding: 32, fontFamily: "Inter", fontSize: 8.5, color: INK, lineHeight: 1.3 },
  h1: { fontFamily: "Barlow", fontWeight: 700, fontSize: 18, lineHeight: 1.25, marginBottom: 2 },
  h2: {
    fontFamily: "Barlow",
    fontWeight: 700,
    fontSize: 11,
    marginTop: 8,
    marginBottom: 3,
    color: COPPER,
  },
  row: { flexDirection: "row", gap: 12 },
  col: { flex: 1 },
  muted: { color: MUTED },
  caution: {
    marginTop: 8,
    padding: 6,
    borderLeftWidth: 3,
    borderLeftColor: "#b7791f",
    backgroundColor: "#fdf6e7",
  },
});

export interface PdfShop {
  name: string;
  address: string | null;
  phone: string | null;
  /** The uploaded logo, if any (PNG or JPEG bytes). */
  logo?: { data: Buffer; format: "png" | "jpg" } | null;
}

/** The shop's letterhead: logo, name and address on the left, the document's own lines on the right. */
export function Letterhead({
  shop,
  title,
  lines,
}: {
  shop: PdfShop;
  title: string;
  lines: string[];
}) {
  return (
    <View
      style={[
        base.row,
        {
          justifyContent: "space-between",
          alignItems: "center",
          borderBottomWidth: 1,
          borderBottomColor: COPPER,
          paddingBottom: 6,
        },
      ]}
    >
      <View style={[base.row, { alignItems: "center", gap: 8 }]}>
        {shop.logo ? (
          // eslint-disable-next-line jsx-a11y/alt-text -- a PDF image, not an HTML one
          <Image src={shop.logo} style={{ maxHeight: 40, maxWidth: 120, objectFit: "contain" }} />
        ) : null}
        <View>
          <Text style={base.h1}>{shop.name}</Text>
          <Text style={base.muted}>{[shop.address, shop.phone].filter(Boolean).join(" · ")}</Text>
        </View>
      </View>
      <View style={{ alignItems: "flex-end" }}>
        <Text style={{ fontWeight: 700 }}>{title}</Text>
        {lines.map((l) => (
          <Text key={l} style={base.muted}>
            {l}
          </Text>
        ))}
      </View>
    </View>
  );
}
