"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState, type ActionState } from "@/lib/actions/state";
import { parseMoney } from "@/lib/catalog/money";
import { createCreditNoteAction } from "@/lib/invoices/invoice-actions";

/** A credit note on an issued invoice: why, and how much (tax included). */
export function CreditNoteForm({ id, currency }: { id: string; currency: string }) {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [reason, setReason] = useState("");
  const [amount, setAmount] = useState("");
  const [state, setState] = useState<ActionState>(initialActionState);
  const [local, setLocal] = useState<Record<string, string>>({});
  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    const minor = parseMoney(amount);
    const bad: Record<string, string> = {};
    if (!reason.trim()) bad.reason = "Say why the invoice is corrected";
    if (minor === null || minor <= 0) bad.amountMinor = "An amount above 0, such as 25.00";
    setLocal(bad);
    if (Object.keys(bad).length) return;
    if (
      !window.confirm(
        `Credit ${amount} ${currency} on this invoice? A credit note cannot be taken back.`,
      )
    )
      return;
    start(async () => {
      const res = await createCreditNoteAction(initialActionState, {
        id,
        reason: reason.trim(),
        amountMinor: minor!,
      });
      setState(res);
      if (res.ok) {
        setReason("");
        setAmount("");
        router.refresh();
      }
    });
  };
  return (
    <form
      onSubmit={submit}
      noValidate
      className="grid gap-3 sm:grid-cols-[2fr_1fr_auto] sm:items-end"
    >
      <Field
        name="reason"
        label="Reason"
        value={reason}
        maxLength={500}
        onChange={(e) => setReason(e.target.value)}
        error={local.reason ?? state.fieldErrors?.reason}
      />
      <Field
        name="amount"
        label={`Amount (${currency}, tax included)`}
        inputMode="decimal"
        value={amount}
        onChange={(e) => setAmount(e.target.value)}
        error={local.amountMinor ?? state.fieldErrors?.amountMinor}
      />
      <Button type="submit" disabled={pending} aria-busy={pending}>
        {pending ? "Saving…" : "Raise credit note"}
      </Button>
      <div className="sm:col-span-3">
        <FormStatus ok={state.ok} message={state.ok ? "Credit note raised" : state.message} />
      </div>
    </form>
  );
}
