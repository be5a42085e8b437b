import Link from "next/link";
import { notFound } from "next/navigation";

import { ResultsPanel } from "@/components/builds/results-panel";
import { SizingSettingsNote } from "@/components/builds/sizing-settings-note";
import { LocalTime } from "@/components/ui/local-time";
import { PageHeader } from "@/components/ui/status";
import { getBuild, getRevision } from "@/db/queries/builds";
import { unitSystemOf } from "@/db/queries/preferences";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { diffInputs } from "@/lib/builds/diff";
import { readStoredInputs, storedEffectiveInputs } from "@/lib/builds/stored-inputs";
import type { FuelSystemResult } from "@/lib/calc";
import { STATUS_LABELS } from "@/lib/domain/builds";
import { idOrNotFound } from "@/lib/ids";
import { versionParam } from "@/lib/validations/column-bounds";

import { RestoreButton } from "./restore-button";

export default async function RevisionPage({
  params,
}: {
  params: Promise<{ id: string; version: string }>;
}) {
  const m = await requirePageMember("builds:read");
  const { id: rawId, version } = await params;
  const id = idOrNotFound(rawId);
  const parsed = versionParam().safeParse(version);
  if (!parsed.success) notFound();
  const v = parsed.data;
  const [row, rev] = await Promise.all([getBuild(m.shopId, id), getRevision(m.shopId, id, v)]);
  if (!row || !rev) notFound();
  const latest = row.build.version === v;
  const units = await unitSystemOf(m.user.id, m.shopId);
  return (
    <>
      <PageHeader title={`${row.build.title} — version ${v}`}>
        <div className="flex items-center gap-3">
          <Link href={`/builds/${id}`} className="text-sm text-copper-700 underline">
            Back to the build
          </Link>
          <a
            href={`/api/v1/builds/${id}/spec-sheet?version=${v}`}
            className="text-sm text-copper-700 underline"
          >
            Spec sheet of version {v} (PDF)
          </a>
          {v > 1 ? (
            <Link
              href={`/builds/${id}/compare?from=${v - 1}&to=${v}`}
              className="text-sm text-copper-700 underline"
            >
              Compare with version {v - 1}
            </Link>
          ) : null}
          {!latest && can(m.role, "builds:write") ? (
            <RestoreButton buildId={id} version={v} currentVersion={row.build.version} />
          ) : null}
        </div>
      </PageHeader>
      <p className="mb-4 text-sm text-ink-700">
        Read-only. {STATUS_LABELS[rev.status]}, saved <LocalTime value={rev.createdAt} />
        {rev.note ? ` — ${rev.note}` : ""}. Figures as computed then (library{" "}
        {rev.calcVersion ?? "?"}).
      </p>
      <div className="grid gap-6 lg:grid-cols-2">
        <section className="rounded-lg border border-ink-200 bg-white p-5">
          <h2 className="text-lg font-semibold">Inputs</h2>
          <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
            {diffInputs({}, readStoredInputs(rev), units).map((c) => (
              <div key={c.path} className="contents">
                <dt className="text-ink-600">{c.label}</dt>
                <dd className="figure">{c.after}</dd>
              </div>
            ))}
          </dl>
        </section>
        <div>
          <ResultsPanel result={rev.result} units={units} />
          {rev.result ? (
            <SizingSettingsNote
              input={storedEffectiveInputs(rev)}
              result={rev.result}
              units={units}
            />
          ) : null}
        </div>
      </div>
    </>
  );
}
