import type { PresentedQuote } from "@/lib/quotes/quote-presentation";

/**
 * The foot of a quote's lines table: subtotal after discounts (with the discount note), tax and
 * total, in the line-total column. The editor and the read-only table (portal, invoice) share it.
 */
export function QuoteTotalsFoot({
  presented: p,
  testId,
}: {
  presented: PresentedQuote;
  testId?: string;
}) {
  return (
    <tfoot className="border-t border-ink-200 text-right" data-testid={testId}>
      <tr>
        <td colSpan={4} className="px-3 py-1">
          Subtotal
        </td>
        <td className="figure px-3 py-1" data-testid="quote-subtotal">
          {p.subtotal}
        </td>
      </tr>
      {p.discountNote ? (
        <tr>
          <td colSpan={5} className="px-3 py-1 text-xs text-ink-600">
            {p.discountNote}
          </td>
        </tr>
      ) : null}
      <tr>
        <td colSpan={4} className="px-3 py-1">
          {p.taxLabel}
        </td>
        <td className="figure px-3 py-1">{p.tax}</td>
      </tr>
      <tr className="font-semibold">
        <td colSpan={4} className="px-3 py-1">
          Total
        </td>
        <td className="figure px-3 py-1" data-testid="quote-total">
          {p.total}
        </td>
      </tr>
    </tfoot>
  );
}
