"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { startTransition, useActionState, useEffect } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";

import { Button } from "@/components/ui/button";
import { Field, TextAreaField } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import { CustomerSchema } from "@/lib/validations/customers";

import { createCustomerAction, updateCustomerAction } from "./actions";

type In = z.input<typeof CustomerSchema>;
type Out = z.output<typeof CustomerSchema>;

export function CustomerForm({
  customer,
}: {
  customer?: {
    id: string;
    name: string;
    email: string | null;
    phone: string | null;
    notes: string | null;
  };
}) {
  const router = useRouter();
  const [state, action, pending] = useActionState(
    customer ? updateCustomerAction : createCustomerAction,
    initialActionState,
  );
  const { register, handleSubmit, formState, reset, setError } = useForm<In, unknown, Out>({
    resolver: zodResolver(CustomerSchema),
    defaultValues: {
      name: customer?.name ?? "",
      email: customer?.email ?? "",
      phone: customer?.phone ?? "",
      notes: customer?.notes ?? "",
    },
  });

  useEffect(() => {
    // The server's field messages, highlighted; the first one gets the focus.
    Object.entries(state.fieldErrors ?? {}).forEach(([k, msgs], i) =>
      setError(k as keyof In, { message: msgs.join(" ") }, { shouldFocus: i === 0 }),
    );
    if (state.ok && !customer) {
      reset();
      const made = state.data as { id?: string } | undefined;
      if (made?.id) router.push(`/customers/${made.id}`);
    }
  }, [state, customer, reset, setError, router]);

  // Validate in the browser first; only then hand the form's own data to the server action.
  const onSubmit = (e: React.FormEvent<HTMLFormElement>) => {
    const form = e.currentTarget;
    void handleSubmit(() => startTransition(() => action(new FormData(form))))(e);
  };

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="space-y-4"
      aria-label={customer ? "Edit customer" : "Add customer"}
    >
      {customer ? <input type="hidden" name="id" value={customer.id} /> : null}
      <Field
        label="Name"
        autoComplete="off"
        error={formState.errors.name?.message}
        {...register("name")}
      />
      <div className="grid gap-4 sm:grid-cols-2">
        <Field
          label="E-mail"
          type="email"
          autoComplete="off"
          error={formState.errors.email?.message}
          {...register("email")}
        />
        <Field
          label="Phone"
          type="tel"
          autoComplete="off"
          error={formState.errors.phone?.message}
          {...register("phone")}
        />
      </div>
      <TextAreaField label="Notes" error={formState.errors.notes?.message} {...register("notes")} />
      <FormStatus ok={state.ok} message={state.message} />
      <Button type="submit" disabled={pending}>
        {pending ? "Saving…" : customer ? "Save changes" : "Add customer"}
      </Button>
    </form>
  );
}
