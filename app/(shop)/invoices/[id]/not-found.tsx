import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function InvoiceNotFound() {
  return <NotFoundNotice thing="Invoice" backHref="/jobs" backLabel="Back to the jobs" />;
}
