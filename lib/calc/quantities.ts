// Reference: docs/calculations.md §0, §9.
import {
  celsiusFromFahrenheit,
  FAHRENHEIT_DEGREES_PER_KELVIN,
  fahrenheitFromCelsius,
  KG_PER_LB,
  L_PER_CU_IN,
  L_PER_US_GAL,
  M_PER_FT,
  MG_PER_GRAIN,
  MM_PER_IN,
  NM_PER_LBF_FT,
} from "./constants";
import {
  bsfcFromGPerKwh,
  bsfcToGPerKwh,
  gPerMinToLbPerH,
  injectorCcPerMinToLbPerH,
  injectorLbPerHToCcPerMin,
  lbPerHToGPerMin,
  powerFromKw,
  powerToKw,
  pressureFromKpa,
  pressureToKpa,
  UNIT_SYSTEMS,
  volumeFlowFromLPerH,
  volumeFlowToLPerH,
  volumeFromL,
  volumeToL,
  type UnitSystem,
} from "./units";

/**
 * Quantities: what kind of number a figure is, its canonical unit (the one the library and the
 * database keep), and how each unit system shows it — unit, decimals and the conversion both
 * ways. Screens, documents and messages format every figure through here.
 */
export type Quantity =
  /** Gauge pressure, kPa. */
  | "pressure"
  /** Absolute pressure (manifold at idle), kPa absolute. */
  | "pressureAbs"
  /** Small pressure differences (line and filter drops), kPa: one decimal more. */
  | "pressureDrop"
  | "power"
  /** Fuel mass flow, g/min. */
  | "massFlow"
  /** Injector flow, cc/min (lb/h in imperial, at the trade's 0.72 kg/L test fluid). */
  | "injectorFlow"
  /** Pump and line flow, L/h. */
  | "volumeFlow"
  | "bsfc"
  | "length"
  | "diameter"
  | "roughness"
  /** A filter's rating, µm in both systems (the trade's "10 micron" in the US too). */
  | "filterRating"
  | "temperature"
  /** A difference of temperatures (EGT spread between cylinders), °C: no offset in °F. */
  | "temperatureDiff"
  /** Engine torque, N·m (lb·ft in imperial). */
  | "torque"
  /** Turbocharger shaft speed, rpm. */
  | "turboSpeed"
  /** Gauge pressure over gauge pressure (exhaust manifold to boost), printed "1.45:1". */
  | "pressureRatio"
  /** Ignition timing, degrees of crank before top dead centre. */
  | "timing"
  | "density"
  | "velocity"
  /** Engine displacement, L (cu in in imperial, as a US shop reads an engine's size). */
  | "displacement"
  | "volume"
  /**
   * Air or fuel per cylinder or per injection, mg (grains in imperial: 1 gr = 64.79891 mg, so
   * tens of mg of fuel read 0.2–1.5 gr and hundreds of mg of air a few grains).
   */
  | "mass"
  | "voltage"
  | "current"
  | "wireGauge"
  | "percent"
  /** Ethanol content by volume, printed "E85". */
  | "ethanol"
  /** A plain fraction such as volumetric efficiency. */
  | "ratio"
  /** A rising-rate regulator's fuel-pressure rise per unit of boost, printed "1:4". */
  | "risingRate"
  | "lambda"
  | "afr"
  /** Times, ms. */
  | "time"
  /** Hours of work (a quote's or an invoice's labour line), printed "1.5 h". */
  | "hours"
  | "speed"
  | "frequency"
  /** Whole things: injectors, cylinders, pumps. */
  | "count"
  | "reynolds"
  | "frictionFactor"
  /** Fittings' loss coefficient K (sum). */
  | "lossCoefficient"
  /** AN hose size, printed "−8 AN". */
  | "anDash";

/** How one unit system shows a quantity. */
export interface UnitFormat {
  unit: string;
  decimals: number;
  to: (canonical: number) => number;
  from: (shown: number) => number;
  /** Printed before the number ("E", "−"); the unit follows it. */
  prefix?: string;
  /** Between the number and the unit: a space unless the unit hugs the number (":1"). */
  gap?: string;
  /** Whole numbers only (counts). */
  whole?: boolean;
}

export interface QuantitySpec {
  /** Human name of the quantity. */
  name: string;
  /** The canonical unit the library computes in. */
  canonical: string;
  /** The unit a form field names where the printed one is a prefix or nothing ("count", "%"). */
  entryUnit?: string;
  metric: UnitFormat;
  imperial: UnitFormat;
}

const id = (x: number) => x;
const same = (f: Omit<UnitFormat, "to" | "from">): { metric: UnitFormat; imperial: UnitFormat } => {
  const u = { ...f, to: id, from: id };
  return { metric: u, imperial: u };
};
const metric = (unit: string, decimals: number, more: Partial<UnitFormat> = {}): UnitFormat => ({
  unit,
  decimals,
  to: id,
  from: id,
  ...more,
});

