import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function ShareLinkNotFound() {
  return (
    <main className="px-4 py-10">
      <NotFoundNotice thing="Share link" backHref="/" backLabel="Go to Fuelwright">
        This link is not valid. Check that it was copied whole, or ask the shop for a new link.
      </NotFoundNotice>
    </main>
  );
}
