import { BalanceRow, LedgerRow } from "@/components/operations/ledger-rows";
import { QuoteLinesTable } from "@/components/quotes/quote-lines-table";
import type { InvoiceRow } from "@/db/queries/invoices";
import { creditNoteLabel } from "@/lib/domain/operations";
import { formatDeduction, presentQuote } from "@/lib/quotes/quote-presentation";

/**
 * An invoice as both the shop and the customer read it: the lines and totals as every quote
 * surface presents them, then the ledger — deposit, credit notes, payments — and the balance.
 */
export function InvoiceBody({ inv }: { inv: InvoiceRow }) {
  const i = inv.invoice;
  const paid = inv.payments.filter((p) => p.status === "paid");
  return (
    <>
      <QuoteLinesTable presented={presentQuote(i, inv.lines)} />
      <dl className="mt-4 ml-auto max-w-sm space-y-1 text-sm" data-testid="invoice-ledger">
        <LedgerRow label="Deposit paid">{formatDeduction(i.depositMinor, i.currency)}</LedgerRow>
        {inv.creditNotes.map((c) => (
          <LedgerRow
            key={c.id}
            label={
              <>
                Credit note {creditNoteLabel(c.number)}
                <span className="block text-xs text-ink-600">{c.reason}</span>
              </>
            }
          >
            {formatDeduction(c.amountMinor, i.currency)}
          </LedgerRow>
        ))}
        {paid.map((p) => (
          <LedgerRow key={p.id} label="Paid by card">
            {formatDeduction(p.amountMinor, i.currency)}
          </LedgerRow>
        ))}
        <BalanceRow
          balanceMinor={inv.ledger.balanceMinor}
          currency={i.currency}
          valueTestId="balance-due"
        />
      </dl>
      {i.notes ? (
        <p className="mt-4 text-sm whitespace-pre-line text-ink-800" data-testid="invoice-notes">
          {i.notes}
        </p>
      ) : null}
    </>
  );
}
