"use client";

import { useEffect } from "react";

import { Button } from "./button";

/** The digest Next gives a server error: what the server log files it under. */
function referenceOf(error: unknown): string | null {
  if (typeof error !== "object" || error === null || !("digest" in error)) return null;
  return typeof error.digest === "string" && error.digest ? error.digest : null;
}

/**
 * The body of an error boundary. It never shows the error's message or stack (a server error's
 * text may hold data); the digest is the reference that finds it in the server log.
 */
export function ErrorNotice({
  error,
  retry,
  homeHref = "/",
  framed = true,
}: {
  error: unknown;
  retry: () => void;
  homeHref?: string;
  /** false inside a layout that already draws a card (the sign-in pages) */
  framed?: boolean;
}) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  const reference = referenceOf(error);
  return (
    <section
      role="alert"
      aria-labelledby="error-title"
      className={
        framed ? "mx-auto max-w-xl rounded-lg border border-danger-600/40 bg-white p-6 sm:p-8" : ""
      }
    >
      <h1 id="error-title" className="text-2xl font-bold text-ink-900">
        <span aria-hidden="true" className="text-danger-600">
          ■{" "}
        </span>
        Something went wrong
      </h1>
      <p className="mt-2 text-ink-700">
        This page could not be shown just now. Try again; if it keeps happening, tell us the
        reference below and what you were doing.
      </p>
      {reference ? (
        <p className="mt-3 text-sm text-ink-600">
          Reference:{" "}
          <code className="rounded bg-ink-100 px-1.5 py-0.5 text-ink-800">{reference}</code>
        </p>
      ) : null}
      <div className="mt-6 flex flex-wrap items-center gap-4">
        <Button type="button" onClick={() => retry()}>
          Try again
        </Button>
        {/* A plain link on purpose: a full load starts clean, and next/link would be one more
            copy of the router's link code in every page's error chunk. */}
        <a href={homeHref} className="text-sm font-medium text-copper-700 underline">
          Back to the start
        </a>
      </div>
    </section>
  );
}
