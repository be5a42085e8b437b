"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState, type ActionState } from "@/lib/actions/state";
import { parseNumberText } from "@/lib/calc/number-text";
import { createSupplierAction } from "@/lib/purchasing/purchasing-actions";

/** A new supplier: name, where orders are e-mailed, and their usual lead time; then its page. */
export function SupplierForm() {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [v, setV] = useState({ name: "", email: "", leadTimeDays: "" });
  const [state, setState] = useState<ActionState>(initialActionState);
  const [daysError, setDaysError] = useState<string>();
  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    // A lead time that is no whole number is said so here, never sent as blank.
    const days = v.leadTimeDays.trim() === "" ? null : parseNumberText(v.leadTimeDays);
    const badDays = days !== null && !(Number.isInteger(days) && days >= 0 && days <= 3650);
    setDaysError(badDays ? "A whole number of days from 0 to 3650" : undefined);
    if (badDays) return;
    start(async () => {
      const res = await createSupplierAction(initialActionState, {
        name: v.name,
        email: v.email,
        leadTimeDays: days,
      });
      setState(res);
      // Next, their SKUs and costs for our parts: on the new supplier's own page.
      const id = (res.data as { id?: string } | undefined)?.id;
      if (res.ok && id) router.push(`/purchasing/suppliers/${id}`);
      else if (res.ok) router.refresh();
    });
  };
  return (
    <form
      onSubmit={submit}
      noValidate
      className="grid gap-3 sm:grid-cols-[2fr_2fr_1fr_auto] sm:items-end"
    >
      <Field
        name="name"
        label="Supplier"
        value={v.name}
        maxLength={120}
        onChange={(e) => setV({ ...v, name: e.target.value })}
        error={state.fieldErrors?.name}
      />
      <Field
        name="email"
        label="Orders e-mail"
        type="email"
        value={v.email}
        onChange={(e) => setV({ ...v, email: e.target.value })}
        error={state.fieldErrors?.email}
      />
      <Field
        name="leadTimeDays"
        label="Lead time (days)"
        inputMode="numeric"
        value={v.leadTimeDays}
        onChange={(e) => setV({ ...v, leadTimeDays: e.target.value })}
        error={daysError ?? state.fieldErrors?.leadTimeDays}
      />
      <Button type="submit" disabled={pending} aria-busy={pending}>
        {pending ? "Adding…" : "Add supplier"}
      </Button>
      <div className="sm:col-span-4">
        <FormStatus ok={state.ok} message={state.ok ? "Supplier added" : state.message} />
      </div>
    </form>
  );
}
