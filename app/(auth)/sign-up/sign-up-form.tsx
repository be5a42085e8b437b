"use client";

import { useActionState } from "react";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";

import { signUpAction } from "../actions";

export function SignUpForm() {
  const [state, action, pending] = useActionState(signUpAction, initialActionState);
  const v = state.values ?? {};
  const e = state.fieldErrors ?? {};
  return (
    <form action={action} noValidate className="mt-6 space-y-4" aria-label="Sign up">
      <Field
        label="Your name"
        name="name"
        autoComplete="name"
        defaultValue={v.name}
        error={e.name}
      />
      <Field
        label="Shop name"
        name="shopName"
        autoComplete="organization"
        defaultValue={v.shopName}
        error={e.shopName}
      />
      <Field
        label="E-mail"
        name="email"
        type="email"
        autoComplete="email"
        defaultValue={v.email}
        error={e.email}
      />
      <Field
        label="Password"
        name="password"
        type="password"
        autoComplete="new-password"
        error={e.password}
        hint="At least 10 characters."
      />
      <FormStatus ok={state.ok} message={state.message} />
      <Button type="submit" className="w-full" disabled={pending}>
        {pending ? "Creating…" : "Create shop account"}
      </Button>
    </form>
  );
}
