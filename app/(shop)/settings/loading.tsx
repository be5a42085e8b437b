import { PageLoading } from "@/components/ui/page-loading";

// Only under routes with no typed-in id beneath: once a loading UI streams, Next can no longer
// answer a missing build, customer, part or quote with a 404 status (its docs: not-found.md).
export default function SettingsLoading() {
  return <PageLoading label="Loading the settings" />;
}
