import type { Metadata } from "next";
import Link from "next/link";

import { EmptyState, PageHeader } from "@/components/ui/status";
import { listCustomers } from "@/db/queries/customers";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { customerFormContext } from "@/lib/customers/form-context";
import { formatPhone } from "@/lib/format/phone";
import { CustomerListQuery } from "@/lib/validations/customers";

import { CustomerForm } from "./customer-form";

export const metadata: Metadata = { title: "Customers" };

export default async function CustomersPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | undefined>>;
}) {
  const m = await requirePageMember("customers:read");
  const parsed = CustomerListQuery.safeParse(await searchParams);
  const q = parsed.success ? parsed.data.q : undefined;
  const [rows, context] = await Promise.all([
    listCustomers(m.shopId, { q, limit: 100 }),
    customerFormContext(m.shopId),
  ]);
  return (
    <>
      <PageHeader title="Customers">
        <form role="search" className="flex w-full gap-2 sm:w-auto" action="/customers">
          <label htmlFor="q" className="sr-only">
            Search customers
          </label>
          <input
            id="q"
            name="q"
            type="search"
            defaultValue={q}
            placeholder="Name, e-mail, phone or vehicle"
            className="min-w-0 flex-1 rounded-md border border-ink-300 px-3 py-2"
          />
          <button className="rounded-md border border-ink-300 bg-white px-3 py-2 text-sm font-semibold">
            Search
          </button>
        </form>
      </PageHeader>
      <div className="grid gap-8 lg:grid-cols-[1fr_22rem]">
        <section aria-label="Customer list">
          {rows.length === 0 ? (
            <EmptyState title={q ? `No customer matches “${q}”` : "No customers yet"}>
              {q ? "Try another search." : "Add the first one with the form."}
            </EmptyState>
          ) : (
            <div className="overflow-x-auto rounded-lg border border-ink-200 bg-white">
              <table className="w-full text-left text-sm">
                <thead className="bg-ink-100 text-ink-700">
                  <tr>
                    <th scope="col" className="px-4 py-2">
                      Name
                    </th>
                    <th scope="col" className="hidden px-4 py-2 sm:table-cell">
                      E-mail
                    </th>
                    <th scope="col" className="px-4 py-2">
                      Phone
                    </th>
                    <th scope="col" className="hidden px-4 py-2 md:table-cell">
                      Vehicles
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {rows.map((c) => (
                    <tr key={c.id} className="border-t border-ink-100">
                      <td className="px-4 py-2 [overflow-wrap:anywhere]">
                        <Link
                          className="font-medium text-copper-700 underline"
                          href={`/customers/${c.id}`}
                        >
                          {c.name}
                        </Link>
                        {/* On a phone the secondary columns are hidden: their text sits here. */}
                        <span className="block text-xs text-ink-600 sm:hidden">
                          {c.email ?? "No e-mail"}
                        </span>
                        {vehicles(c) ? (
                          <span className="block text-xs [overflow-wrap:anywhere] text-ink-600 md:hidden">
                            {vehicles(c)}
                          </span>
                        ) : null}
                      </td>
                      <td className="hidden px-4 py-2 [overflow-wrap:anywhere] sm:table-cell">
                        {c.email ?? "—"}
                      </td>
                      <td className="px-4 py-2 whitespace-nowrap" data-testid="customer-phone">
                        {formatPhone(c.phone, context.shopCountry) || "—"}
                      </td>
                      <td className="hidden px-4 py-2 [overflow-wrap:anywhere] md:table-cell">
                        {vehicles(c) || "—"}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </section>
        {can(m.role, "customers:write") ? (
          <section
            aria-labelledby="add-customer"
            className="rounded-lg border border-ink-200 bg-white p-5"
          >
            <h2 id="add-customer" className="mb-4 text-xl font-semibold">
              Add a customer
            </h2>
            <CustomerForm context={context} />
          </section>
        ) : null}
      </div>
    </>
  );
}

/** A customer's vehicles in one line: "2004 Subaru Impreza; 1999 Mazda MX-5" ("" for none). */
function vehicles(c: { vehicles: { year: number | null; make: string; model: string }[] }) {
  return c.vehicles.map((v) => [v.year, v.make, v.model].filter(Boolean).join(" ")).join("; ");
}
