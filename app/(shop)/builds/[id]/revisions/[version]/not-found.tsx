import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function RevisionNotFound() {
  return (
    <NotFoundNotice thing="Revision" backHref="/builds" backLabel="Back to the builds">
      This build has no such version, or the build itself does not exist here. Open the build and
      pick a version from its list of revisions.
    </NotFoundNotice>
  );
}
