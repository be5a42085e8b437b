import { PageLoading } from "@/components/ui/page-loading";

export default function AuthLoading() {
  return <PageLoading />;
}
