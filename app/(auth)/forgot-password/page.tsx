"use client";

import Link from "next/link";
import { useState } from "react";
import { useForm } from "react-hook-form";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { checkResolver } from "@/components/ui/form-resolver";
import { FormStatus } from "@/components/ui/status";
import { authRequest } from "@/lib/auth/auth-request";
import { forgotPasswordMessages } from "@/lib/validations/form-checks";

export default function ForgotPasswordPage() {
  const [sent, setSent] = useState(false);
  const { register, handleSubmit, formState } = useForm<{ email: string }>({
    resolver: checkResolver(forgotPasswordMessages),
    defaultValues: { email: "" },
  });
  const onSubmit = handleSubmit(async ({ email }) => {
    await authRequest("/request-password-reset", {
      email: email.trim().toLowerCase(),
      redirectTo: "/reset-password",
    });
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
