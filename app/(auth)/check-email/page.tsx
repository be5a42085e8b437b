import Link from "next/link";

export default async function CheckEmailPage({
  searchParams,
}: {
  searchParams: Promise<{ email?: string }>;
}) {
  const { email } = await searchParams;
  return (
    <>
      <h1 className="text-2xl font-bold">Check your inbox</h1>
      <p className="mt-3 text-ink-700">
        We sent a confirmation link to <strong>{email ?? "your address"}</strong>. Open it to
        confirm the address; then you can sign in.
      </p>
      <Link href="/sign-in" className="mt-6 inline-block text-copper-600 underline">
        Go to sign-in
      </Link>
    </>
  );
}
