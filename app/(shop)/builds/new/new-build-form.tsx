"use client";

import { useActionState } from "react";

import { Button } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";

import { createBuildAction } from "./actions";

export function NewBuildForm({
  customers,
  customerId,
}: {
  customers: { id: string; name: string }[];
  customerId?: string;
}) {
  const [state, action, pending] = useActionState(createBuildAction, initialActionState);
  const e = state.fieldErrors ?? {};
  return (
    <form action={action} noValidate className="space-y-4" aria-label="New build">
      <SelectField
        label="Customer"
        name="customerId"
        defaultValue={state.values?.customerId ?? customerId ?? ""}
        error={e.customerId}
      >
        <option value="">Choose…</option>
        {customers.map((c) => (
          <option key={c.id} value={c.id}>
            {c.name}
          </option>
        ))}
      </SelectField>
      <Field
        label="Title"
        name="title"
        placeholder="e.g. 500 whp on pump E85"
        defaultValue={state.values?.title}
        error={e.title}
      />
      <Field
        label="Vehicle"
        name="vehicle"
        placeholder="Year, model, engine"
        defaultValue={state.values?.vehicle}
        error={e.vehicle}
      />
      <FormStatus ok={state.ok} message={state.message} />
      <Button type="submit" disabled={pending}>
        {pending ? "Creating…" : "Create build sheet"}
      </Button>
    </form>
  );
}
