"use client";

import { useSyncExternalStore } from "react";

import { formatDate, formatDateTime, type DateInput } from "@/lib/format/dates";

const subscribe = () => () => {};
const browserZone = () => Intl.DateTimeFormat().resolvedOptions().timeZone || "UTC";
const serverZone = () => null;

/**
 * An instant shown in the viewer's own time zone. The server cannot know that zone, so the
 * first paint (and any reader without JavaScript) gets UTC, marked as such; after hydration
 * the browser's zone replaces it.
 */
export function LocalTime({
  value,
  kind = "datetime",
  className,
}: {
  value: DateInput;
  kind?: "date" | "datetime";
  className?: string;
}) {
  const zone = useSyncExternalStore(subscribe, browserZone, serverZone);
  const iso = new Date(value).toISOString();
  const text =
    kind === "date"
      ? zone
        ? formatDate(iso, { timeZone: zone })
        : `${formatDate(iso)} UTC`
      : formatDateTime(iso, { timeZone: zone ?? "UTC" });
  return (
    <time dateTime={iso} title={formatDateTime(iso)} className={className} suppressHydrationWarning>
      {text}
    </time>
  );
}
