import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";

import { BuildEditor } from "@/components/builds/build-editor";
import { CopyBuildButton } from "@/components/builds/copy-build-button";
import { ShareLinks } from "@/components/builds/share-links";
import { SafetyNote } from "@/components/tools/safety-note";
import { LocalTime } from "@/components/ui/local-time";
import { buildStatusFacts, getBuild, listRevisions } from "@/db/queries/builds";
import { unitSystemOf } from "@/db/queries/preferences";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { settingsChangesOf } from "@/lib/builds/settings-changes";
import { readStoredInputs } from "@/lib/builds/stored-inputs";
import type { FuelSystemInput } from "@/lib/calc";
import { STATUS_LABELS } from "@/lib/domain/builds";
import { shopBsfc } from "@/lib/dyno/log-analysis";
import { idOrNotFound } from "@/lib/ids";
import { shopToday } from "@/lib/shop/shop-zone";
import { shopSizingSettings } from "@/lib/sizing/shop-sizing";

export const metadata: Metadata = { title: "Build sheet" };

export default async function BuildPage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("builds:read");
  const id = idOrNotFound((await params).id);
  const row = await getBuild(m.shopId, id);
  if (!row) notFound();
  const [revisions, bsfcRows, statusFacts, today, units] = await Promise.all([
    listRevisions(m.shopId, id),
    shopBsfc(m.shopId),
    shopToday(m.shopId).then((day) => buildStatusFacts(m.shopId, id, day)),
    shopSizingSettings(m.shopId),
    unitSystemOf(m.user.id, m.shopId),
  ]);
  const b = row.build;
  // "Copy as next power step": the build this one continues (same shop; gone: no link).
  const previous = b.previousStepId ? await getBuild(m.shopId, b.previousStepId) : null;
  const writes = can(m.role, "builds:write");
  const inputs = readStoredInputs(b);
  // What today's settings would change in what is sized (nothing: the build is up to date).
  const settingsChanges = settingsChangesOf(b, today, units);
  return (
    <>
      <div className="mb-4 flex flex-wrap items-end justify-between gap-3">
        <div className="min-w-0">
          {/* The page's one h1; the build's title is the first field of the sheet below. */}
          <h1 className="text-2xl font-bold text-ink-900">
            Build sheet<span className="sr-only">: {b.title}</span>
          </h1>
          <p className="text-sm [overflow-wrap:anywhere] text-ink-600">
            <Link href={`/customers/${b.customerId}`} className="text-copper-700 underline">
              {row.customerName}
            </Link>
            {b.vehicle ? ` · ${b.vehicle}` : ""}
            {previous ? (
              <>
                {" · next power step from "}
                <Link
                  href={`/builds/${previous.build.id}/dyno`}
                  className="text-copper-700 underline"
                  data-testid="previous-step"
                >
                  {previous.build.title}
                </Link>
              </>
            ) : null}
          </p>
        </div>
        <div className="flex flex-wrap items-center gap-3 print:hidden">
          <a
            href={`/api/v1/builds/${b.id}/spec-sheet`}
            className="rounded-md border border-ink-300 bg-white px-4 py-2 text-sm font-semibold text-ink-800 hover:bg-ink-100"
          >
            Spec sheet (PDF)
          </a>
          <Link
            href={`/builds/${b.id}/dyno`}
            className="rounded-md border border-ink-300 bg-white px-4 py-2 text-sm font-semibold text-ink-800 hover:bg-ink-100"
          >
            Dyno and tune session
          </Link>
          <Link
            href={`/builds/${b.id}/kit`}
            className="rounded-md border border-ink-300 bg-white px-4 py-2 text-sm font-semibold text-ink-800 hover:bg-ink-100"
          >
            Parts kit{b.parts.length ? ` (${b.parts.length} chosen)` : ""}
          </Link>
          {writes ? <CopyBuildButton buildId={b.id} /> : null}
        </div>
      </div>
      {b.status === "needs_sizing" ? (
        <p
          role="status"
          data-testid="needs-sizing"
          className="mb-4 rounded-lg border border-caution-600 bg-caution-50 p-4 text-sm text-ink-800"
        >
          <strong>▲ Needs sizing.</strong> Taken from the caller&apos;s goal (engine, power goal,
          fuel); the rest are starting values.{" "}
          {writes
            ? "Size it and move its status to Sized to take it out of the queue."
            : "A tuner sizes it next; it waits in their queue."}
        </p>
      ) : null}
      <BuildEditor
        buildId={b.id}
        title={b.title}
        status={b.status}
        statusFacts={statusFacts}
        version={b.version}
        inputs={inputs}
        readOnly={!writes}
        readOnlyReason={
          writes
            ? undefined
            : {
                note: "The sizing fields below are the tuner's: you can read them here, and a tuner changes them. Parts (the kit), quotes and share links are yours.",
                label: "Tuner's · read-only",
              }
        }
        units={units}
        shopBsfc={bsfcRows}
        sizingSettings={today}
        settingsChanges={settingsChanges}
      />
      <section
        aria-labelledby="revs"
        className="mt-8 rounded-lg border border-ink-200 bg-white p-5 print:hidden"
      >
        <h2 id="revs" className="text-xl font-semibold">
          Revisions
        </h2>
        <ol className="mt-2 divide-y divide-ink-100 text-sm">
          {revisions.map((r) => (
            <li key={r.id} className="flex gap-4 py-2">
              <span className="figure w-12 font-semibold">v{r.version}</span>
              <span className="w-20">{STATUS_LABELS[r.status]}</span>
              <span className="figure w-44 text-ink-600">
                <LocalTime value={r.createdAt} />
              </span>
              <span className="flex-1">{r.note ?? ""}</span>
              <Link
                href={`/builds/${b.id}/revisions/${r.version}`}
                className="text-copper-700 underline"
                aria-label={`View version ${r.version}`}
              >
                View
              </Link>
              {r.version > 1 ? (
                <Link
                  href={`/builds/${b.id}/compare?from=${r.version - 1}&to=${r.version}`}
                  className="text-copper-700 underline"
                  aria-label={`Changes in version ${r.version} since version ${r.version - 1}`}
                >
                  Changes
                </Link>
              ) : (
                <span className="w-14" />
              )}
            </li>
          ))}
        </ol>
      </section>
      {can(m.role, "shares:manage") ? <ShareLinks buildId={b.id} /> : null}
      <SafetyNote />
    </>
  );
}
