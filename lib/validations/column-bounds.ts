import { z } from "zod";

import { INT4_MAX } from "./column-limits";

export * from "./column-limits";

/** A record's version (the optimistic-lock counter): a whole number from 1 that fits `integer`. */
export const versionNumber = (name = "version") =>
  z
    .number({ error: `${name} is required` })
    .int(`${name} must be a whole number`)
    .min(1, `${name} starts at 1`)
    .max(INT4_MAX, `${name} is too large`);

/**
 * The version an edit form started from, optional (`PATCH` without it: the last write wins). A
 * form's hidden field sends it as text, a JSON client as a number; both are read.
 */
export const editVersion = (name = "version") =>
  z
    .preprocess(
      (v) => (typeof v === "string" ? (v.trim() === "" ? undefined : Number(v)) : v),
      z
        .number({ error: `${name} must be a whole number` })
        .int(`${name} must be a whole number`)
        .min(1, `${name} starts at 1`)
        .max(INT4_MAX, `${name} is too large`)
        .optional(),
    )
    .optional();

/** The same, read from a query string (`?version=3`). */
export const versionParam = (name = "version") =>
  z.coerce
    .number({ error: `${name} must be a number` })
    .int(`${name} must be a whole number`)
    .min(1, `${name} starts at 1`)
    .max(INT4_MAX, `${name} is too large`);

/**
 * The calendar dates the app stores (PostgreSQL `date`): `YYYY-MM-DD`, a day that exists, in
 * the years 1900 to 9999. PostgreSQL has no year 0, and a five-digit year is no date a person
 * means.
 */
export const DATE_MIN = "1900-01-01";
export const DATE_MAX = "9999-12-31";
export const calendarDate = () =>
  z.iso
    .date({ error: "Give a date as YYYY-MM-DD", abort: true })
    .refine(
      (d) => d >= DATE_MIN && d <= DATE_MAX,
      `Give a date between ${DATE_MIN} and ${DATE_MAX}`,
    );
