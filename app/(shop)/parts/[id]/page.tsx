import type { Metadata } from "next";
import { notFound } from "next/navigation";

import { PartForm } from "@/components/parts/part-form";
import { PageHeader } from "@/components/ui/status";
import { getPart } from "@/db/queries/parts";
import { unitSystemOf } from "@/db/queries/preferences";
import { requirePageMember } from "@/lib/auth/member";
import { idOrNotFound } from "@/lib/ids";
import { flatOf } from "@/lib/validations/parts";

export const metadata: Metadata = { title: "Part" };

export default async function PartPage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("parts:write");
  const id = idOrNotFound((await params).id);
  const [p, units] = await Promise.all([getPart(m.shopId, id), unitSystemOf(m.user.id, m.shopId)]);
  if (!p) notFound();
  return (
    <>
      <PageHeader title={`${p.sku} — ${p.name}`} />
      <p className="mb-3 text-sm text-ink-700">
        {p.reserved} held by accepted quotes; {p.stock - p.reserved} free.
      </p>
      <PartForm id={p.id} version={p.version} initial={flatOf(p)} canDelete units={units} />
    </>
  );
}
