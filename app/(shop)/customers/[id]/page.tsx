import Link from "next/link";
import { notFound } from "next/navigation";

import { PageHeader } from "@/components/ui/status";
import { listBuilds } from "@/db/queries/builds";
import { getCustomer } from "@/db/queries/customers";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { STATUS_LABELS } from "@/lib/domain/builds";
import { idOrNotFound } from "@/lib/ids";

import { CustomerForm } from "../customer-form";
import { DeleteCustomer } from "./delete-customer";
import { PortalAccess } from "./portal-access";

export default async function CustomerPage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("customers:read");
  const id = idOrNotFound((await params).id);
  const c = await getCustomer(m.shopId, id);
  if (!c) notFound();
  const { builds } = await listBuilds(m.shopId, { customerId: c.id, limit: 50 });
  return (
    <>
      <PageHeader title={c.name}>
        <div className="flex flex-wrap items-center gap-3">
          {can(m.role, "quotes:write") ? (
            <Link
              href={`/quotes/new?customer=${c.id}`}
              className="rounded-md bg-copper-600 px-4 py-2 text-sm font-semibold text-white hover:bg-copper-700"
            >
              New quote
            </Link>
          ) : null}
          <DeleteCustomer id={c.id} name={c.name} />
        </div>
      </PageHeader>
      <section className="max-w-xl rounded-lg border border-ink-200 bg-white p-5">
        <h2 className="mb-4 text-xl font-semibold">Details</h2>
        <CustomerForm customer={c} />
      </section>
      <section
        aria-labelledby="cust-portal"
        className="mt-6 max-w-xl rounded-lg border border-ink-200 bg-white p-5"
      >
        <h2 id="cust-portal" className="mb-2 text-xl font-semibold">
          Customer portal
        </h2>
        <PortalAccess id={c.id} hasSignIn={Boolean(c.userId)} email={c.email} />
      </section>
      <section
        aria-labelledby="cust-builds"
        className="mt-6 max-w-xl rounded-lg border border-ink-200 bg-white p-5"
      >
        <div className="flex items-center justify-between">
          <h2 id="cust-builds" className="text-xl font-semibold">
            Builds
          </h2>
          <Link
            href={`/builds/new?customer=${c.id}`}
            className="text-sm font-semibold text-copper-700 underline"
          >
            New build
          </Link>
        </div>
        {builds.length === 0 ? <p className="mt-2 text-sm text-ink-600">No builds yet.</p> : null}
        <ul className="mt-2 space-y-1">
          {builds.map((b) => (
            <li key={b.id}>
              <Link href={`/builds/${b.id}`} className="text-copper-700 underline">
                {b.title}
              </Link>{" "}
              <span className="text-sm text-ink-600">· {STATUS_LABELS[b.status]}</span>
            </li>
          ))}
        </ul>
      </section>
    </>
  );
}
