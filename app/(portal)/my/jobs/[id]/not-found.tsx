import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function MyJobNotFound() {
  return <NotFoundNotice thing="Job" backHref="/my" backLabel="Back to my builds" />;
}