const IMP = UNIT_SYSTEMS.imperial;
/** kg/L → lb/US gal: 3.785411784 / 0.45359237 (both exact, NIST SP 811 B.8). */
const LB_PER_GAL_PER_KG_PER_L = L_PER_US_GAL / KG_PER_LB;

const psi = (decimals: number, unit = "psi"): UnitFormat => ({
  unit,
  decimals,
  to: (x) => pressureFromKpa(x, IMP.pressure),
  from: (x) => pressureToKpa(x, IMP.pressure),
});

export const QUANTITIES: Record<Quantity, QuantitySpec> = {
  pressure: { name: "pressure", canonical: "kPa", metric: metric("kPa", 0), imperial: psi(1) },
  pressureAbs: {
    name: "absolute pressure",
    canonical: "kPa absolute",
    metric: metric("kPa abs", 0),
    imperial: psi(1, "psia"),
  },
  pressureDrop: {
    name: "pressure drop",
    canonical: "kPa",
    metric: metric("kPa", 1),
    imperial: psi(2),
  },
  power: {
    name: "power",
    canonical: "kW",
    metric: metric("kW", 0),
    imperial: {
      unit: "hp",
      decimals: 0,
      to: (x) => powerFromKw(x, IMP.power),
      from: (x) => powerToKw(x, IMP.power),
    },
  },
  massFlow: {
    name: "fuel mass flow",
    canonical: "g/min",
    metric: metric("g/min", 0),
    imperial: { unit: "lb/h", decimals: 1, to: gPerMinToLbPerH, from: lbPerHToGPerMin },
  },
  injectorFlow: {
    name: "injector flow",
    canonical: "cc/min",
    metric: metric("cc/min", 0),
    imperial: {
      unit: "lb/h",
      decimals: 1,
      to: (x) => injectorCcPerMinToLbPerH(x),
      from: (x) => injectorLbPerHToCcPerMin(x),
    },
  },
  volumeFlow: {
    name: "fuel volume flow",
    canonical: "L/h",
    metric: metric("L/h", 0),
    imperial: {
      unit: "gal/h",
      decimals: 1,
      to: (x) => volumeFlowFromLPerH(x, IMP.volumeFlow),
      from: (x) => volumeFlowToLPerH(x, IMP.volumeFlow),
    },
  },
  bsfc: {
    name: "brake specific fuel consumption",
    canonical: "g/kWh",
    metric: metric("g/kWh", 0),
    imperial: {
      unit: "lb/hp/h",
      decimals: 3,
      to: (x) => bsfcFromGPerKwh(x, IMP.bsfc),
      from: (x) => bsfcToGPerKwh(x, IMP.bsfc),
    },
  },
  length: {
    name: "length",
    canonical: "m",
    metric: metric("m", 2),
    imperial: { unit: "ft", decimals: 1, to: (x) => x / M_PER_FT, from: (x) => x * M_PER_FT },
  },
  diameter: {
    name: "diameter",
    canonical: "mm",
    metric: metric("mm", 1),
    imperial: { unit: "in", decimals: 3, to: (x) => x / MM_PER_IN, from: (x) => x * MM_PER_IN },
  },
  roughness: {
    name: "surface roughness",
    canonical: "mm",
    metric: metric("mm", 4),
    imperial: { unit: "in", decimals: 5, to: (x) => x / MM_PER_IN, from: (x) => x * MM_PER_IN },
  },
  filterRating: {
    name: "filter rating",
    canonical: "µm",
    ...same({ unit: "µm", decimals: 0 }),
  },
  temperature: {
    name: "temperature",
    canonical: "°C",
    metric: metric("°C", 0),
    imperial: {
      unit: "°F",
      decimals: 0,
      to: fahrenheitFromCelsius,
      from: celsiusFromFahrenheit,
    },
  },
  temperatureDiff: {
    name: "temperature difference",
    canonical: "°C difference",
    metric: metric("°C", 0),
    imperial: {
      unit: "°F",
      decimals: 0,
      to: (x) => x * FAHRENHEIT_DEGREES_PER_KELVIN,
      from: (x) => x / FAHRENHEIT_DEGREES_PER_KELVIN,
    },
  },
  torque: {
    name: "torque",
    canonical: "N·m",
    metric: metric("N·m", 0),
    imperial: {
      unit: "lb·ft",
      decimals: 0,
      to: (x) => x / NM_PER_LBF_FT,
      from: (x) => x * NM_PER_LBF_FT,
    },
  },
  turboSpeed: {
    name: "turbo speed",
    canonical: "rpm",
    ...same({ unit: "rpm", decimals: 0 }),
  },
  pressureRatio: {
    name: "pressure ratio",
    canonical: ":1 gauge",
    ...same({ unit: ":1", gap: "", decimals: 2 }),
  },
  timing: {
    name: "ignition timing",
    canonical: "° before TDC",
    ...same({ unit: "° BTDC", gap: "", decimals: 1 }),
  },
  density: {
    name: "density",
    canonical: "kg/L",
    metric: metric("kg/L", 3),
    imperial: {
      unit: "lb/gal",
      decimals: 2,
      to: (x) => x * LB_PER_GAL_PER_KG_PER_L,
      from: (x) => x / LB_PER_GAL_PER_KG_PER_L,
    },
  },
  velocity: {
    name: "velocity",
    canonical: "m/s",
    metric: metric("m/s", 2),
    imperial: { unit: "ft/s", decimals: 1, to: (x) => x / M_PER_FT, from: (x) => x * M_PER_FT },
  },
  displacement: {
    name: "displacement",
    canonical: "L",
    metric: metric("L", 1),
    imperial: {
      unit: "cu in",
      decimals: 0,
      to: (x) => x / L_PER_CU_IN,
      from: (x) => x * L_PER_CU_IN,
    },
  },
  volume: {
    name: "volume",
    canonical: "L",
    metric: metric("L", 1),
    imperial: {
      unit: "gal",
      decimals: 2,
      to: (x) => volumeFromL(x, IMP.volume),
      from: (x) => volumeToL(x, IMP.volume),
    },
  },
  mass: {
    name: "mass",
    canonical: "mg",
    metric: metric("mg", 1),
    // Three decimals: 0.648 gr (42 mg of fuel) to three significant figures, 2.844 gr of air.
    imperial: {
      unit: "gr",
      decimals: 3,
      to: (x) => x / MG_PER_GRAIN,
      from: (x) => x * MG_PER_GRAIN,
    },
  },
  voltage: { name: "voltage", canonical: "V", ...same({ unit: "V", decimals: 1 }) },
  current: { name: "current", canonical: "A", ...same({ unit: "A", decimals: 1 }) },
  wireGauge: { name: "wire gauge", canonical: "AWG", ...same({ unit: "AWG", decimals: 0 }) },
  percent: { name: "percentage", canonical: "%", ...same({ unit: "%", decimals: 1 }) },
  ethanol: {
    name: "ethanol content",
    canonical: "% by volume",
    entryUnit: "%",
    ...same({ unit: "", prefix: "E", decimals: 0 }),
  },
  ratio: {
    name: "ratio",
    canonical: "",
    entryUnit: "fraction",
    ...same({ unit: "", decimals: 2 }),
  },
  risingRate: {
    name: "rising-rate ratio",
    canonical: "1:r",
    entryUnit: "1:",
    ...same({ unit: "", prefix: "1:", decimals: 1 }),
  },
  lambda: {
    name: "lambda",
    canonical: "λ",
    entryUnit: "λ",
    ...same({ unit: "", prefix: "λ ", decimals: 2 }),
  },
  afr: {
    name: "air-fuel ratio",
    canonical: ":1 by mass",
    ...same({ unit: ":1", gap: "", decimals: 1 }),
  },
  time: { name: "time", canonical: "ms", ...same({ unit: "ms", decimals: 2 }) },
  // Quotes take hours to three decimals; a figure prints with the decimals it has (1.5 h).
  hours: { name: "hours of work", canonical: "h", ...same({ unit: "h", decimals: 3 }) },
  speed: { name: "engine speed", canonical: "rpm", ...same({ unit: "rpm", decimals: 0 }) },
  frequency: { name: "frequency", canonical: "Hz", ...same({ unit: "Hz", decimals: 0 }) },
  count: {
    name: "count",
    canonical: "",
    entryUnit: "count",
    ...same({ unit: "", decimals: 0, whole: true }),
  },
  reynolds: { name: "Reynolds number", canonical: "", ...same({ unit: "", decimals: 0 }) },
  frictionFactor: { name: "friction factor", canonical: "", ...same({ unit: "", decimals: 4 }) },
  lossCoefficient: {
    name: "loss coefficient K",
    canonical: "",
    entryUnit: "K",
    ...same({ unit: "", decimals: 1 }),
  },
  anDash: {
    name: "AN size",
    canonical: "AN dash",
    ...same({ unit: "AN", prefix: "−", decimals: 0, whole: true }),
  },
};

