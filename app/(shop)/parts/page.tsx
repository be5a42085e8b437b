import type { Metadata } from "next";
import { EmptyState, PageHeader } from "@/components/ui/status";

export const metadata: Metadata = { title: "Parts" };

export default function PartsPage() {
  return (
    <>
      <PageHeader title="Parts" />
      <EmptyState title="The parts catalog is empty">Injectors, pumps, regulators and lines will be listed here with prices and stock.</EmptyState>
    </>
  );
}
