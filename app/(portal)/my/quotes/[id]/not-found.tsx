import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function MyQuoteNotFound() {
  return (
    <NotFoundNotice thing="Quote" backHref="/my" backLabel="Back to my builds and quotes">
      There is no quote of yours at this address. Your quotes are listed on your page.
    </NotFoundNotice>
  );
}
