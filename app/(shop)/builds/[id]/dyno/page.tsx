import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";

import { DynoWorkbench } from "@/components/dyno/dyno-workbench";
import { TuneSession } from "@/components/dyno/tune-session";
import { PageHeader } from "@/components/ui/status";
import { buildStatusFacts, getBuild } from "@/db/queries/builds";
import { listDatalogs } from "@/db/queries/datalogs";
import { unitSystemOf } from "@/db/queries/preferences";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { readStoredInputs } from "@/lib/builds/stored-inputs";
import { canVerifyWithLog, STATUS_LABELS } from "@/lib/domain/builds";
import { idOrNotFound } from "@/lib/ids";
import { shopToday } from "@/lib/shop/shop-zone";

export const metadata: Metadata = { title: "Dyno verification" };

/**
 * Dyno work on one build: its tune session (pulls in order, overlaid, judged against the limits,
 * the next step predicted), and single logs: upload, map columns, measured against predicted,
 * mark verified.
 */
export default async function DynoPage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("datalogs:read");
  const id = idOrNotFound((await params).id);
  const row = await getBuild(m.shopId, id);
  if (!row) notFound();
  const [logs, facts, units] = await Promise.all([
    listDatalogs(m.shopId, id),
    shopToday(m.shopId).then((day) => buildStatusFacts(m.shopId, id, day)),
    unitSystemOf(m.user.id, m.shopId),
  ]);
  const status = row.build.status;
  return (
    <>
      <PageHeader title={`Dyno verification — ${row.build.title}`}>
        <div className="flex items-center gap-3">
          <span
            className="rounded-full bg-ink-800 px-3 py-1 text-sm font-semibold text-white"
            data-testid="build-status"
          >
            {STATUS_LABELS[row.build.status]}
          </span>
          <Link href={`/builds/${id}`} className="text-sm text-copper-700 underline">
            Back to the build
          </Link>
        </div>
      </PageHeader>
      <p className="mb-4 rounded-md border-l-4 border-caution-600 bg-caution-50 px-3 py-2 text-sm text-ink-800">
        Stop a pull at once if lambda goes lean or fuel pressure falls. Dyno work on fuel systems
        follows your local codes and licensed practice.
      </p>
      <TuneSession
        buildId={id}
        units={units}
        canWrite={can(m.role, "datalogs:upload")}
        canCopy={can(m.role, "builds:write")}
        canSetShopLimits={can(m.role, "settings:update")}
        targetMeasuredAt={readStoredInputs(row.build).target.measuredAt}
      />
      <h2 className="mb-3 text-lg font-semibold">Single logs and verification</h2>
      <DynoWorkbench
        buildId={id}
        canUpload={can(m.role, "datalogs:upload")}
        verifyRefusal={
          canVerifyWithLog(status, facts)
            ? null
            : `Mark verified is offered once the build is fitted; it is ${STATUS_LABELS[status].toLowerCase()}.`
        }
        units={units}
        logs={logs.map((l) => ({
          id: l.id,
          fileName: l.fileName,
          sizeBytes: l.sizeBytes,
          rowCount: l.rowCount,
          uploadedAt: l.uploadedAt.toISOString(),
          verifiedAt: l.verifiedAt?.toISOString() ?? null,
        }))}
      />
    </>
  );
}
