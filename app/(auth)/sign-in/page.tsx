import type { Metadata } from "next";
import Link from "next/link";

import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({
  searchParams,
}: {
  searchParams: Promise<{ verified?: string; reset?: string }>;
}) {
  const sp = await searchParams;
  return (
    <>
      <h1 className="text-2xl font-bold">Sign in</h1>
      {sp.reset ? (
        <p className="mt-2 text-sm text-ok-700">✓ Password changed. Sign in with the new one.</p>
      ) : null}
      <SignInForm />
      <div className="mt-6 flex justify-between text-sm">
        <Link href="/forgot-password" className="text-copper-600 underline">
          Forgot password?
        </Link>
        <Link href="/sign-up" className="text-copper-600 underline">
          Open a shop account
        </Link>
      </div>
    </>
  );
}
