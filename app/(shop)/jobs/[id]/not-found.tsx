import { NotFoundNotice } from "@/components/ui/not-found-notice";

export default function JobNotFound() {
  return <NotFoundNotice thing="Job" backHref="/jobs" backLabel="Back to the jobs" />;
}
