import { notFound } from "next/navigation";
import { z } from "zod";

const Uuid = z.uuid();

/**
 * A record id from a URL or a request, or null when it is not one. Only what PostgreSQL's
 * `uuid` type accepts gets through (a typed-in `zzz` or 32 bare hex digits would make the query
 * itself fail), lower-cased.
 *
 * @example parseId("0B0AB664-859C-4032-B5A5-F85A9AEB005A") // "0b0ab664-859c-4032-b5a5-f85a9aeb005a"
 * @example parseId("zzz") // null
 */
export function parseId(value: unknown): string | null {
  const parsed = Uuid.safeParse(value);
  return parsed.success ? parsed.data.toLowerCase() : null;
}

/**
 * For pages: the `[id]` param as an id, or Next's `notFound()` (the route's not-found page with
 * a 404), so a mistyped URL never reaches the database.
 */
export function idOrNotFound(value: unknown): string {
  return parseId(value) ?? notFound();
}
