"use client";

import { useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import { startDepositAction } from "@/lib/quotes/quote-actions";

/** Opens the payment provider's checkout for the deposit on an accepted quote. */
export function DepositButton({ id, amount }: { id: string; amount: string }) {
  const [pending, start] = useTransition();
  const [error, setError] = useState<string>();
  const pay = () =>
    start(async () => {
      setError(undefined);
      const res = await startDepositAction(initialActionState, { id });
      if (res.ok && res.data) window.location.assign(res.data.url);
      else setError(res.message ?? "The checkout did not open; try again");
    });
  return (
    <div className="mt-6 rounded-lg border border-copper-100 bg-copper-50 p-4">
      <p className="text-sm text-ink-800">
        The shop asks for a deposit of <strong className="figure">{amount}</strong> to order your
        parts.
      </p>
      <div className="mt-3 flex flex-wrap items-center gap-3">
        <Button onClick={pay} disabled={pending} aria-busy={pending}>
          {pending ? "Opening the secure checkout…" : `Pay deposit ${amount}`}
        </Button>
        <FormStatus ok={false} message={error} />
      </div>
    </div>
  );
}
