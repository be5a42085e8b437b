import type { QuoteDiff } from "@/lib/quotes/quote-diff";

/**
 * On a later revision: what changed since the revision the customer saw — lines added, removed
 * and changed, and the totals, before → after.
 */
export function RevisionChanges({ diff, since }: { diff: QuoteDiff; since: string }) {
  return (
    <section
      aria-labelledby="q-changes"
      className="mb-4 rounded-lg border border-ink-200 bg-white p-4"
      data-testid="revision-changes"
    >
      <h2 id="q-changes" className="text-lg font-semibold">
        Changes since {since}
      </h2>
      <p className="text-sm text-ink-600">
        What the customer saw in {since}, and what this revision says.
      </p>
      {diff.same ? (
        <p className="mt-2 text-sm text-ink-700">
          No change to the lines or totals yet: edit the lines below.
        </p>
      ) : (
        <ul className="mt-2 space-y-1 text-sm">
          {diff.added.map((l, i) => (
            <li key={`a${i}`}>
              <span className="font-semibold text-ok-700">+ Added</span> {l.description}
              {l.sku ? ` (${l.sku})` : ""}:{" "}
              <span className="figure">
                {l.quantity} × {l.unitPrice}
                {l.discountRate ? `, discount ${l.discount}` : ""} = {l.lineTotal}
              </span>
            </li>
          ))}
          {diff.removed.map((l, i) => (
            <li key={`r${i}`}>
              <span className="font-semibold text-danger-700">− Removed</span> {l.description}
              {l.sku ? ` (${l.sku})` : ""}:{" "}
              <span className="figure line-through">{l.lineTotal}</span>
            </li>
          ))}
          {diff.changed.map((c, i) => (
            <li key={`c${i}`}>
              <span className="font-semibold text-caution-700">~ Changed</span> {c.description}
              {c.sku ? ` (${c.sku})` : ""}:{" "}
              {c.changes.map((f, k) => (
                <span key={f.field} className="figure">
                  {k ? "; " : ""}
                  {f.field.toLowerCase()} {f.before} → {f.after}
                </span>
              ))}
            </li>
          ))}
          {diff.totals.map((t) => (
            <li key={t.label} className="font-medium">
              {t.label}:{" "}
              <span className="figure">
                {t.before} → {t.after}
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
