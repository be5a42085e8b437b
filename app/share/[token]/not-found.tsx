import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function ShareLinkNotFound() {
  return (
    <main id="main" tabIndex={-1} className="px-4 py-10 focus:outline-none">
      <NotFoundNotice thing="Share link" backHref="/" backLabel="Go to Fuelwright">
        This link is not valid. Check that it was copied whole, or ask the shop for a new link.
      </NotFoundNotice>
    </main>
  );
}
