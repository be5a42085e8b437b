import { QuoteTotalsFoot } from "@/components/quotes/quote-totals";
import type { PresentedQuote } from "@/lib/quotes/quote-presentation";

/**
 * A quote's lines and totals, read-only, as the PDF and the e-mail print them: price,
 * discount, line total; subtotal after discounts; tax; total. The portal shows it.
 */
export function QuoteLinesTable({ presented: p }: { presented: PresentedQuote }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-ink-200 bg-white">
      <table className="table-cards w-full text-left text-sm" data-testid="quote-lines">
        <thead className="bg-ink-100">
          <tr>
            <th scope="col" className="px-3 py-2">
              Item
            </th>
            <th scope="col" className="px-3 py-2 text-right">
              Qty
            </th>
            <th scope="col" className="px-3 py-2 text-right">
              Unit price
            </th>
            <th scope="col" className="px-3 py-2 text-right">
              Discount
            </th>
            <th scope="col" className="px-3 py-2 text-right">
              Line total
            </th>
          </tr>
        </thead>
        <tbody>
          {p.lines.length === 0 ? (
            <tr>
              <td colSpan={5} className="px-3 py-4 text-ink-600">
                No lines.
              </td>
            </tr>
          ) : null}
          {p.lines.map((l, i) => (
            <tr key={i} className="border-t border-ink-100">
              <td className="px-3 py-2 font-medium sm:font-normal">
                {l.description}
                {l.sku ? <span className="block text-xs text-ink-600">{l.sku}</span> : null}
              </td>
              <td className="figure px-3 py-2 text-right" data-label="Qty">
                {l.quantity}
              </td>
              <td className="figure px-3 py-2 text-right" data-label="Unit price">
                {l.unitPrice}
              </td>
              <td className="figure px-3 py-2 text-right" data-label="Discount">
                {l.discountRate ? l.discount : <span aria-label="no discount">—</span>}
              </td>
              <td className="figure px-3 py-2 text-right" data-label="Line total">
                {l.lineTotal}
              </td>
            </tr>
          ))}
        </tbody>
        <QuoteTotalsFoot presented={p} />
      </table>
    </div>
  );
}
