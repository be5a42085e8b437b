import { PageLoading } from "@/components/ui/page-loading";

// Not at /quotes's level: a loading UI above /quotes/[id] would turn its 404 into a 200.
export default function NewQuoteLoading() {
  return <PageLoading label="Loading the new quote form" />;
}
