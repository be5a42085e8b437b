"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState, type ActionState } from "@/lib/actions/state";
import { createSupplierAction } from "@/lib/purchasing/purchasing-actions";

/** A new supplier: name, where orders are e-mailed, and their usual lead time. */
export function SupplierForm() {
  const router = useRouter();
  const [pending, start] = useTransition();
  const [v, setV] = useState({ name: "", email: "", leadTimeDays: "" });
  const [state, setState] = useState<ActionState>(initialActionState);
  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    start(async () => {
      const days = v.leadTimeDays.trim() === "" ? null : Number(v.leadTimeDays);
      const res = await createSupplierAction(initialActionState, {
        name: v.name,
        email: v.email,
        leadTimeDays: days !== null && Number.isFinite(days) ? days : null,
      });
      setState(res);
      if (res.ok) {
        setV({ name: "", email: "", leadTimeDays: "" });
        router.refresh();
      }
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
        error={state.fieldErrors?.leadTimeDays}
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
