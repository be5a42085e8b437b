// Reference: docs/calculations.md §3.5, §4.2.
/** Result of a piecewise-linear look-up: the value and whether the query lay outside the data. */
export interface Lookup {
  value: number;
  outOfRange: boolean;
}

/**
 * Piecewise-linear interpolation over points sorted by x. Outside the data the end segment is
 * extended (callers must say so to the user: `outOfRange` is true).
 */
export function interpolateLinear(xs: readonly number[], ys: readonly number[], x: number): Lookup {
  const n = xs.length;
  if (n === 0) return { value: 0, outOfRange: true };
  if (n === 1) return { value: ys[0]!, outOfRange: x !== xs[0] };
  let i = 0;
  if (x <= xs[0]!) i = 0;
  else if (x >= xs[n - 1]!) i = n - 2;
  else {
    // Binary search for the segment holding x.
    let lo = 0;
    let hi = n - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (xs[mid]! <= x) lo = mid;
      else hi = mid;
    }
    i = lo;
  }
  const x0 = xs[i]!;
  const x1 = xs[i + 1]!;
  const y0 = ys[i]!;
  const y1 = ys[i + 1]!;
  const t = x1 === x0 ? 0 : (x - x0) / (x1 - x0);
  const value = y0 + t * (y1 - y0);
  // Degenerate segments (x0 ≈ x1) must not leak Infinity into results.
  return { value: Number.isFinite(value) ? value : y1, outOfRange: x < xs[0]! || x > xs[n - 1]! };
}

export const clamp = (x: number, lo: number, hi: number): number => (x < lo ? lo : x > hi ? hi : x);
