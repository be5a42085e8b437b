"use client";

import { ErrorNotice } from "@/components/ui/error-notice";

/** Errors of a route group's own layout (its session check, say): the notice without the frame. */
export default function RootError({ error, retry }: { error: unknown; retry: () => void }) {
  return (
    <main id="main" tabIndex={-1} className="px-4 py-10 focus:outline-none">
      <ErrorNotice error={error} retry={retry} />
    </main>
  );
}
