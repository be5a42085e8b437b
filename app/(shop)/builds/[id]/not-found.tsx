import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function BuildNotFound() {
  return <NotFoundNotice thing="Build" backHref="/builds" backLabel="Back to the builds" />;
}
