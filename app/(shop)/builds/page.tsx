import type { Metadata } from "next";
import Link from "next/link";

import { BuildsTable } from "@/components/builds/builds-table";
import { LocalTime } from "@/components/ui/local-time";
import { PageHeader } from "@/components/ui/status";
import { listTuners, needsSizingQueue } from "@/db/queries/builds";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { BUILD_STATUSES, type BuildStatus } from "@/lib/domain/builds";

export const metadata: Metadata = { title: "Builds" };

const tab = (on: boolean) =>
  `rounded-t-md border-b-2 px-3 py-2 text-sm font-semibold ${on ? "border-copper-600 text-ink-900" : "border-transparent text-ink-600 hover:text-ink-900"}`;

export default async function BuildsPage({
  searchParams,
}: {
  searchParams: Promise<{ per?: string; status?: string }>;
}) {
  const m = await requirePageMember("builds:read");
  const sp = await searchParams;
  const per = Number(sp.per);
  const pageSize = Number.isInteger(per) && per >= 1 && per <= 100 ? per : 25;
  const status = BUILD_STATUSES.includes(sp.status as BuildStatus)
    ? (sp.status as BuildStatus)
    : undefined;
  const [tuners, queue] = await Promise.all([listTuners(m.shopId), needsSizingQueue(m.shopId, 5)]);
  const sizes = can(m.role, "builds:write");
  return (
    <>
      <PageHeader title="Builds">
        {can(m.role, "builds:draft") ? (
          <Link
            href="/builds/new"
            className="rounded-md bg-copper-600 px-4 py-2 text-sm font-semibold text-white hover:bg-copper-700"
          >
            New build
          </Link>
        ) : null}
      </PageHeader>
      {sizes && queue.total > 0 && status !== "needs_sizing" ? (
        <section
          aria-labelledby="sizing-queue"
          className="mb-6 rounded-lg border border-caution-600 bg-caution-50 p-4"
        >
          <h2 id="sizing-queue" className="font-semibold text-ink-900">
            ▲ {queue.total} {queue.total === 1 ? "build needs" : "builds need"} sizing
          </h2>
          <ul className="mt-2 space-y-1 text-sm">
            {queue.builds.map((b) => (
              <li key={b.id}>
                <Link href={`/builds/${b.id}`} className="text-copper-700 underline">
                  {b.title}
                </Link>{" "}
                <span className="text-ink-600">
                  · {b.customerName}
                  {b.createdByName ? ` · taken by ${b.createdByName}` : ""} ·{" "}
                  <LocalTime value={b.createdAt} />
                </span>
              </li>
            ))}
          </ul>
          {queue.total > queue.builds.length ? (
            <Link
              href="/builds?status=needs_sizing"
              className="mt-2 inline-block text-sm font-semibold text-copper-700 underline"
            >
              All {queue.total} in the queue
            </Link>
          ) : null}
        </section>
      ) : null}
      <nav aria-label="Build views" className="mb-4 flex gap-1 border-b border-ink-200">
        <Link
          href="/builds"
          className={tab(status !== "needs_sizing")}
          aria-current={status !== "needs_sizing" ? "page" : undefined}
        >
          All builds
        </Link>
        <Link
          href="/builds?status=needs_sizing"
          className={tab(status === "needs_sizing")}
          aria-current={status === "needs_sizing" ? "page" : undefined}
        >
          Needs sizing ({queue.total})
        </Link>
      </nav>
      <BuildsTable
        key={status ?? "all"}
        tuners={tuners}
        pageSize={pageSize}
        initialStatus={status}
      />
    </>
  );
}
