import type { ReactNode } from "react";

import { formatMoney } from "@/lib/catalog/money";

/** One row of an invoice's totals and ledger (inside a `<dl>`): what it is, and its amount. */
export function LedgerRow({
  label,
  children,
  className,
  valueTestId,
}: {
  label: ReactNode;
  children: ReactNode;
  /** More classes for the row (a total in bold, the balance ruled off). */
  className?: string;
  valueTestId?: string;
}) {
  return (
    <div
      className={
        className ? `flex justify-between gap-4 ${className}` : "flex justify-between gap-4"
      }
    >
      <dt>{label}</dt>
      <dd className="figure" data-testid={valueTestId}>
        {children}
      </dd>
    </div>
  );
}

/** The last row: the balance due, or what is owed to the customer when they paid more. */
export function BalanceRow({
  balanceMinor,
  currency,
  valueTestId,
}: {
  balanceMinor: number;
  currency: string;
  valueTestId?: string;
}) {
  return (
    <LedgerRow
      className="border-t border-copper-600 pt-1 font-semibold"
      label={balanceMinor < 0 ? "Owed to the customer" : "Balance due"}
      valueTestId={valueTestId}
    >
      {formatMoney(Math.abs(balanceMinor), currency)}
    </LedgerRow>
  );
}