/** How a quantity shows in a unit system: unit, decimals, conversions both ways. */
export function converter(q: Quantity, system: UnitSystem): UnitFormat {
  return QUANTITIES[q][system];
}

/** The unit a quantity shows in ("psi", "lb/h"; "" for plain numbers). */
export const unitOf = (q: Quantity, system: UnitSystem): string => QUANTITIES[q][system].unit;

const round = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;

/** A canonical value as shown: converted and rounded to the quantity's usual precision. */
export function toShown(q: Quantity, canonical: number, system: UnitSystem): number {
  const c = QUANTITIES[q][system];
  return round(c.to(canonical), c.whole ? 0 : c.decimals);
}

/**
 * The number alone, converted and rounded ("65.5"; a count "6", never "6.000"); "—" for a value
 * that is not a finite number. `decimals` overrides the quantity's precision.
 */
export function formatNumber(
  q: Quantity,
  canonical: number,
  system: UnitSystem,
  decimals?: number,
): string {
  if (typeof canonical !== "number" || !Number.isFinite(canonical)) return "—";
  const c = QUANTITIES[q][system];
  const d = c.whole ? 0 : (decimals ?? c.decimals);
  const s = c.to(canonical).toFixed(d);
  // "-0" and "-0.0" read as zero.
  return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
}

