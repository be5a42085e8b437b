import type { Metadata } from "next";
import { EmptyState, PageHeader } from "@/components/ui/status";

export const metadata: Metadata = { title: "Quotes" };

export default function QuotesPage() {
  return (
    <>
      <PageHeader title="Quotes" />
      <EmptyState title="No quotes yet">Quotes are made from sized builds; they will be listed here.</EmptyState>
    </>
  );
}
