"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { FormStatus } from "@/components/ui/status";
import { api } from "@/lib/api-client";

/** Accept or decline buttons on the customer's own sent quote. */
export function QuoteDecision({ id }: { id: string }) {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [status, setStatus] = useState<{ ok: boolean; message: string } | null>(null);
  const decide = (decision: "accept" | "decline") => {
    if (
      !window.confirm(
        decision === "accept"
          ? "Accept this quote? The shop will hold the parts for you."
          : "Decline this quote?",
      )
    )
      return;
    start(async () => {
      const res = await api("POST", `/api/v1/quotes/${id}/respond`, { decision });
      setStatus(
        res.ok
          ? { ok: true, message: decision === "accept" ? "Accepted — thank you" : "Declined" }
          : { ok: false, message: res.message },
      );
      if (res.ok) router.refresh();
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
