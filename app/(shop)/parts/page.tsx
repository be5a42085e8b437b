import type { Metadata } from "next";
import Link from "next/link";
import { Suspense } from "react";

import { PartsTable } from "@/components/parts/parts-table";
import { PageHeader } from "@/components/ui/status";
import { unitSystemOf } from "@/db/queries/preferences";
import { getShopSettings } from "@/db/queries/shops";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "Parts" };

const link =
  "rounded-md border border-ink-300 bg-white px-4 py-2 text-sm font-semibold text-ink-800 hover:bg-ink-100";

export default async function PartsPage() {
  const m = await requirePageMember("parts:read");
  const [s, units] = await Promise.all([
    getShopSettings(m.shopId),
    unitSystemOf(m.user.id, m.shopId),
  ]);
  const canEdit = can(m.role, "parts:write");
  return (
    <>
      <PageHeader title="Parts">
        <div className="flex flex-wrap gap-2">
          <a href="/api/v1/parts/export" className={link} download>
            Export CSV
          </a>
          {canEdit ? (
            <Link href="/parts/import" className={link}>
              Import CSV
            </Link>
          ) : null}
          {canEdit ? (
            <Link
              href="/parts/new"
              className="rounded-md bg-copper-600 px-4 py-2 text-sm font-semibold text-white hover:bg-copper-700"
            >
              Add part
            </Link>
          ) : null}
        </div>
      </PageHeader>
      <Suspense>
        <PartsTable currency={s?.settings.currency ?? "USD"} canEdit={canEdit} units={units} />
      </Suspense>
    </>
  );
}
