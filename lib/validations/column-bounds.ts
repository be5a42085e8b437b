import { z } from "zod";

/**
 * Bounds that match the database's column types, in one place: a number the schema accepts must
 * fit the column that stores it (PostgreSQL `integer` is 32-bit signed).
 */
export const INT4_MAX = 2_147_483_647;

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
 * The largest quote subtotal (sum of line amounts, in cents) accepted: half the `integer` range,
 * so that tax of up to 100 % on top still fits the total column.
 */
export const QUOTE_SUBTOTAL_MAX_MINOR = Math.floor(INT4_MAX / 2);

/** The largest quantity one quote line takes, in thousandths (100 000). */
export const QUOTE_LINE_QTY_MAX_MILLI = 100_000_000;
/** The largest unit price one quote line takes, in cents (1 000 000.00). */
export const QUOTE_LINE_PRICE_MAX_MINOR = 100_000_000;

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
