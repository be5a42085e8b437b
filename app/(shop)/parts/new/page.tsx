import type { Metadata } from "next";

import { PartForm } from "@/components/parts/part-form";
import { PageHeader } from "@/components/ui/status";
import { unitSystemOf } from "@/db/queries/preferences";
import { requirePageMember } from "@/lib/auth/member";

export const metadata: Metadata = { title: "Add part" };

export default async function NewPartPage() {
  const m = await requirePageMember("parts:write");
  const units = await unitSystemOf(m.user.id, m.shopId);
  return (
    <>
      <PageHeader title="Add part" />
      <PartForm
        initial={{
          category: "injector",
          stock: "0",
          reorder_level: "0",
          ethanol_ok: "yes",
          rated_kpa: "300",
        }}
        canDelete={false}
        units={units}
      />
    </>
  );
}
