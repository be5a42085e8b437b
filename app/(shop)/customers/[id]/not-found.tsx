import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function CustomerNotFound() {
  return (
    <NotFoundNotice thing="Customer" backHref="/customers" backLabel="Back to the customers" />
  );
}
