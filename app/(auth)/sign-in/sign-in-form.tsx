"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { authClient } from "@/lib/auth/client";
import { SignInSchema } from "@/lib/validations/auth";

type In = z.input<typeof SignInSchema>;
type Out = z.output<typeof SignInSchema>;

export function SignInForm() {
  const router = useRouter();
  const [status, setStatus] = useState<string>();
  const { register, handleSubmit, formState } = useForm<In, unknown, Out>({
    resolver: zodResolver(SignInSchema),
  });

  const onSubmit = handleSubmit(async (data) => {
    setStatus(undefined);
    const { error } = await authClient.signIn.email({ email: data.email, password: data.password });
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
