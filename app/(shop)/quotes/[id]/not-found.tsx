import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function QuoteNotFound() {
  return <NotFoundNotice thing="Quote" backHref="/quotes" backLabel="Back to the quotes" />;
}
