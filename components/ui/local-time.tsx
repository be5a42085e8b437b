"use client";

import { createContext, useContext, type ReactNode } from "react";

import { formatDate, formatDateTime, type DateInput } from "@/lib/format/dates";

const ShopTimeZoneContext = createContext<string>("UTC");

/**
 * The shop's time zone (an IANA name, a shop setting) for every `<LocalTime>` beneath: the
 * staff and portal frames and the share page put it around their pages.
 */
export function ShopTimeZone({ zone, children }: { zone: string; children: ReactNode }) {
  return <ShopTimeZoneContext.Provider value={zone}>{children}</ShopTimeZoneContext.Provider>;
}

/**
 * An instant as a person reads it, in the shop's time zone (from `<ShopTimeZone>`; UTC outside
 * one) whatever the browser's zone: the server and the browser draw the same text.
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
  const zone = useContext(ShopTimeZoneContext);
  const iso = new Date(value).toISOString();
  const text =
    kind === "date" ? formatDate(iso, { timeZone: zone }) : formatDateTime(iso, { timeZone: zone });
  return (
    <time dateTime={iso} className={className}>
      {text}
    </time>
  );
}
