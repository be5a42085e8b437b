import { Document, Page, renderToBuffer, StyleSheet, Text, View } from "@react-pdf/renderer";

import { PDF_PAGE_SIZE, type PaperSize } from "@/lib/domain/documents";

import { base, COPPER, Letterhead, MUTED, pdfText, type PdfShop } from "./common";

/**
 * One layout for the documents after the deposit — an invoice and a purchase order: the
 * letterhead, who it is for, a table of lines and the figures beneath, every figure already
 * formatted by the data builder (lib/pdf/ledger-sheet-data.ts).
 */

const s = {
  ...base,
  ...StyleSheet.create({
    th: {
      fontWeight: 700,
      color: MUTED,
      paddingVertical: 3,
      borderBottomWidth: 0.5,
      borderBottomColor: MUTED,
    },
    td: { paddingVertical: 3, borderBottomWidth: 0.3, borderBottomColor: "#d9dee3" },
    num: { textAlign: "right" },
    total: { flexDirection: "row", justifyContent: "flex-end", gap: 12, paddingVertical: 1.5 },
  }),
};

export interface LedgerSheetData {
  shop: PdfShop;
  /** "Invoice INV-0003", "Purchase order PO-0002" */
  title: string;
  /** Lines under the title (status, dates). */
  headLines: string[];
  party: { heading: string; name: string; lines: string[] };
  columns: { label: string; width: string; num?: boolean }[];
  rows: { cells: string[]; note?: string | null }[];
  /** Figures under the table; the last `strong` one is drawn as the total. */
  figures: { label: string; value: string; strong?: boolean }[];
  notes: string[];
  footer: string;
  paper: PaperSize;
}

function LedgerSheet({ d }: { d: LedgerSheetData }) {
  return (
    <Document title={d.title} author={d.shop.name} creator="Fuelwright">
      <Page size={PDF_PAGE_SIZE[d.paper]} style={s.page}>
        <Letterhead shop={d.shop} title={d.title} lines={d.headLines} />
        <View style={{ marginTop: 8 }}>
          <Text style={s.h2}>{d.party.heading}</Text>
          <Text style={{ fontWeight: 700 }}>{pdfText(d.party.name)}</Text>
          {d.party.lines.map((l) => (
            <Text key={l} style={s.muted}>
              {pdfText(l)}
            </Text>
          ))}
        </View>
        <Text style={s.h2}>Lines</Text>
        <View style={{ flexDirection: "row" }}>
          {d.columns.map((c) => (
            <Text key={c.label} style={[s.th, { width: c.width }, c.num ? s.num : {}]}>
              {c.label}
            </Text>
          ))}
        </View>
        {d.rows.map((r, i) => (
          <View key={i} style={{ flexDirection: "row" }} wrap={false}>
            {r.cells.map((cell, j) =>
              j === 0 ? (
                <View key={j} style={[s.td, { width: d.columns[0]!.width }]}>
                  <Text>{pdfText(cell)}</Text>
                  {r.note ? (
                    <Text style={[s.muted, { fontSize: 7 }]}>{pdfText(r.note)}</Text>
                  ) : null}
                </View>
              ) : (
                <Text
                  key={j}
                  style={[s.td, { width: d.columns[j]!.width }, d.columns[j]!.num ? s.num : {}]}
                >
                  {pdfText(cell)}
                </Text>
              ),
            )}
          </View>
        ))}
        <View style={{ marginTop: 6 }}>
          {d.figures.map((f) => (
            <View
              key={f.label}
              style={[
                s.total,
                f.strong
                  ? { borderTopWidth: 1, borderTopColor: COPPER, marginTop: 2, paddingTop: 3 }
                  : {},
              ]}
            >
              <Text style={f.strong ? { fontWeight: 700, fontSize: 10 } : {}}>
                {pdfText(f.label)}
              </Text>
              <Text
                style={{
                  width: 90,
                  textAlign: "right",
                  ...(f.strong ? { fontWeight: 700, fontSize: 10 } : {}),
                }}
              >
                {pdfText(f.value)}
              </Text>
            </View>
          ))}
        </View>
        {d.notes.map((n) => (
          <Text key={n} style={{ marginTop: 6 }}>
            {pdfText(n)}
          </Text>
        ))}
        <Text
          style={[s.muted, { position: "absolute", bottom: 16, left: 32, right: 32, fontSize: 7 }]}
          fixed
          render={({ pageNumber, totalPages }) =>
            `${d.footer} · page ${pageNumber} of ${totalPages}`
          }
        />
      </Page>
    </Document>
  );
}

export async function renderLedgerSheet(d: LedgerSheetData): Promise<Buffer> {
  return renderToBuffer(<LedgerSheet d={d} />);
}
