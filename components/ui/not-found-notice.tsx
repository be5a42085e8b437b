import Link from "next/link";
import type { ReactNode } from "react";

/**
 * The body of a resource's not-found page: which thing was not found and the way back to its
 * list. Another shop's record reads the same as one that never existed.
 */
export function NotFoundNotice({
  thing,
  backHref,
  backLabel,
  children,
}: {
  thing: string;
  backHref: string;
  backLabel: string;
  children?: ReactNode;
}) {
  return (
    <section
      aria-labelledby="not-found-title"
      className="mx-auto max-w-xl rounded-lg border border-ink-200 bg-white p-6 sm:p-8"
    >
      <p className="text-sm font-semibold tracking-wide text-copper-700 uppercase">404</p>
      <h1 id="not-found-title" className="mt-1 text-2xl font-bold text-ink-900">
        {`${thing} not found`}
      </h1>
      <p className="mt-2 text-ink-700">
        {children ??
          `There is no ${thing.toLowerCase()} at this address, or it belongs to another shop. Check the link, or find it in the list.`}
      </p>
      <Link
        href={backHref}
        className="mt-6 inline-flex min-h-10 items-center rounded-md bg-copper-600 px-4 py-2 text-sm font-semibold text-white hover:bg-copper-700"
      >
        {backLabel}
      </Link>
    </section>
  );
}
