import { QuoteLinesTable } from "@/components/quotes/quote-lines-table";
import type { InvoiceRow } from "@/db/queries/invoices";
import { formatMoney } from "@/lib/catalog/money";
import { creditNoteLabel } from "@/lib/domain/operations";
import { formatDeduction, presentQuote } from "@/lib/quotes/quote-presentation";

/**
 * An invoice as both the shop and the customer read it: the lines and totals as every quote
 * surface presents them, then the ledger — deposit, credit notes, payments — and the balance.
 */
export function InvoiceBody({ inv }: { inv: InvoiceRow }) {
  const i = inv.invoice;
  const money = (m: number) => formatMoney(m, i.currency);
  const paid = inv.payments.filter((p) => p.status === "paid");
  return (
    <>
      <QuoteLinesTable presented={presentQuote(i, inv.lines)} />
      <dl className="mt-4 ml-auto max-w-sm space-y-1 text-sm" data-testid="invoice-ledger">
        <div className="flex justify-between gap-4">
          <dt>Deposit paid</dt>
          <dd className="figure">{formatDeduction(i.depositMinor, i.currency)}</dd>
        </div>
        {inv.creditNotes.map((c) => (
          <div key={c.id} className="flex justify-between gap-4">
            <dt>
              Credit note {creditNoteLabel(c.number)}
              <span className="block text-xs text-ink-600">{c.reason}</span>
            </dt>
            <dd className="figure">{formatDeduction(c.amountMinor, i.currency)}</dd>
          </div>
        ))}
        {paid.map((p) => (
          <div key={p.id} className="flex justify-between gap-4">
            <dt>Paid by card</dt>
            <dd className="figure">{formatDeduction(p.amountMinor, i.currency)}</dd>
          </div>
        ))}
        <div className="flex justify-between gap-4 border-t border-copper-600 pt-1 font-semibold">
          <dt>{inv.ledger.balanceMinor < 0 ? "Owed to the customer" : "Balance due"}</dt>
          <dd className="figure" data-testid="balance-due">
            {money(Math.abs(inv.ledger.balanceMinor))}
          </dd>
        </div>
      </dl>
      {i.notes ? (
        <p className="mt-4 text-sm whitespace-pre-line text-ink-800" data-testid="invoice-notes">
          {i.notes}
        </p>
      ) : null}
    </>
  );
}
