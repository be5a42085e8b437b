import { formatCalendarDate } from "@/lib/format/dates";

import type { Candidate } from "./recommend";

/*
 * The kit's verdicts in words, apart from the recommender (recommend.ts re-exports them): the
 * kit page labels the candidates the server ranked without loading the sizing or its schemas.
 */

/**
 * The verdict a candidate shows, saying plainly when a part that fits is not (all) on the shelf:
 * "Best fit", "Best fit — out of stock, expected by 12 Mar 2026", "Fits — only 2 of 6 in stock,
 * the rest expected by …", "Does not fit". `best`: the first candidate that fits.
 */
export function fitLabel(c: Candidate, best: boolean): string {
  if (!c.fits) return "Does not fit";
  const { free, needed, expectedOn } = c.stock;
  const date = expectedOn ? formatCalendarDate(expectedOn) : null;
  const head = best ? "Best fit" : "Fits";
  if (free >= needed) return head;
  if (free === 0)
    return `${head} — out of stock, ${date ? `expected by ${date}` : "no restock date yet"}`;
  return `${head} — only ${free} of ${needed} in stock, the rest ${date ? `expected by ${date}` : "with no restock date yet"}`;
}

/**
 * Labels for a role's candidates in their (ranked) order: `fitLabel`, and when the best fit is
 * short of stock, the first fitting part that is in stock reads "Best in stock".
 */
export function fitLabels(candidates: Candidate[]): string[] {
  const short = (c: Candidate) => c.stock.free < c.stock.needed;
  const best = candidates.findIndex((c) => c.fits);
  const inStock =
    best >= 0 && short(candidates[best]!) ? candidates.findIndex((c) => c.fits && !short(c)) : -1;
  return candidates.map((c, i) => (i === inStock ? "Best in stock" : fitLabel(c, i === best)));
}
