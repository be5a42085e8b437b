"use client";

import Link from "next/link";
import useSWR from "swr";

import { SelectField } from "@/components/ui/field";
import { EmptyState } from "@/components/ui/status";
import { useUrlFilters } from "@/components/ui/url-filters";
import type { Part } from "@/db/schema/catalog";
import type { UnitSystem } from "@/lib/calc";
import { specSummary } from "@/lib/catalog/labels";
import { formatMoney } from "@/lib/catalog/money";
import { CATEGORY_LABELS, PART_CATEGORIES } from "@/lib/domain/parts";
import { fetcher } from "@/lib/fetcher";

import { StockBadge } from "./stock-badge";

/** The catalog table, searched, filtered and sorted through GET /api/v1/parts. */
export function PartsTable({
  currency,
  canEdit,
  units = "metric",
}: {
  currency: string;
  canEdit: boolean;
  /** The person's unit system: the parts' figures are shown in it. */
  units?: UnitSystem;
}) {
  // Kept in the URL (?q=&category=&sort=): a filtered catalog reloads, bookmarks and shares.
  const { values, set } = useUrlFilters({ q: "", category: "", sort: "name" });
  const { q, category, sort } = values;
  const params = new URLSearchParams({
    sort,
    ...(q ? { q } : {}),
    ...(category ? { category } : {}),
  });
  const { data, error, isLoading } = useSWR<{ parts: Part[] }>(`/api/v1/parts?${params}`, fetcher, {
    keepPreviousData: true,
  });
  const filtered = Boolean(q || category);
  return (
    <div>
      <div className="mb-4 flex flex-wrap gap-3" role="search">
        <label className="sr-only" htmlFor="pq">
          Search parts
        </label>
        <input
          id="pq"
          type="search"
          value={q}
          onChange={(e) => set("q", e.target.value, true)}
          placeholder="SKU, name or brand"
          className="rounded-md border border-ink-300 px-3 py-2"
        />
        <SelectField
          bare
          label="Category"
          id="pc"
          value={category}
          onChange={(e) => set("category", e.target.value)}
        >
          <option value="">All categories</option>
          {PART_CATEGORIES.map((c) => (
            <option key={c} value={c}>
              {CATEGORY_LABELS[c]}
            </option>
          ))}
        </SelectField>
        <SelectField
          bare
          label="Sort"
          id="ps"
          value={sort}
          onChange={(e) => set("sort", e.target.value)}
        >
          <option value="name">Name</option>
          <option value="sku">SKU</option>
          <option value="price">Price, lowest first</option>
          <option value="stock">Free stock, lowest first</option>
        </SelectField>
        <span aria-live="polite" className="self-center text-sm text-ink-600">
          {isLoading
            ? "Loading…"
            : error
              ? `✕ ${error.message}`
              : data
                ? `${data.parts.length} part${data.parts.length === 1 ? "" : "s"}`
                : ""}
        </span>
      </div>
      {data && data.parts.length === 0 ? (
        <EmptyState title={filtered ? "No part matches" : "The catalog is empty"}>
          {filtered
            ? "Try another search or category."
            : canEdit
              ? "Add parts one by one or import a CSV."
              : "Counter staff add parts here."}
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-ink-200 bg-white">
          <table className="table-cards w-full text-left text-sm">
            <thead className="bg-ink-100 text-ink-700">
              <tr>
                <th scope="col" className="px-4 py-2">
                  SKU
                </th>
                <th scope="col" className="px-4 py-2">
                  Part
                </th>
                <th scope="col" className="px-4 py-2">
                  Category
                </th>
                <th scope="col" className="px-4 py-2">
                  Key figures
                </th>
                <th scope="col" className="px-4 py-2 text-right">
                  Price
                </th>
                <th scope="col" className="px-4 py-2 text-right">
                  Stock
                </th>
              </tr>
            </thead>
            <tbody>
              {(data?.parts ?? []).map((p) => (
                <tr key={p.id} className="border-t border-ink-100">
                  <td className="figure px-4 py-2 [overflow-wrap:anywhere]" data-label="SKU">
                    {canEdit ? (
                      <Link href={`/parts/${p.id}`} className="text-copper-700 underline">
                        {p.sku}
                      </Link>
                    ) : (
                      p.sku
                    )}
                  </td>
                  <td className="min-w-32 px-4 py-2 font-medium [overflow-wrap:anywhere] sm:font-normal">
                    {p.name}
                    <p className="text-xs font-normal text-ink-600">{p.brand}</p>
                  </td>
                  <td className="px-4 py-2" data-label="Category">
                    {CATEGORY_LABELS[p.category]}
                  </td>
                  <td className="px-4 py-2 text-ink-700" data-label="Key figures">
                    {specSummary(p.category, p.specs as Record<string, unknown>, units)}
                  </td>
                  <td
                    className="figure px-4 py-2 text-right"
                    data-label="Price"
                    data-testid="part-price"
                  >
                    {formatMoney(p.priceMinor, currency)}
                  </td>
                  <td className="px-4 py-2 text-right" data-label="Stock" data-testid="part-stock">
                    <StockBadge
                      stock={p.stock}
                      reserved={p.reserved}
                      reorderLevel={p.reorderLevel}
                    />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
