/** What a route shows while its page loads: a spinner with words for screen readers, grey bars. */
export function PageLoading({ label = "Loading the page" }: { label?: string }) {
  return (
    <div role="status" aria-label={label} aria-live="polite" className="py-2">
      <div className="flex items-center gap-3 text-sm text-ink-600">
        <span
          aria-hidden="true"
          className="size-5 rounded-full border-2 border-ink-200 border-t-copper-600 motion-safe:animate-spin"
        />
        <span>{label}…</span>
      </div>
      <div aria-hidden="true" className="mt-6 space-y-3 motion-safe:animate-pulse">
        <div className="h-8 w-2/3 max-w-md rounded bg-ink-200" />
        <div className="h-4 w-full max-w-2xl rounded bg-ink-100" />
        <div className="h-4 w-5/6 max-w-xl rounded bg-ink-100" />
        <div className="mt-6 h-40 w-full rounded-lg bg-ink-100" />
      </div>
    </div>
  );
}
