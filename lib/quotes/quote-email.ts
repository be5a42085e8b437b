import { quoteLabel } from "@/lib/domain/quotes";
import { formatCalendarDate } from "@/lib/format/dates";

import type { PresentedQuote } from "./quote-presentation";

/** What the quote e-mail tells: the quote, its lines and totals, and where to answer it. */
export interface QuoteEmailData {
  shopName: string;
  customerName: string;
  buildTitle: string | null;
  quote: { number: number; revision: number; validUntil: string };
  /** The quote as every surface shows it (lib/quotes/quote-presentation.ts). */
  presented: PresentedQuote;
  /** The quote in the customer's portal. */
  link: string;
  /** For a customer without a portal sign-in: the invitation that sets their password. */
  invite: string | null;
  /** The names of the files attached (the quote PDF, the spec sheet where there is a build). */
  attachments: string[];
}

/**
 * The subject and plain text of the e-mail that sends a quote to its customer. Each line reads
 * as on the quote page and the PDF: quantity × description, unit price, discount, line total;
 * then the subtotal after discounts, tax and total.
 */
export function quoteEmail(d: QuoteEmailData): { subject: string; text: string } {
  const label = quoteLabel(d.quote.number, d.quote.revision);
  const p = d.presented;
  const text = [
    `Hello ${d.customerName},`,
    "",
    `Here is quote ${label}${d.buildTitle ? ` for ${d.buildTitle}` : ""}, valid until ${formatCalendarDate(d.quote.validUntil)}.`,
    "",
    ...p.lines.flatMap((l) => [
      `  ${l.quantity} × ${l.description}${l.sku ? ` (${l.sku})` : ""}`,
      `      ${l.unitPrice} each${l.discountRate ? `, discount ${l.discount}` : ""}: ${l.lineTotal}`,
    ]),
    "",
    `Subtotal ${p.subtotal}${p.discountNote ? ` (${p.discountNote.toLowerCase()})` : ""}`,
    `${p.taxLabel} ${p.tax}`,
    `Total ${p.total}`,
    "",
    ...(d.attachments.length ? [`Attached: ${d.attachments.join(", ")}.`, ""] : []),
    ...(d.invite
      ? [
          `To see it, accept or decline it and pay the deposit, first set your password for the shop's customer portal (valid 14 days):`,
          d.invite,
          "",
          `Afterwards the quote is here: ${d.link}`,
        ]
      : [`See it, and accept or decline it, in your portal: ${d.link}`]),
    "",
    "Fuel system work must be done and checked by qualified people, to your local codes.",
    `— ${d.shopName}`,
  ].join("\n");
  // A parts-only quote sizes no fuel system: its subject says parts.
  const about = d.buildTitle ? "for your fuel system" : "for the parts you asked about";
  return { subject: `${d.shopName}: quote ${label} ${about}`, text };
}
