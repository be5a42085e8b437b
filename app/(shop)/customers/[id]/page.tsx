import Link from "next/link";
import { notFound } from "next/navigation";

import { LocalTime } from "@/components/ui/local-time";
import { PageHeader } from "@/components/ui/status";
import { listBuilds } from "@/db/queries/builds";
import { customerPayments, customerQuotes, getCustomerWithVehicles } from "@/db/queries/customers";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { formatMoney } from "@/lib/catalog/money";
import { customerFormContext } from "@/lib/customers/form-context";
import { STATUS_LABELS } from "@/lib/domain/builds";
import { countryName } from "@/lib/domain/countries";
import { QUOTE_STATUS_LABELS, quoteLabel, quoteStatusOn } from "@/lib/domain/quotes";
import { formatPhone } from "@/lib/format/phone";
import { idOrNotFound } from "@/lib/ids";
import { shopToday } from "@/lib/shop/shop-zone";

import { CustomerForm } from "../customer-form";
import { DeleteCustomer } from "./delete-customer";
import { PortalAccess } from "./portal-access";
import { VehiclesPanel } from "./vehicles-panel";

const PAYMENT_LABELS = { pending: "Pending", paid: "Paid", expired: "Expired" } as const;

const card = "mt-6 rounded-lg border border-ink-200 bg-white p-5 [overflow-wrap:anywhere]";

export default async function CustomerPage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("customers:read");
  const id = idOrNotFound((await params).id);
  const c = await getCustomerWithVehicles(m.shopId, id);
  if (!c) notFound();
  const [{ builds }, context, quotes, payments] = await Promise.all([
    listBuilds(m.shopId, { customerId: c.id, limit: 50 }),
    customerFormContext(m.shopId),
    can(m.role, "quotes:read") ? customerQuotes(m.shopId, c.id) : Promise.resolve([]),
    can(m.role, "quotes:read") ? customerPayments(m.shopId, c.id) : Promise.resolve([]),
  ]);
  const today = await shopToday(m.shopId);
  const phone = formatPhone(c.phone, context.shopCountry);
  const place = [c.city, c.region, c.postcode].filter(Boolean).join(", ");
  const address = [
    c.addressLine1,
    c.addressLine2,
    place,
    c.country && c.country !== context.shopCountry ? countryName(c.country) : null,
  ].filter(Boolean);
  return (
    <>
      <PageHeader title={c.name}>
        <div className="flex flex-wrap items-center gap-3">
          {can(m.role, "quotes:write") ? (
            <Link
              href={`/quotes/new?customer=${c.id}`}
              className="rounded-md bg-copper-600 px-4 py-2 text-sm font-semibold text-white hover:bg-copper-700 print:hidden"
            >
              New quote
            </Link>
          ) : null}
          <DeleteCustomer id={c.id} name={c.name} />
        </div>
      </PageHeader>
      <p className="-mt-2 mb-2 text-sm text-ink-600" data-testid="customer-summary">
        {[phone, c.email, address.join(", ")].filter(Boolean).join(" · ") ||
          "No phone, e-mail or address yet."}
      </p>
      <div className="grid grid-cols-1 gap-x-6 lg:grid-cols-2">
        <div>
          <section aria-labelledby="cust-vehicles" className={card}>
            <h2 id="cust-vehicles" className="text-xl font-semibold">
              Vehicles
            </h2>
            <VehiclesPanel
              customerId={c.id}
              vehicles={c.vehicles.map((v) => ({
                id: v.id,
                year: v.year,
                make: v.make,
                model: v.model,
                engine: v.engine,
                vin: v.vin,
                notes: v.notes,
              }))}
              canWrite={can(m.role, "customers:write")}
            />
          </section>
          <section aria-labelledby="cust-builds" className={card}>
            <div className="flex items-center justify-between gap-3">
              <h2 id="cust-builds" className="text-xl font-semibold">
                Builds
              </h2>
              {can(m.role, "builds:draft") ? (
                <Link
                  href={`/builds/new?customer=${c.id}`}
                  className="rounded-md bg-copper-600 px-4 py-2 text-sm font-semibold text-white hover:bg-copper-700 print:hidden"
                >
                  New build
                </Link>
              ) : null}
            </div>
            {builds.length === 0 ? (
              <p className="mt-2 text-sm text-ink-600">No builds yet.</p>
            ) : (
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
            )}
          </section>
          {can(m.role, "quotes:read") ? (
            <>
              <section aria-labelledby="cust-quotes" className={card}>
                <h2 id="cust-quotes" className="text-xl font-semibold">
                  Quotes
                </h2>
                {quotes.length === 0 ? (
                  <p className="mt-2 text-sm text-ink-600">No quotes yet.</p>
                ) : (
                  <ul className="mt-2 space-y-1">
                    {quotes.map((q) => (
                      <li key={q.id} className="flex flex-wrap gap-x-2">
                        <Link href={`/quotes/${q.id}`} className="text-copper-700 underline">
                          {quoteLabel(q.number, q.revision)}
                        </Link>
                        <span className="text-sm text-ink-600">
                          · {QUOTE_STATUS_LABELS[quoteStatusOn(q, today)]} ·{" "}
                          <span className="figure">{formatMoney(q.totalMinor, q.currency)}</span>
                          {q.buildTitle ? ` · ${q.buildTitle}` : ""}
                        </span>
                      </li>
                    ))}
                  </ul>
                )}
              </section>
              <section aria-labelledby="cust-payments" className={card}>
                <h2 id="cust-payments" className="text-xl font-semibold">
                  Payments
                </h2>
                {payments.length === 0 ? (
                  <p className="mt-2 text-sm text-ink-600">No payments yet.</p>
                ) : (
                  <ul className="mt-2 space-y-1 text-sm">
                    {payments.map((p) => (
                      <li key={p.id}>
                        <span className="figure font-medium">
                          {formatMoney(p.amountMinor, p.currency)}
                        </span>{" "}
                        deposit on{" "}
                        <Link href={`/quotes/${p.quoteId}`} className="text-copper-700 underline">
                          {quoteLabel(p.number, p.revision)}
                        </Link>{" "}
                        · {PAYMENT_LABELS[p.status]} · <LocalTime value={p.paidAt ?? p.createdAt} />
                      </li>
                    ))}
                  </ul>
                )}
              </section>
            </>
          ) : null}
        </div>
        <div>
          <section aria-labelledby="cust-details" className={`${card} print:hidden`}>
            <h2 id="cust-details" className="mb-4 text-xl font-semibold">
              Details
            </h2>
            <CustomerForm customer={{ ...c, phone: phone || null }} context={context} />
          </section>
          <section aria-labelledby="cust-portal" className={`${card} print:hidden`}>
            <h2 id="cust-portal" className="mb-2 text-xl font-semibold">
              Customer portal
            </h2>
            <PortalAccess id={c.id} hasSignIn={Boolean(c.userId)} email={c.email} />
          </section>
        </div>
      </div>
    </>
  );
}
