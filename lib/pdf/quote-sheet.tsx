import { Document, Page, renderToBuffer, StyleSheet, Text, View } from "@react-pdf/renderer";

import { PDF_PAGE_SIZE, type PaperSize } from "@/lib/domain/documents";
import { formatCalendarDate, formatDate } from "@/lib/format/dates";
import type { PresentedQuote } from "@/lib/quotes/quote-presentation";
import { SAFETY_POINTS } from "@/lib/safety";

import { base, COPPER, Letterhead, MUTED, pdfText, type PdfShop } from "./common";

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

export interface QuoteSheetData {
  shop: PdfShop;
  quote: {
    label: string;
    status: string;
    createdAt: Date;
    validUntil: string;
    notes: string | null;
    currency: string;
  };
  customer: { name: string; email: string | null };
  buildTitle: string | null;
  /** Lines and totals as every surface shows them (lib/quotes/quote-presentation.ts). */
  presented: PresentedQuote;
  /** The deposit's rate ("30 %") and amount. */
  deposit: { rate: string; amount: string; paid: string | null } | null;
  /** The shop's paper and time zone (the issue date is the day in that zone). */
  paper: PaperSize;
  timeZone: string;
}

const COLS = [
  { key: "description", label: "Item", width: "38%" },
  { key: "quantity", label: "Qty", width: "8%", num: true },
  { key: "unitPrice", label: "Unit price", width: "15%", num: true },
  { key: "discount", label: "Discount", width: "22%", num: true },
  { key: "lineTotal", label: "Line total", width: "17%", num: true },
] as const;

function QuoteSheet({ d }: { d: QuoteSheetData }) {
  return (
    <Document
      title={`Quote ${d.quote.label}`}
      author={d.shop.name}
      subject="Fuel system quote"
      creator="Fuelwright"
    >
      <Page size={PDF_PAGE_SIZE[d.paper]} style={s.page}>
        <Letterhead
          shop={d.shop}
          title={`Quote ${d.quote.label}`}
          lines={[
            `${d.quote.status} · issued ${formatDate(d.quote.createdAt, { timeZone: d.timeZone })}`,
            `Valid until ${formatCalendarDate(d.quote.validUntil)}`,
          ]}
        />
        <View style={[s.row, { marginTop: 8 }]}>
          <View style={s.col}>
            <Text style={s.h2}>For</Text>
            <Text style={{ fontWeight: 700 }}>{d.customer.name}</Text>
            {d.customer.email ? <Text style={s.muted}>{d.customer.email}</Text> : null}
          </View>
          <View style={s.col}>
            <Text style={s.h2}>Work</Text>
            <Text>
              {d.buildTitle ? `Fuel system for ${d.buildTitle}` : "Fuel system parts and labour"}
            </Text>
          </View>
        </View>

        <Text style={s.h2}>Lines</Text>
        <View style={{ flexDirection: "row" }}>
          {COLS.map((c) => (
            <Text key={c.key} style={[s.th, { width: c.width }, "num" in c ? s.num : {}]}>
              {c.label}
            </Text>
          ))}
        </View>
        {d.presented.lines.map((l, i) => (
          <View key={i} style={{ flexDirection: "row" }} wrap={false}>
            <View style={[s.td, { width: COLS[0].width }]}>
              <Text>{pdfText(l.description)}</Text>
              {l.sku ? <Text style={[s.muted, { fontSize: 7 }]}>{l.sku}</Text> : null}
            </View>
            <Text style={[s.td, s.num, { width: COLS[1].width }]}>{l.quantity}</Text>
            <Text style={[s.td, s.num, { width: COLS[2].width }]}>{l.unitPrice}</Text>
            <Text style={[s.td, s.num, { width: COLS[3].width }]}>
              {l.discountRate ? pdfText(l.discount) : "-"}
            </Text>
            <Text style={[s.td, s.num, { width: COLS[4].width }]}>{l.lineTotal}</Text>
          </View>
        ))}
        <View style={{ marginTop: 6 }}>
          <View style={s.total}>
            <Text>Subtotal</Text>
            <Text style={{ width: 80, textAlign: "right" }}>{d.presented.subtotal}</Text>
          </View>
          {d.presented.discountNote ? (
            <View style={s.total}>
              <Text style={s.muted}>{d.presented.discountNote}</Text>
            </View>
          ) : null}
          <View style={s.total}>
            <Text>{d.presented.taxLabel}</Text>
            <Text style={{ width: 80, textAlign: "right" }}>{d.presented.tax}</Text>
          </View>
          <View
            style={[
              s.total,
              { borderTopWidth: 1, borderTopColor: COPPER, marginTop: 2, paddingTop: 3 },
            ]}
          >
            <Text style={{ fontWeight: 700, fontSize: 10 }}>Total</Text>
            <Text style={{ width: 80, textAlign: "right", fontWeight: 700, fontSize: 10 }}>
              {d.presented.total}
            </Text>
          </View>
        </View>

        {d.deposit ? (
          <View style={{ marginTop: 8 }}>
            <Text style={s.h2}>Deposit</Text>
            <Text>
              {d.deposit.paid
                ? `Deposit of ${d.deposit.amount} received ${d.deposit.paid}. Thank you.`
                : `A deposit of ${d.deposit.rate} (${d.deposit.amount}) is asked when the quote is accepted; the shop orders the parts once it is paid. Pay it from your portal.`}
            </Text>
          </View>
        ) : null}
        {d.quote.notes ? (
          <View>
            <Text style={s.h2}>Notes</Text>
            <Text>{pdfText(d.quote.notes)}</Text>
          </View>
        ) : null}

        <View style={s.caution} wrap={false}>
          <Text style={{ fontWeight: 700 }}>Fuel burns.</Text>
          {SAFETY_POINTS.filter((_, i) => i !== 2).map((p) => (
            <Text key={p}>- {p}</Text>
          ))}
        </View>
        <Text
          style={[s.muted, { position: "absolute", bottom: 16, left: 32, right: 32, fontSize: 7 }]}
          fixed
          render={({ pageNumber, totalPages }) =>
            `Quote ${d.quote.label} · ${d.shop.name} · page ${pageNumber} of ${totalPages} · prices in ${d.quote.currency}`
          }
        />
      </Page>
    </Document>
  );
}

/** The quote as PDF bytes. */
export async function renderQuoteSheet(d: QuoteSheetData): Promise<Buffer> {
  return renderToBuffer(<QuoteSheet d={d} />);
}
