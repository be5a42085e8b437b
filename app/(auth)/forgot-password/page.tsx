"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { authClient } from "@/lib/auth/client";
import { ForgotPasswordSchema } from "@/lib/validations/auth";

export default function ForgotPasswordPage() {
  const [sent, setSent] = useState(false);
  const { register, handleSubmit, formState } = useForm<
    z.input<typeof ForgotPasswordSchema>,
    unknown,
    z.output<typeof ForgotPasswordSchema>
  >({ resolver: zodResolver(ForgotPasswordSchema) });
  const onSubmit = handleSubmit(async ({ email }) => {
    await authClient.requestPasswordReset({ email, redirectTo: "/reset-password" });
    setSent(true);
  });
  return (
    <>
      <h1 className="text-2xl font-bold">Reset your password</h1>
      <form onSubmit={onSubmit} noValidate className="mt-6 space-y-4">
        <Field
          label="E-mail"
          type="email"
          autoComplete="email"
          error={formState.errors.email?.message}
          {...register("email")}
        />
        <FormStatus
          ok
          message={sent ? "If that address has an account, a reset link is on its way." : undefined}
        />
        <Button type="submit" className="w-full" disabled={formState.isSubmitting}>
          Send reset link
        </Button>
      </form>
      <Link href="/sign-in" className="mt-6 inline-block text-sm text-copper-600 underline">
        Back to sign-in
      </Link>
    </>
  );
}
