/*
 * The column limits as plain numbers (column-bounds.ts builds its schemas on them and re-exports
 * them): a browser that checks a quote line as it is typed loads these, not the schema library.
 */

/**
 * Bounds that match the database's column types, in one place: a number the schema accepts must
 * fit the column that stores it (PostgreSQL `integer` is 32-bit signed).
 */
export const INT4_MAX = 2_147_483_647;

/**
 * The largest quote subtotal (sum of line amounts, in cents) accepted: half the `integer` range,
 * so that tax of up to 100 % on top still fits the total column.
 */
export const QUOTE_SUBTOTAL_MAX_MINOR = Math.floor(INT4_MAX / 2);

/** The largest quantity one quote line takes, in thousandths (100 000). */
export const QUOTE_LINE_QTY_MAX_MILLI = 100_000_000;
/** The largest unit price one quote line takes, in cents (1 000 000.00). */
export const QUOTE_LINE_PRICE_MAX_MINOR = 100_000_000;
