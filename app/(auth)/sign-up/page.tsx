import type { Metadata } from "next";
import Link from "next/link";

import { SignUpForm } from "./sign-up-form";

export const metadata: Metadata = { title: "Open a shop account" };

export default function SignUpPage() {
  return (
    <>
      <h1 className="text-2xl font-bold">Open a shop account</h1>
      <p className="mt-1 text-sm text-ink-600">
        You become the shop&apos;s owner and can invite your tuners and counter staff.
      </p>
      <SignUpForm />
      <p className="mt-6 text-sm">
        Already have an account?{" "}
        <Link href="/sign-in" className="text-copper-600 underline">
          Sign in
        </Link>
      </p>
    </>
  );
}
