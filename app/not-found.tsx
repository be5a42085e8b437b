import Link from "next/link";

export default function NotFound() {
  return (
    <main id="main" tabIndex={-1} className="mx-auto max-w-md p-8 text-center focus:outline-none">
      <h1 className="text-3xl font-bold">Not found</h1>
      <p className="mt-2 text-ink-600">That page does not exist, or it belongs to another shop.</p>
      <Link href="/" className="mt-6 inline-block font-medium text-copper-600 underline">
        Back to Fuelwright
      </Link>
    </main>
  );
}
