import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function SupplierNotFound() {
  return <NotFoundNotice thing="Supplier" backHref="/purchasing" backLabel="Back to purchasing" />;
}
