import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";

import { PageHeader } from "@/components/ui/status";
import { getJob } from "@/db/queries/jobs";
import { requirePageMember } from "@/lib/auth/member";
import { JOB_STATUS_LABELS, jobLabel } from "@/lib/domain/operations";
import { idOrNotFound } from "@/lib/ids";

export const metadata: Metadata = { title: "My job" };

/** A customer's own job: its parts as they arrive and are fitted, and its invoice once issued. */
export default async function MyJobPage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("portal:view");
  const id = idOrNotFound((await params).id);
  const j = await getJob(m.shopId, id, m.user.id);
  if (!j) notFound();
  return (
    <>
      <PageHeader title={`Job ${jobLabel(j.job.number)}`}>
        <Link href="/my" className="text-sm text-copper-700 underline">
          Back
        </Link>
      </PageHeader>
      <p className="mb-4 text-ink-800">
        {j.buildTitle ?? "Parts and labour"} · {JOB_STATUS_LABELS[j.job.status]}
      </p>
      <ul className="divide-y divide-ink-100 rounded-lg border border-ink-200 bg-white text-sm">
        {j.lines.length === 0 ? (
          <li className="px-4 py-2 text-ink-600">Labour only: no parts to wait for.</li>
        ) : (
          j.lines.map((l) => (
            <li key={l.id} className="flex flex-wrap justify-between gap-2 px-4 py-2">
              <span>{l.description}</span>
              <span className="figure text-ink-700">
                {l.fittedQty !== null
                  ? `${l.fittedQty} fitted`
                  : `${l.allocatedQty} of ${l.quantity} in`}
              </span>
            </li>
          ))
        )}
      </ul>
      {j.invoiceId && j.invoiceStatus && j.invoiceStatus !== "draft" ? (
        <p className="mt-4">
          <Link href={`/my/invoices/${j.invoiceId}`} className="text-copper-700 underline">
            Your invoice
          </Link>
        </p>
      ) : null}
    </>
  );
}
