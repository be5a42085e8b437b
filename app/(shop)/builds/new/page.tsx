import type { Metadata } from "next";

import { PageHeader } from "@/components/ui/status";
import { listCustomers } from "@/db/queries/customers";
import { requirePageMember } from "@/lib/auth/member";

import { NewBuildForm } from "./new-build-form";

export const metadata: Metadata = { title: "New build" };

export default async function NewBuildPage({
  searchParams,
}: {
  searchParams: Promise<{ customer?: string }>;
}) {
  const m = await requirePageMember("builds:write");
  const { customer } = await searchParams;
  const customers = await listCustomers(m.shopId, { limit: 100 });
  return (
    <>
      <PageHeader title="New build sheet" />
      <section className="max-w-xl rounded-lg border border-ink-200 bg-white p-5">
        <NewBuildForm
          customers={customers.map((c) => ({ id: c.id, name: c.name }))}
          customerId={customer}
        />
      </section>
    </>
  );
}
