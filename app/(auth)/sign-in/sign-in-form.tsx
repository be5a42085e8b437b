"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { checkResolver } from "@/components/ui/form-resolver";
import { FormStatus } from "@/components/ui/status";
import { authRequest } from "@/lib/auth/auth-request";
import { signInMessages } from "@/lib/validations/form-checks";

type In = { email: string; password: string };

export function SignInForm() {
  const router = useRouter();
  const [status, setStatus] = useState<string>();
  const { register, handleSubmit, formState } = useForm<In>({
    resolver: checkResolver(signInMessages),
    defaultValues: { email: "", password: "" },
  });

  const onSubmit = handleSubmit(async (data) => {
    setStatus(undefined);
    // As SignInSchema gives it: the address trimmed and lower-cased.
    const { error } = await authRequest("/sign-in/email", {
      email: data.email.trim().toLowerCase(),
      password: data.password,
    });
    if (error) {
      if (error.status === 429) setStatus("Too many attempts. Wait ten seconds and try again.");
      else if (error.code === "EMAIL_NOT_VERIFIED")
        setStatus("Confirm your e-mail first: we sent you a link.");
      else setStatus("That e-mail and password do not match an account.");
      return;
    }
    router.replace("/");
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 space-y-4" aria-label="Sign in">
      <Field
        label="E-mail"
        type="email"
        autoComplete="email"
        error={formState.errors.email?.message}
        {...register("email")}
      />
      <Field
        label="Password"
        type="password"
        autoComplete="current-password"
        error={formState.errors.password?.message}
        {...register("password")}
      />
      <FormStatus message={status} />
      <Button type="submit" className="w-full" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Signing in…" : "Sign in"}
      </Button>
    </form>
  );
}
