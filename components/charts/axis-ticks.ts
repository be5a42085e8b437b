/**
 * The one tick formatter of our charts' axes (the build sheet's plain-SVG plot and the dyno
 * pages' recharts): the tick's number, a no-break space and the unit ("55 gal/h", "6000 rpm"). Recharts' <Text> splits a tick's text into words at ordinary spaces
 * and, since the axis gives each tick a width, draws every word as a <tspan> line of its own, so
 * "55 gal/h" reads "55gal/h" (its textContent) and stacks on screen; the no-break space is no
 * word break there (recharts' BREAKING_SPACES), so the tick stays one line. Never pass recharts'
 * own `unit` prop: it appends the unit after whatever the formatter gave, with the ordinary space
 * we put in it (tests/unit/chart-ticks.test.ts checks both).
 */
export const NBSP = "\u00a0";

export function axisTick(unit: string): (value: number | string) => string {
  return (value) => `${value}${unit ? `${NBSP}${unit}` : ""}`;
}