/** A figure with its unit, in a unit system: "65.5 lb/h", "E85", "−8 AN", "6". */
export function formatValue(
  q: Quantity,
  canonical: number,
  system: UnitSystem,
  decimals?: number,
): string {
  const n = formatNumber(q, canonical, system, decimals);
  if (n === "—") return n;
  const c = QUANTITIES[q][system];
  return `${c.prefix ?? ""}${n}${c.unit ? `${c.gap ?? " "}${c.unit}` : ""}`;
}

/**
 * A label and its figure: "reference lambda" with λ 0.80 → "reference lambda 0.80". A prefix
 * that is a sign standing for the quantity's name ("λ ", set apart by a space) is left out when
 * the label already ends with that name, so the name is never said twice (the PDFs spell λ as
 * "lambda"); a prefix that belongs to the figure itself ("E85") stays.
 */
export function formatLabelled(
  label: string,
  q: Quantity,
  canonical: number,
  system: UnitSystem,
  decimals?: number,
): string {
  const value = formatValue(q, canonical, system, decimals);
  const prefix = QUANTITIES[q][system].prefix;
  const named =
    !!prefix &&
    prefix.endsWith(" ") &&
    value.startsWith(prefix) &&
    label.trim().toLowerCase().endsWith(QUANTITIES[q].name.toLowerCase());
  return `${label} ${named ? value.slice(prefix.length) : value}`;
}

/**
 * A figure's own precision (a registry field's or a working step's `decimals`) is said in the
 * metric unit: it holds where the reader's system shows that unit (a percentage, a time) and
 * gives way to the system's own precision where that system has a unit of its own (fuel per
 * injection: 13.54 mg, but 0.209 gr).
 */
export function ownDecimals(
  q: Quantity,
  system: UnitSystem,
  decimals: number | undefined,
): number | undefined {
  return decimals !== undefined && QUANTITIES[q][system].unit === QUANTITIES[q].metric.unit
    ? decimals
    : undefined;
}

/** A number with its quantity: how warnings and working steps carry their figures. */
export interface Figure {
  value: number;
  quantity: Quantity;
  /** Overrides the quantity's precision where the reader sees the metric unit (`ownDecimals`). */
  decimals?: number;
}

/** Figures by name, filling the `{name}` places of a message template. */
export type FigureParams = Record<string, Figure>;

/** A template with its `{name}` places filled by the figures, formatted in a unit system. */
export function fillTemplate(
  template: string,
  params: FigureParams | undefined,
  system: UnitSystem,
): string {
  if (!params) return template;
  return template.replace(/\{(\w+)\}/g, (whole, name: string) => {
    const f = params[name];
    return f
      ? formatValue(f.quantity, f.value, system, ownDecimals(f.quantity, system, f.decimals))
      : whole;
  });
}

/**
 * A number typed in a unit system, back in canonical units. A shown value nobody changed (equal
 * to `original` as shown) is the exact original, so a form saved unchanged writes what it
 * loaded; anything else keeps one digit more than metric shows (0.437 in is 11.1 mm, not
 * 11.0998), so a unit switch never drifts a value.
 */
export function fromShown(
  q: Quantity,
  shown: number,
  system: UnitSystem,
  original?: number | null,
): number {
  if (typeof original === "number" && toShown(q, original, system) === shown) return original;
  const c = QUANTITIES[q][system];
  const m = QUANTITIES[q].metric;
  if (c.from === m.from) return shown;
  const d = m.decimals + 1;
  return Math.round(c.from(shown) * 10 ** d) / 10 ** d;
}

/** A canonical value as a form field shows it: converted and rounded ("" for no value). */
export function shownText(
  q: Quantity,
  canonical: number | null | undefined,
  system: UnitSystem,
): string {
  if (typeof canonical !== "number" || !Number.isFinite(canonical)) return "";
  return String(toShown(q, canonical, system));
}
