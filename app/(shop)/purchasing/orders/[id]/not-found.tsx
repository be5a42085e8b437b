import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function PurchaseOrderNotFound() {
  return (
    <NotFoundNotice thing="Purchase order" backHref="/purchasing" backLabel="Back to purchasing" />
  );
}
