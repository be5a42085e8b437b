"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";

import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { checkResolver } from "@/components/ui/form-resolver";
import { FormStatus } from "@/components/ui/status";
import { authRequest } from "@/lib/auth/auth-request";
import { resetPasswordMessages } from "@/lib/validations/form-checks";

export function ResetPasswordForm({ token }: { token: string }) {
  const router = useRouter();
  const [status, setStatus] = useState<string>();
  const { register, handleSubmit, formState } = useForm<{ token: string; password: string }>({
    resolver: checkResolver(resetPasswordMessages),
    defaultValues: { token, password: "" },
  });
  const onSubmit = handleSubmit(async (data) => {
    const { error } = await authRequest("/reset-password", {
      newPassword: data.password,
      token: data.token,
    });
    if (error) return setStatus("This reset link is not valid any more. Ask for a new one.");
    router.replace("/sign-in?reset=1");
  });
  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 space-y-4">
      <input type="hidden" {...register("token")} />
      <Field
        label="New password"
        type="password"
        autoComplete="new-password"
        error={formState.errors.password?.message}
        {...register("password")}
      />
      <FormStatus message={status} />
      <Button type="submit" className="w-full" disabled={formState.isSubmitting}>
        Set password
      </Button>
    </form>
  );
}
