import {
  bsfcFromGPerKwh,
  bsfcToGPerKwh,
  injectorCcPerMinToLbPerH,
  injectorLbPerHToCcPerMin,
  powerFromKw,
  powerToKw,
  pressureFromKpa,
  pressureToKpa,
  UNIT_SYSTEMS,
  volumeFlowFromLPerH,
  volumeFlowToLPerH,
  type UnitSystem,
} from "./units";

/**
 * Display and entry units. The library and the database keep canonical metric units; screens
 * convert at the edge with these, for the person's unit system.
 */
export type Quantity =
  | "pressure"
  | "power"
  | "injectorFlow"
  | "volumeFlow"
  | "bsfc"
  | "length"
  | "diameter"
  | "temperature";

const MM_PER_IN = 25.4; // exact, NIST SP 811 B.8
const M_PER_FT = 0.3048; // exact, NIST SP 811 B.8

interface Conv {
  unit: string;
  decimals: number;
  to: (canonical: number) => number;
  from: (shown: number) => number;
}

export function converter(q: Quantity, system: UnitSystem): Conv {
  const u = UNIT_SYSTEMS[system];
  if (system === "metric") {
    const unit = {
      pressure: "kPa",
      power: "kW",
      injectorFlow: "cc/min",
      volumeFlow: "L/h",
      bsfc: "g/kWh",
      length: "m",
      diameter: "mm",
      temperature: "°C",
    }[q];
    const decimals = {
      pressure: 0,
      power: 0,
      injectorFlow: 0,
      volumeFlow: 0,
      bsfc: 0,
      length: 2,
      diameter: 2,
      temperature: 0,
    }[q];
    return { unit, decimals, to: (x) => x, from: (x) => x };
  }
  switch (q) {
    case "pressure":
      return {
        unit: "psi",
        decimals: 1,
        to: (x) => pressureFromKpa(x, u.pressure),
        from: (x) => pressureToKpa(x, u.pressure),
      };
    case "power":
      return {
        unit: "hp",
        decimals: 0,
        to: (x) => powerFromKw(x, u.power),
        from: (x) => powerToKw(x, u.power),
      };
    case "injectorFlow":
      return {
        unit: "lb/h",
        decimals: 1,
        to: (x) => injectorCcPerMinToLbPerH(x),
        from: (x) => injectorLbPerHToCcPerMin(x),
      };
    case "volumeFlow":
      return {
        unit: "gal/h",
        decimals: 1,
        to: (x) => volumeFlowFromLPerH(x, u.volumeFlow),
        from: (x) => volumeFlowToLPerH(x, u.volumeFlow),
      };
    case "bsfc":
      return {
        unit: "lb/hp/h",
        decimals: 3,
        to: (x) => bsfcFromGPerKwh(x, u.bsfc),
        from: (x) => bsfcToGPerKwh(x, u.bsfc),
      };
    case "length":
      return { unit: "ft", decimals: 1, to: (x) => x / M_PER_FT, from: (x) => x * M_PER_FT };
    case "diameter":
      return { unit: "in", decimals: 3, to: (x) => x / MM_PER_IN, from: (x) => x * MM_PER_IN };
    case "temperature":
      return {
        unit: "°F",
        decimals: 0,
        to: (x) => (x * 9) / 5 + 32,
        from: (x) => ((x - 32) * 5) / 9,
      };
  }
}

const round = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;

/** A canonical value as shown: converted and rounded to the quantity's usual precision. */
export function toShown(q: Quantity, canonical: number, system: UnitSystem): number {
  const c = converter(q, system);
  return round(c.to(canonical), c.decimals);
}

/** Which input fields carry which quantity (array indices written as `*`). */
export const INPUT_QUANTITIES: Record<string, Quantity> = {
  "engine.maxBoostKpa": "pressure",
  "engine.idleManifoldKpaAbs": "pressure",
  "engine.intakeTempC": "temperature",
  "target.powerKw": "power",
  "fuel.bsfcGPerKwh": "bsfc",
  "injectors.ratedFlowCcPerMin": "injectorFlow",
  "injectors.ratedPressureKpa": "pressure",
  "injectors.deadTime.pressuresKpa.*": "pressure",
  "regulator.basePressureKpa": "pressure",
  "pumps.*.curves.*.points.*.pressureKpa": "pressure",
  "pumps.*.curves.*.points.*.flowLPerH": "volumeFlow",
  "electrical.wiring.roundTripLengthM": "length",
  "lines.feed.insideDiameterMm": "diameter",
  "lines.feed.lengthM": "length",
  "lines.feed.filterDropKpa": "pressure",
  "lines.return.insideDiameterMm": "diameter",
  "lines.return.lengthM": "length",
  "lines.return.filterDropKpa": "pressure",
};

/** The quantity of a field path such as "pumps.0.curves.0.points.2.flowLPerH", if any. */
export function quantityOf(path: string): Quantity | undefined {
  return INPUT_QUANTITIES[path.replace(/\.\d+(?=\.|$)/g, ".*")];
}

/**
 * Converts every number of an inputs object between canonical and shown units (a deep copy).
 * `original`, when converting back, is the canonical object the shown one came from: a shown
 * value nobody changed converts back to its exact original, so rounding never drifts a build.
 */
export function convertInputs<T>(
  value: T,
  system: UnitSystem,
  direction: "toShown" | "toCanonical",
  original?: unknown,
): T {
  const walk = (v: unknown, path: string, orig: unknown): unknown => {
    if (Array.isArray(v))
      return v.map((x, i) =>
        walk(x, path ? `${path}.${i}` : String(i), Array.isArray(orig) ? orig[i] : undefined),
      );
    if (v && typeof v === "object") {
      const out: Record<string, unknown> = {};
      for (const [k, x] of Object.entries(v))
        out[k] = walk(
          x,
          path ? `${path}.${k}` : k,
          orig && typeof orig === "object" ? (orig as Record<string, unknown>)[k] : undefined,
        );
      return out;
    }
    if (typeof v !== "number" || !Number.isFinite(v)) return v;
    const q = quantityOf(path);
    if (!q || system === "metric") return v;
    if (direction === "toShown") return toShown(q, v, system);
    if (typeof orig === "number" && toShown(q, orig, system) === v) return orig;
    // Canonical values keep one digit more than metric shows: 0.437 in is 11.1 mm, not 11.0998.
    return round(converter(q, system).from(v), converter(q, "metric").decimals + 1);
  };
  return walk(value, "", original) as T;
}
