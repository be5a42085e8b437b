import type { Metadata } from "next";
import Link from "next/link";

import { BuildsTable } from "@/components/builds/builds-table";
import { PageHeader } from "@/components/ui/status";
import { listTuners } from "@/db/queries/builds";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "Builds" };

export default async function BuildsPage({
  searchParams,
}: {
  searchParams: Promise<{ per?: string }>;
}) {
  const m = await requirePageMember("builds:read");
  const per = Number((await searchParams).per);
  const pageSize = Number.isInteger(per) && per >= 1 && per <= 100 ? per : 25;
  return (
    <>
      <PageHeader title="Builds">
        {can(m.role, "builds:write") ? (
          <Link
            href="/builds/new"
            className="rounded-md bg-copper-600 px-4 py-2 text-sm font-semibold text-white hover:bg-copper-700"
          >
            New build
          </Link>
        ) : null}
      </PageHeader>
      <BuildsTable tuners={await listTuners(m.shopId)} pageSize={pageSize} />
    </>
  );
}
