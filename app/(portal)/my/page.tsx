import type { Metadata } from "next";
import { EmptyState, PageHeader } from "@/components/ui/status";
import { listBuildsOfPortalUser } from "@/db/queries/builds";
import { requirePageMember } from "@/lib/auth/member";
import { STATUS_LABELS } from "@/lib/validations/builds";

export const metadata: Metadata = { title: "My builds" };

export default async function MyBuildsPage() {
  const m = await requirePageMember("portal:view");
  const builds = await listBuildsOfPortalUser(m.shopId, m.user.id);
  return (
    <>
      <PageHeader title="My builds" />
      <p className="mb-4 text-ink-700">Welcome, {m.user.name}. Your builds from {m.shopName}.</p>
      {builds.length === 0 ? (
        <EmptyState title="Nothing shared with you yet">When the shop sizes your fuel system, the build shows up on this page.</EmptyState>
      ) : (
        <ul className="space-y-2" aria-label="My builds">
          {builds.map((b) => (
            <li key={b.id} className="rounded-lg border border-ink-200 bg-white p-4">
              <p className="font-semibold">{b.title}</p>
              <p className="text-sm text-ink-600">{b.vehicle ?? ""} · {STATUS_LABELS[b.status]}</p>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
