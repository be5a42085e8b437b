import type { Metadata } from "next";

import { PartForm } from "@/components/parts/part-form";
import { PageHeader } from "@/components/ui/status";
import { requirePageMember } from "@/lib/auth/member";

export const metadata: Metadata = { title: "Add part" };

export default async function NewPartPage() {
  await requirePageMember("parts:write");
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
      />
    </>
  );
}
