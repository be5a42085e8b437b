import type { Metadata } from "next";
import { EmptyState, PageHeader } from "@/components/ui/status";
import { requirePageMember } from "@/lib/auth/member";

export const metadata: Metadata = { title: "My builds" };

export default async function MyBuildsPage() {
  const m = await requirePageMember("portal:view");
  return (
    <>
      <PageHeader title="My builds" />
      <p className="mb-4 text-ink-700">Welcome, {m.user.name}. Your builds, spec sheets and quotes from {m.shopName} appear here.</p>
      <EmptyState title="Nothing shared with you yet">When the shop sizes your fuel system, the build and its spec sheet show up on this page.</EmptyState>
    </>
  );
}
