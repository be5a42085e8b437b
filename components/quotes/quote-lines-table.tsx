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
        <tfoot className="border-t border-ink-200 text-right">
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
      </table>
    </div>
  );
}
