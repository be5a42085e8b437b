/**
 * The one tick formatter of our charts' axes: the tick's number, a no-break space and the unit
 * ("55 gal/h", "6000 rpm"). Recharts breaks a tick's text into lines at ordinary spaces when the
 * axis is narrow, and the lines then read run together ("55gal/h"); a no-break space keeps the
 * number and its unit on one line. Never pass recharts' own `unit` prop (it does the same split).
 */
export const NBSP = "\u00a0";

export function axisTick(unit: string): (value: number | string) => string {
  return (value) => `${value}${unit ? `${NBSP}${unit}` : ""}`;
}
