"use client";

import { useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import { respondToQuoteAction } from "@/lib/quotes/quote-actions";

/**
 * Accept or decline buttons on the customer's own sent quote; accepting asks first, saying what
 * the shop will hold and what is back-ordered (`holds`, lib/catalog/stock.ts#holdSummary).
 */
export function QuoteDecision({ id, holds }: { id: string; holds: string | null }) {
  const [pending, start] = useTransition();
  const [status, setStatus] = useState<{ ok: boolean; message: string } | null>(null);
  const decide = (decision: "accept" | "decline") => {
    if (
      !window.confirm(
        decision === "accept"
          ? `Accept this quote?${holds ? ` ${holds}` : ""}`
          : "Decline this quote?",
      )
    )
      return;
    start(async () => {
      // The action revalidates this page, which then shows the decision.
      const res = await respondToQuoteAction(initialActionState, { id, decision });
      setStatus(
        res.ok
          ? { ok: true, message: decision === "accept" ? "Accepted — thank you" : "Declined" }
          : { ok: false, message: res.message ?? "That did not work" },
      );
    });
  };
  return (
    <div className="mt-6 flex flex-wrap items-center gap-3">
      <Button onClick={() => decide("accept")} disabled={pending}>
        Accept quote
      </Button>
      <Button variant="secondary" onClick={() => decide("decline")} disabled={pending}>
        Decline
      </Button>
      <FormStatus ok={status?.ok} message={status?.message} />
    </div>
  );
}
