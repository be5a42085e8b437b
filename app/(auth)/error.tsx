"use client";

import { ErrorNotice } from "@/components/ui/error-notice";

export default function RouteError({ error, retry }: { error: unknown; retry: () => void }) {
  return <ErrorNotice error={error} retry={retry} framed={false} />;
}
