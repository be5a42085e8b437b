import type { Metadata } from "next";
import Link from "next/link";
import { EmptyState, PageHeader } from "@/components/ui/status";

export const metadata: Metadata = { title: "Builds" };

export default function BuildsPage() {
  return (
    <>
      <PageHeader title="Builds" />
      <EmptyState title="No build sheets yet">
        Saved build sheets are on their way. Meanwhile, size a system with the <Link href="/tools" className="text-copper-600 underline">quick injector check</Link>.
      </EmptyState>
    </>
  );
}
