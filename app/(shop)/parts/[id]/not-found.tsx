import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function PartNotFound() {
  return <NotFoundNotice thing="Part" backHref="/parts" backLabel="Back to the catalog" />;
}
