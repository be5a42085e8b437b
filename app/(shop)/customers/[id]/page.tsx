import { notFound } from "next/navigation";
import { PageHeader } from "@/components/ui/status";
import { getCustomer } from "@/db/queries/customers";
import { requirePageMember } from "@/lib/auth/member";
import { CustomerForm } from "../customer-form";
import { DeleteCustomer } from "./delete-customer";

export default async function CustomerPage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("customers:read");
  const { id } = await params;
  const c = /^[0-9a-f-]{36}$/i.test(id) ? await getCustomer(m.shopId, id) : null;
  if (!c) notFound();
  return (
    <>
      <PageHeader title={c.name}>
        <DeleteCustomer id={c.id} name={c.name} />
      </PageHeader>
      <section className="max-w-xl rounded-lg border border-ink-200 bg-white p-5">
        <h2 className="mb-4 text-xl font-semibold">Details</h2>
        <CustomerForm customer={c} />
      </section>
    </>
  );
}
