import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function MyInvoiceNotFound() {
  return <NotFoundNotice thing="Invoice" backHref="/my" backLabel="Back to my builds" />;
}
