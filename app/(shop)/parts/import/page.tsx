import type { Metadata } from "next";
import Link from "next/link";

import { CatalogImport } from "@/components/parts/catalog-import";
import { PageHeader } from "@/components/ui/status";
import { getShopSettings } from "@/db/queries/shops";
import { requirePageMember } from "@/lib/auth/member";

export const metadata: Metadata = { title: "Import parts" };

export default async function ImportPartsPage() {
  const m = await requirePageMember("parts:write");
  const s = await getShopSettings(m.shopId);
  return (
    <>
      <PageHeader title="Import parts">
        <Link href="/parts" className="text-sm text-copper-700 underline">
          Back to the catalog
        </Link>
      </PageHeader>
      <CatalogImport currency={s?.settings.currency ?? "USD"} />
    </>
  );
}
