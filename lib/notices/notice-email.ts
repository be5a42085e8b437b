import { formatMoney } from "@/lib/catalog/money";
import { NOTICE_LABELS, type NoticeKind } from "@/lib/domain/operations";

/**
 * The subject and plain text of every notice sent after the deposit (pure). Money arrives in
 * minor units and is formatted here, in the document's currency.
 */

export type NoticeData =
  | {
      kind: "deposit_receipt" | "balance_receipt";
      shopName: string;
      customerName: string;
      /** "quote Q-0007" / "invoice INV-0003" */
      document: string;
      amountMinor: number;
      currency: string;
      /** What is still owed after this payment (balance receipts). */
      leftMinor?: number;
      link: string;
    }
  | {
      kind: "parts_arrived" | "ready_to_fit" | "fitted";
      shopName: string;
      customerName: string;
      job: string;
      buildTitle: string | null;
      /** Parts that arrived ("2 × Pump A"), for parts_arrived; what was fitted, for fitted. */
      parts: string[];
      link: string;
    }
  | {
      kind: "invoice";
      shopName: string;
      customerName: string;
      invoice: string;
      totalMinor: number;
      depositMinor: number;
      creditedMinor: number;
      balanceMinor: number;
      currency: string;
      link: string;
      attachments: string[];
    }
  | {
      kind: "po_to_supplier";
      shopName: string;
      supplierName: string;
      po: string;
      lines: string[];
      attachments: string[];
    }
  | {
      kind: "staff_quote_accepted" | "staff_quote_declined";
      shopName: string;
      customerName: string;
      quote: string;
      totalMinor: number;
      currency: string;
      link: string;
    }
  | {
      kind: "staff_payment_received";
      shopName: string;
      customerName: string;
      document: string;
      amountMinor: number;
      currency: string;
      link: string;
    }
  | {
      kind: "staff_po_received";
      shopName: string;
      supplierName: string;
      po: string;
      received: string[];
      jobsReady: string[];
      link: string;
    };

const CAUTION =
  "Fuel system work must be done and checked by qualified people, to your local codes.";

export function noticeEmail(d: NoticeData): { subject: string; text: string } {
  const sign = `— ${"shopName" in d ? d.shopName : ""}`;
  switch (d.kind) {
    case "deposit_receipt":
    case "balance_receipt": {
      const paid = formatMoney(d.amountMinor, d.currency);
      return {
        subject: `${d.shopName}: receipt for ${paid} on ${d.document}`,
        text: [
          `Hello ${d.customerName},`,
          "",
          `Thank you: we received your payment of ${paid} on ${d.document}.`,
          ...(d.leftMinor !== undefined
            ? [
                d.leftMinor > 0
                  ? `Still to pay: ${formatMoney(d.leftMinor, d.currency)}.`
                  : "Nothing more is owed on it.",
              ]
            : []),
          "",
          `See it in your portal: ${d.link}`,
          "",
          sign,
        ].join("\n"),
      };
    }
    case "parts_arrived":
    case "ready_to_fit":
    case "fitted": {
      const what = d.buildTitle ? ` for ${d.buildTitle}` : "";
      const head =
        d.kind === "parts_arrived"
          ? `Parts for job ${d.job}${what} arrived: ${d.parts.join(", ")}. We are waiting for the rest.`
          : d.kind === "ready_to_fit"
            ? `All parts for job ${d.job}${what} are in: it is ready to fit. We will be in touch to book the car in.`
            : `Job ${d.job}${what} is fitted${d.parts.length ? ` (${d.parts.join(", ")})` : ""}. Your invoice follows.`;
      return {
        subject: `${d.shopName}: job ${d.job}, ${NOTICE_LABELS[d.kind].toLowerCase()}`,
        text: [
          `Hello ${d.customerName},`,
          "",
          head,
          "",
          `Follow it in your portal: ${d.link}`,
          "",
          CAUTION,
          sign,
        ].join("\n"),
      };
    }
    case "invoice": {
      const m = (x: number) => formatMoney(x, d.currency);
      return {
        subject: `${d.shopName}: invoice ${d.invoice}, ${m(d.balanceMinor)} to pay`,
        text: [
          `Hello ${d.customerName},`,
          "",
          `Here is invoice ${d.invoice}.`,
          "",
          `Total ${m(d.totalMinor)}`,
          `Deposit paid −${m(d.depositMinor)}`,
          ...(d.creditedMinor ? [`Credited −${m(d.creditedMinor)}`] : []),
          `Balance due ${m(d.balanceMinor)}`,
          "",
          ...(d.attachments.length ? [`Attached: ${d.attachments.join(", ")}.`, ""] : []),
          `Pay the balance in your portal: ${d.link}`,
          "",
          sign,
        ].join("\n"),
      };
    }
    case "po_to_supplier":
      return {
        subject: `${d.shopName}: purchase order ${d.po}`,
        text: [
          `Hello ${d.supplierName},`,
          "",
          `Please supply the following on our purchase order ${d.po}:`,
          "",
          ...d.lines.map((l) => `  ${l}`),
          "",
          ...(d.attachments.length ? [`Attached: ${d.attachments.join(", ")}.`, ""] : []),
          sign,
        ].join("\n"),
      };
    case "staff_quote_accepted":
    case "staff_quote_declined": {
      const verb = d.kind === "staff_quote_accepted" ? "accepted" : "declined";
      return {
        subject: `${d.customerName} ${verb} quote ${d.quote}`,
        text: [
          `${d.customerName} ${verb} quote ${d.quote} (${formatMoney(d.totalMinor, d.currency)}).`,
          "",
          d.link,
          "",
          `You get this because you chose the shop's notices in Settings. ${sign}`,
        ].join("\n"),
      };
    }
    case "staff_payment_received":
      return {
        subject: `Payment received: ${formatMoney(d.amountMinor, d.currency)} from ${d.customerName}`,
        text: [
          `${d.customerName} paid ${formatMoney(d.amountMinor, d.currency)} on ${d.document}.`,
          "",
          d.link,
          "",
          `You get this because you chose the shop's notices in Settings. ${sign}`,
        ].join("\n"),
      };
    case "staff_po_received":
      return {
        subject: `Received against ${d.po} from ${d.supplierName}`,
        text: [
          `Received against purchase order ${d.po}: ${d.received.join(", ")}.`,
          ...(d.jobsReady.length ? [`Now ready to fit: ${d.jobsReady.join(", ")}.`] : []),
          "",
          d.link,
          "",
          `You get this because you chose the shop's notices in Settings. ${sign}`,
        ].join("\n"),
      };
  }
}
