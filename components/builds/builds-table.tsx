"use client";

import Link from "next/link";
import { useState } from "react";
import useSWR from "swr";

import { SelectField } from "@/components/ui/field";
import { EmptyState, Signal } from "@/components/ui/status";
import { formatValue } from "@/lib/calc/quantities";
import { BUILD_STATUSES, STATUS_LABELS, type BuildStatus } from "@/lib/domain/builds";
import { fetcher } from "@/lib/fetcher";

interface Row {
  id: string;
  title: string;
  vehicle: string | null;
  status: BuildStatus;
  customerName: string;
  tunerName: string | null;
  updatedAt: string;
  dutyPct: number | null;
  marginPct: number | null;
}
interface Page {
  builds: Row[];
  nextCursor: string | null;
}

const dutyLevel = (d: number) => (d >= 90 ? "danger" : d > 80 ? "caution" : "ok");
/** A whole percentage through the registry (the same in both unit systems). */
const percent = (x: number) => formatValue("percent", x, "metric", 0);

/** The builds table: searched, filtered and paged through GET /api/v1/builds. */
export function BuildsTable({
  tuners,
  pageSize = 25,
  initialStatus,
}: {
  tuners: { id: string; name: string }[];
  pageSize?: number;
  /** The status filter the page was opened with (`/builds?status=needs_sizing`). */
  initialStatus?: BuildStatus;
}) {
  const [q, setQ] = useState("");
  const [status, setStatus] = useState<"" | BuildStatus>(initialStatus ?? "");
  const [tuner, setTuner] = useState("");
  const [sort, setSort] = useState<"updated" | "created" | "title">("updated");
  const [cursors, setCursors] = useState<string[]>([]);
  const cursor = cursors[cursors.length - 1];
  const params = new URLSearchParams({
    limit: String(pageSize),
    sort,
    ...(q ? { q } : {}),
    ...(status ? { status } : {}),
    ...(tuner ? { tuner } : {}),
    ...(cursor ? { cursor } : {}),
  });
  const filtered = Boolean(q || status || tuner);
  const { data, error, isLoading } = useSWR<Page>(`/api/v1/builds?${params}`, fetcher, {
    keepPreviousData: true,
  });

  return (
    <div>
      <div className="mb-4 flex flex-wrap gap-3" role="search">
        <label className="sr-only" htmlFor="bq">
          Search builds
        </label>
        <input
          id="bq"
          type="search"
          value={q}
          onChange={(e) => (setQ(e.target.value), setCursors([]))}
          placeholder="Customer, vehicle or title"
          className="rounded-md border border-ink-300 px-3 py-2"
        />
        <SelectField
          bare
          label="Status"
          id="bs"
          value={status}
          onChange={(e) => (setStatus(e.target.value as BuildStatus | ""), setCursors([]))}
        >
          <option value="">Any status</option>
          {BUILD_STATUSES.map((s) => (
            <option key={s} value={s}>
              {STATUS_LABELS[s]}
            </option>
          ))}
        </SelectField>
        <SelectField
          bare
          label="Tuner"
          id="bt"
          value={tuner}
          onChange={(e) => (setTuner(e.target.value), setCursors([]))}
        >
          <option value="">Any tuner</option>
          {tuners.map((t) => (
            <option key={t.id} value={t.id}>
              {t.name}
            </option>
          ))}
        </SelectField>
        <SelectField
          bare
          label="Sort"
          id="bo"
          value={sort}
          onChange={(e) => (setSort(e.target.value as typeof sort), setCursors([]))}
        >
          <option value="updated">Recently changed</option>
          <option value="created">Newest</option>
          <option value="title">Title A–Z</option>
        </SelectField>
        <span aria-live="polite" className="self-center text-sm text-ink-600">
          {isLoading ? "Loading…" : error ? `✕ ${error.message}` : ""}
        </span>
      </div>
      {data && data.builds.length === 0 ? (
        <EmptyState title={filtered ? "No build matches" : "No build sheets yet"}>
          {filtered ? "Try another search or filter." : "Start one with “New build”."}
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-ink-200 bg-white">
          <table className="table-cards w-full text-left text-sm">
            <thead className="bg-ink-100 text-ink-700">
              <tr>
                <th scope="col" className="px-4 py-2">
                  Build
                </th>
                <th scope="col" className="px-4 py-2">
                  Customer
                </th>
                <th scope="col" className="px-4 py-2">
                  Tuner
                </th>
                <th scope="col" className="px-4 py-2">
                  Status
                </th>
                <th scope="col" className="px-4 py-2 text-right">
                  Duty
                </th>
                <th scope="col" className="px-4 py-2 text-right">
                  Pump margin
                </th>
              </tr>
            </thead>
            <tbody>
              {(data?.builds ?? []).map((b) => (
                <tr key={b.id} className="border-t border-ink-100">
                  <td className="min-w-32 px-4 py-2 [overflow-wrap:anywhere]">
                    <Link
                      href={`/builds/${b.id}`}
                      className="font-medium text-copper-700 underline"
                    >
                      {b.title}
                    </Link>
                    {b.vehicle ? <p className="text-xs text-ink-600">{b.vehicle}</p> : null}
                  </td>
                  <td className="px-4 py-2 [overflow-wrap:anywhere]" data-label="Customer">
                    {b.customerName}
                  </td>
                  <td className="px-4 py-2" data-label="Tuner">
                    {b.tunerName ?? "—"}
                  </td>
                  <td className="px-4 py-2" data-label="Status" data-testid="build-status">
                    {STATUS_LABELS[b.status]}
                  </td>
                  <td className="px-4 py-2 text-right" data-label="Duty" data-testid="build-duty">
                    {/* A build waiting for its sizing has no figures anyone checked yet. */}
                    {b.dutyPct === null || b.status === "needs_sizing" ? (
                      "—"
                    ) : (
                      <Signal level={dutyLevel(b.dutyPct)}>{percent(b.dutyPct)}</Signal>
                    )}
                  </td>
                  <td
                    className="px-4 py-2 text-right"
                    data-label="Pump margin"
                    data-testid="build-margin"
                  >
                    {b.marginPct === null || b.status === "needs_sizing" ? (
                      "—"
                    ) : (
                      <Signal
                        level={b.marginPct < 0 ? "danger" : b.marginPct < 25 ? "caution" : "ok"}
                      >
                        {percent(b.marginPct)}
                      </Signal>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <div className="mt-3 flex items-center gap-2" aria-label="Pages">
        <button
          type="button"
          disabled={cursors.length === 0}
          onClick={() => setCursors((c) => c.slice(0, -1))}
          className="rounded-md border border-ink-300 bg-white px-3 py-1.5 text-sm disabled:opacity-40"
        >
          ← Previous
        </button>
        <button
          type="button"
          disabled={!data?.nextCursor}
          onClick={() => data?.nextCursor && setCursors((c) => [...c, data.nextCursor!])}
          className="rounded-md border border-ink-300 bg-white px-3 py-1.5 text-sm disabled:opacity-40"
        >
          Next →
        </button>
        <span className="text-sm text-ink-600">Page {cursors.length + 1}</span>
      </div>
    </div>
  );
}
