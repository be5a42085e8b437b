import { PageLoading } from "@/components/ui/page-loading";

// Not at the group's level: a loading UI above /builds/[id] would turn its 404 into a 200.
export default function NewBuildLoading() {
  return <PageLoading label="Loading the new build form" />;
}
