import { formatMoney } from "@/lib/catalog/money";
import { quoteLabel } from "@/lib/domain/quotes";
import { formatCalendarDate } from "@/lib/format/dates";

/** What the quote e-mail tells: the quote, its lines and totals, and where to answer it. */
export interface QuoteEmailData {
  shopName: string;
  customerName: string;
  buildTitle: string | null;
  quote: {
    number: number;
    revision: number;
    currency: string;
    validUntil: string;
    subtotalMinor: number;
    discountMinor: number;
    taxMinor: number;
    totalMinor: number;
  };
  lines: {
    description: string;
    quantityMilli: number;
    unitPriceMinor: number;
    discountBp: number;
  }[];
  /** The quote in the customer's portal. */
  link: string;
  /** For a customer without a portal sign-in: the invitation that sets their password. */
  invite: string | null;
}

/** The subject and plain text of the e-mail that sends a quote to its customer. */
export function quoteEmail(d: QuoteEmailData): { subject: string; text: string } {
  const label = quoteLabel(d.quote.number, d.quote.revision);
  const money = (m: number) => formatMoney(m, d.quote.currency);
  const q = d.quote;
  const text = [
    `Hello ${d.customerName},`,
    "",
    `Here is quote ${label}${d.buildTitle ? ` for ${d.buildTitle}` : ""}, valid until ${formatCalendarDate(q.validUntil)}.`,
    "",
    ...d.lines.map(
      (l) =>
        `  ${(l.quantityMilli / 1000).toString().padStart(6)} × ${l.description} — ${money(Math.round((l.quantityMilli * l.unitPriceMinor) / 1000))}${l.discountBp ? ` less ${l.discountBp / 100} %` : ""}`,
    ),
    "",
    `Subtotal ${money(q.subtotalMinor)}${q.discountMinor ? `, discounts −${money(q.discountMinor)}` : ""}, tax ${money(q.taxMinor)}`,
    `Total ${money(q.totalMinor)}`,
    "",
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
  return { subject: `${d.shopName}: quote ${label} for your fuel system`, text };
}
