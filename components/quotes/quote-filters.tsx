"use client";

import { SelectField } from "@/components/ui/field";
import { useUrlFilters } from "@/components/ui/url-filters";
import {
  QUOTE_SORT_LABELS,
  QUOTE_SORTS,
  QUOTE_STATUS_LABELS,
  QUOTE_STATUSES,
} from "@/lib/domain/quotes";

const DEFAULTS = { q: "", status: "", sort: "newest" };

/**
 * The quotes list's search, status filter and sort, kept in the URL (`?q=&status=&sort=`); the
 * page reads them from its searchParams. Without scripts the form submits them the same way.
 */
export function QuoteFilters({ count }: { count: number }) {
  const { values, set } = useUrlFilters(DEFAULTS);
  return (
    <form
      role="search"
      method="get"
      action="/quotes"
      className="mb-4 flex flex-wrap items-center gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        set("q", values.q);
      }}
    >
      <label className="sr-only" htmlFor="qq">
        Search quotes
      </label>
      <input
        id="qq"
        name="q"
        type="search"
        value={values.q}
        onChange={(e) => set("q", e.target.value, true)}
        placeholder="Number, customer or vehicle"
        className="w-full rounded-md border border-ink-300 px-3 py-2 sm:w-72"
      />
      <SelectField
        bare
        label="Status"
        id="qs"
        name="status"
        value={values.status}
        onChange={(e) => set("status", e.target.value)}
      >
        <option value="">All statuses</option>
        {QUOTE_STATUSES.map((s) => (
          <option key={s} value={s}>
            {QUOTE_STATUS_LABELS[s]}
          </option>
        ))}
      </SelectField>
      <SelectField
        bare
        label="Sort"
        id="qo"
        name="sort"
        value={values.sort}
        onChange={(e) => set("sort", e.target.value)}
      >
        {QUOTE_SORTS.map((s) => (
          <option key={s} value={s}>
            {QUOTE_SORT_LABELS[s]}
          </option>
        ))}
      </SelectField>
      <noscript>
        <button type="submit" className="rounded-md border border-ink-300 px-3 py-2 text-sm">
          Apply
        </button>
      </noscript>
      <span aria-live="polite" className="text-sm text-ink-600" data-testid="quote-count">
        {count} quote{count === 1 ? "" : "s"}
      </span>
    </form>
  );
}
