"use client";

import { useRouter } from "next/navigation";
import { startTransition, useActionState, useEffect, useRef, useState } from "react";
import { flushSync } from "react-dom";
import { useForm } from "react-hook-form";

import { Button } from "@/components/ui/button";
import { EditConflict } from "@/components/ui/edit-conflict";
import { Field, SelectField, TextAreaField } from "@/components/ui/field";
import { checkResolver } from "@/components/ui/form-resolver";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import { customerMessages, type CustomerFormValues } from "@/lib/validations/form-checks";

import { createCustomerAction, updateCustomerAction } from "./actions";

type In = CustomerFormValues;
type Stored = {
  id: string;
  version: number;
  name: string;
  email: string | null;
  /** As people read it (lib/format/phone#formatPhone). */
  phone: string | null;
  notes: string | null;
  addressLine1: string | null;
  addressLine2: string | null;
  city: string | null;
  region: string | null;
  postcode: string | null;
  country: string | null;
  taxId: string | null;
};
const LABELS = {
  name: "Name",
  email: "E-mail",
  phone: "Phone",
  addressLine1: "Address",
  addressLine2: "Address line 2",
  city: "City",
  region: "State or region",
  postcode: "Postcode",
  country: "Country",
  taxId: "Tax number",
  notes: "Notes",
} as const;

/** The shop's country and what it needs of a customer's details. */
export interface CustomerFormContext {
  shopCountry: string;
  shopCountryName: string;
  /** What the shop's country calls a customer's tax number; null: none is asked. */
  taxIdLabel: string | null;
  countries: { code: string; name: string }[];
}

export function CustomerForm({
  customer,
  context,
}: {
  customer?: Stored;
  context: CustomerFormContext;
}) {
  const router = useRouter();
  const [state, action, pending] = useActionState(
    customer ? updateCustomerAction : createCustomerAction,
    initialActionState,
  );
  const formRef = useRef<HTMLFormElement>(null);
  // The version the edit started from; "Save mine over theirs" moves it to the one now stored.
  // Versions only rise, so the newer of that and the page's own is the base of the next save.
  const [overVersion, setOverVersion] = useState(0);
  const version = Math.max(overVersion, customer?.version ?? 0);
  const conflict = !state.ok && state.status === 409 ? (state.current as Stored) : null;
  const { register, handleSubmit, formState, reset, setError, getValues } = useForm<In>({
    // CustomerSchema's messages without the schema library; the action parses with the schema.
    resolver: checkResolver(customerMessages),
    defaultValues: {
      name: customer?.name ?? "",
      email: customer?.email ?? "",
      phone: customer?.phone ?? "",
      notes: customer?.notes ?? "",
      addressLine1: customer?.addressLine1 ?? "",
      addressLine2: customer?.addressLine2 ?? "",
      city: customer?.city ?? "",
      region: customer?.region ?? "",
      postcode: customer?.postcode ?? "",
      country: customer?.country ?? "",
      taxId: customer?.taxId ?? "",
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
      ref={formRef}
      onSubmit={onSubmit}
      noValidate
      className="space-y-4"
      aria-label={customer ? "Edit customer" : "Add customer"}
    >
      {customer ? (
        <>
          <input type="hidden" name="id" value={customer.id} />
          <input type="hidden" name="version" value={version} />
        </>
      ) : null}
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
          hint={`Any spelling; without + it is read as a ${context.shopCountryName} number.`}
          error={formState.errors.phone?.message}
          {...register("phone")}
        />
      </div>
      <fieldset className="space-y-4">
        <legend className="text-sm font-semibold text-ink-800">Address</legend>
        <Field
          label="Street address"
          autoComplete="off"
          error={formState.errors.addressLine1?.message}
          {...register("addressLine1")}
        />
        <Field
          label="Address line 2"
          autoComplete="off"
          error={formState.errors.addressLine2?.message}
          {...register("addressLine2")}
        />
        <div className="grid gap-4 sm:grid-cols-2">
          <Field
            label="City"
            autoComplete="off"
            error={formState.errors.city?.message}
            {...register("city")}
          />
          <Field
            label="State or region"
            autoComplete="off"
            error={formState.errors.region?.message}
            {...register("region")}
          />
          <Field
            label="Postcode"
            autoComplete="off"
            error={formState.errors.postcode?.message}
            {...register("postcode")}
          />
          <SelectField
            label="Country"
            error={formState.errors.country?.message}
            {...register("country")}
          >
            <option value="">{context.shopCountryName} (the shop&apos;s)</option>
            {context.countries.map((c) => (
              <option key={c.code} value={c.code}>
                {c.name}
              </option>
            ))}
          </SelectField>
        </div>
      </fieldset>
      {context.taxIdLabel ? (
        <Field
          label={context.taxIdLabel}
          autoComplete="off"
          hint="For business customers."
          error={formState.errors.taxId?.message}
          {...register("taxId")}
        />
      ) : null}
      <TextAreaField label="Notes" error={formState.errors.notes?.message} {...register("notes")} />
      {/* A conflict speaks for itself below (with what was saved meanwhile). */}
      <FormStatus ok={state.ok} message={conflict ? undefined : state.message} />
      {conflict && conflict.version > version ? (
        <EditConflict
          what="this customer"
          version={conflict.version}
          disabled={pending}
          rows={(Object.keys(LABELS) as (keyof typeof LABELS)[]).map((k) => ({
            label: LABELS[k],
            yours: String(getValues(k) ?? "").trim(),
            theirs: conflict[k] ?? "",
          }))}
          onOverwrite={() => {
            // The hidden version field takes the stored version first, then the form is sent.
            flushSync(() => setOverVersion(conflict.version));
            formRef.current?.requestSubmit();
          }}
        />
      ) : null}
      <Button type="submit" disabled={pending}>
        {pending ? "Saving…" : customer ? "Save changes" : "Add customer"}
      </Button>
    </form>
  );
}
