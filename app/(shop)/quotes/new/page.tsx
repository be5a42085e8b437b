import type { Metadata } from "next";

import { PageHeader } from "@/components/ui/status";
import { getCustomer } from "@/db/queries/customers";
import { getShopSettings } from "@/db/queries/shops";
import { requirePageMember } from "@/lib/auth/member";
import { parseId } from "@/lib/ids";

import { NewQuoteForm } from "./new-quote-form";

export const metadata: Metadata = { title: "New quote" };

/** A parts-only quote (no build): `?customer=<id>` comes from the customer's page. */
export default async function NewQuotePage({
  searchParams,
}: {
  searchParams: Promise<{ customer?: string | string[] }>;
}) {
  const m = await requirePageMember("quotes:write");
  const raw = (await searchParams).customer;
  const customerId = typeof raw === "string" ? parseId(raw) : null;
  const [customer, settings] = await Promise.all([
    customerId ? getCustomer(m.shopId, customerId) : null,
    getShopSettings(m.shopId),
  ]);
  return (
    <>
      <PageHeader title="New quote" />
      <p className="mb-4 max-w-2xl text-sm text-ink-700">
        A quote for parts from the catalog — a pump swap, a filter, fittings — with labour if the
        shop fits them. No build or sizing needed; for a sized fuel system, quote it from the
        build&apos;s kit instead.
      </p>
      <NewQuoteForm
        customer={
          customer
            ? { id: customer.id, name: customer.name, email: customer.email, phone: customer.phone }
            : null
        }
        currency={settings?.settings.currency ?? "USD"}
        taxRateBp={settings?.settings.taxRateBp ?? 0}
        labourRateMinor={settings?.settings.labourRateMinor ?? 12000}
      />
    </>
  );
}
