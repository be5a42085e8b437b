import type { Metadata } from "next";
import Link from "next/link";

import { PageHeader } from "@/components/ui/status";
import { listCustomers } from "@/db/queries/customers";
import { unitSystemOf } from "@/db/queries/preferences";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { unitOf } from "@/lib/calc/quantities";
import { vehicleText } from "@/lib/domain/builds";

import { DraftBuildForm } from "./draft-build-form";
import { NewBuildForm } from "./new-build-form";

export const metadata: Metadata = { title: "New build" };

/**
 * A new build. The counter (and anyone, with `?from=goal`) starts one from a caller's goal for
 * the tuners' sizing queue; a tuner or owner opens a build sheet to size straight away.
 */
export default async function NewBuildPage({
  searchParams,
}: {
  searchParams: Promise<{ customer?: string; from?: string }>;
}) {
  const m = await requirePageMember("builds:draft");
  const { customer, from } = await searchParams;
  const fromGoal = from === "goal" || !can(m.role, "builds:write");
  const [customers, units] = await Promise.all([
    listCustomers(m.shopId, { limit: 100 }),
    unitSystemOf(m.user.id, m.shopId),
  ]);
  const keep = customer ? `customer=${encodeURIComponent(customer)}` : "";
  return (
    <>
      <PageHeader title={fromGoal ? "New build from a caller's goal" : "New build sheet"} />
      <section className="max-w-2xl rounded-lg border border-ink-200 bg-white p-5">
        {fromGoal ? (
          <DraftBuildForm
            customers={customers.map((c) => ({
              id: c.id,
              name: c.name,
              vehicles: c.vehicles.map((v) => ({
                id: v.id,
                label: vehicleText(v),
                engine: v.engine,
              })),
            }))}
            customerId={customer}
            units={units}
            powerUnit={unitOf("power", units)}
            displacementUnit={unitOf("displacement", units)}
          />
        ) : (
          <NewBuildForm
            customers={customers.map((c) => ({ id: c.id, name: c.name }))}
            customerId={customer}
          />
        )}
      </section>
      {can(m.role, "builds:write") ? (
        <p className="mt-4 text-sm">
          {fromGoal ? (
            <Link
              href={`/builds/new${keep ? `?${keep}` : ""}`}
              className="text-copper-700 underline"
            >
              Open a build sheet to size now instead
            </Link>
          ) : (
            <Link
              href={`/builds/new?from=goal${keep ? `&${keep}` : ""}`}
              className="text-copper-700 underline"
            >
              Take a caller&apos;s goal for the sizing queue instead
            </Link>
          )}
        </p>
      ) : null}
    </>
  );
}
