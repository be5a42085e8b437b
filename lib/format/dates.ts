/**
 * The one way a date or a time reaches a person: screens (through `components/ui/local-time`),
 * PDFs and e-mails. Day, month name and year, so no reader mistakes 03/04 for 4 March; a
 * 24-hour clock. The time zone is an IANA name ("Europe/Berlin"); UTC unless one is given.
 */

export type DateInput = Date | string | number;

export interface DateFormatOptions {
  /** IANA time zone name; "UTC" when left out. */
  timeZone?: string;
}

const LOCALE = "en-GB";
const formats = new Map<string, Intl.DateTimeFormat>();

function formatter(kind: "date" | "datetime", timeZone: string) {
  const key = `${kind}|${timeZone}`;
  let f = formats.get(key);
  if (!f) {
    f = new Intl.DateTimeFormat(LOCALE, {
      timeZone,
      day: "numeric",
      month: "short",
      year: "numeric",
      ...(kind === "datetime"
        ? { hour: "2-digit", minute: "2-digit", hourCycle: "h23", timeZoneName: "short" }
        : {}),
    } as Intl.DateTimeFormatOptions);
    formats.set(key, f);
  }
  return f;
}

function toDate(value: DateInput): Date {
  const d = value instanceof Date ? value : new Date(value);
  if (Number.isNaN(d.getTime())) throw new RangeError(`Not a date: ${String(value)}`);
  return d;
}

/**
 * The calendar day of an instant in a time zone.
 *
 * @example formatDate("2026-03-04T23:30:00Z") // "4 Mar 2026"
 * @example formatDate("2026-03-04T23:30:00Z", { timeZone: "Europe/Berlin" }) // "5 Mar 2026"
 */
export function formatDate(value: DateInput, { timeZone = "UTC" }: DateFormatOptions = {}) {
  return formatter("date", timeZone).format(toDate(value));
}

/**
 * Day and time of an instant in a time zone, with the zone's short name.
 *
 * @example formatDateTime("2026-03-04T23:30:00Z") // "4 Mar 2026, 23:30 UTC"
 * @example formatDateTime("2026-07-04T23:30:00Z", { timeZone: "Europe/Berlin" }) // "5 Jul 2026, 01:30 CEST"
 */
export function formatDateTime(value: DateInput, { timeZone = "UTC" }: DateFormatOptions = {}) {
  return formatter("datetime", timeZone).format(toDate(value));
}

/**
 * A calendar day kept without a time ("2026-05-14", a quote's "valid until"), as a person reads
 * it. It names the same day in every zone, so it is never shifted.
 *
 * @example formatCalendarDate("2026-05-14") // "14 May 2026"
 */
export function formatCalendarDate(isoDay: string) {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(isoDay)) throw new RangeError(`Not a calendar day: ${isoDay}`);
  return formatter("date", "UTC").format(toDate(`${isoDay}T00:00:00Z`));
}

/**
 * The calendar day an instant falls on in a time zone, as "YYYY-MM-DD"; `addDays` later.
 *
 * @example calendarDay("2026-03-04T23:30:00Z", "Europe/Berlin") // "2026-03-05"
 * @example calendarDay("2026-03-04T23:30:00Z", "Europe/Berlin", 30) // "2026-04-04"
 */
export function calendarDay(value: DateInput, timeZone = "UTC", addDays = 0) {
  const parts = new Intl.DateTimeFormat("en-CA", {
    timeZone,
    year: "numeric",
    month: "2-digit",
    day: "2-digit",
  }).formatToParts(toDate(value));
  const get = (t: string) => Number(parts.find((p) => p.type === t)!.value);
  const day = new Date(Date.UTC(get("year"), get("month") - 1, get("day") + addDays));
  return day.toISOString().slice(0, 10);
}
