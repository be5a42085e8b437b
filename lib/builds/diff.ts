import { converter, quantityOf, toShown, type FuelSystemResult, type UnitSystem } from "@/lib/calc";

/** Every leaf of a JSON value by dotted path ("pumps.0.curves.0.voltage"). */
export function flatten(
  value: unknown,
  path = "",
  out: Record<string, string | number | boolean | null> = {},
) {
  if (Array.isArray(value))
    value.forEach((v, i) => flatten(v, path ? `${path}.${i}` : String(i), out));
  else if (value && typeof value === "object")
    for (const [k, v] of Object.entries(value)) flatten(v, path ? `${path}.${k}` : k, out);
  else if (value !== undefined) out[path] = value as string | number | boolean | null;
  return out;
}

/** JSON with sorted keys, so that two equal objects compare equal whatever their key order. */
export function stableJson(value: unknown): string {
  return JSON.stringify(value, (_k, v) =>
    v && typeof v === "object" && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v).sort(([a], [b]) => a.localeCompare(b)))
      : v,
  );
}

const LABELS: Record<string, string> = {
  "engine.cylinders": "Cylinders",
  "engine.displacementL": "Displacement",
  "engine.aspiration": "Aspiration",
  "engine.redlineRpm": "Redline",
  "engine.idleRpm": "Idle",
  "engine.maxBoostKpa": "Boost",
  "target.powerKw": "Target power",
  "target.measuredAt": "Measured at",
  "target.drivetrainLossPct": "Drivetrain loss",
  "target.driveType": "Drive type",
  "limits.designDutyPct": "Design duty",
  "limits.dutyCautionPct": "Duty caution level",
  "limits.dutyDangerPct": "Duty danger level",
  "limits.minPumpMarginPct": "Minimum pump margin",
  "limits.maxLineDropKpa": "Line drop limit",
  "fuel.bsfcDefaults.gasolineNaGPerKwh": "BSFC rule of thumb, gasoline NA",
  "fuel.bsfcDefaults.gasolineBoostedGPerKwh": "BSFC rule of thumb, gasoline boosted",
  "fuel.bsfcDefaults.e85NaGPerKwh": "BSFC rule of thumb, E85 NA",
  "fuel.bsfcDefaults.e85BoostedGPerKwh": "BSFC rule of thumb, E85 boosted",
  "fuel.bsfcDefaults.referenceLambdaNa": "BSFC reference lambda, NA",
  "fuel.bsfcDefaults.referenceLambdaBoosted": "BSFC reference lambda, boosted",
  "fuel.properties.gasoline.densityKgPerL": "Gasoline density",
  "fuel.properties.gasoline.stoichAfr": "Gasoline stoichiometric AFR",
  "fuel.properties.ethanol.densityKgPerL": "Ethanol density",
  "fuel.properties.ethanol.stoichAfr": "Ethanol stoichiometric AFR",
  "fuel.ethanolMinVolPct": "Lowest ethanol",
  "fuel.ethanolMaxVolPct": "Highest ethanol",
  "fuel.bsfcGPerKwh": "BSFC",
  "fuel.targetLambda": "Target lambda",
  "injectors.count": "Injectors",
  "injectors.ratedFlowCcPerMin": "Injector rated flow",
  "injectors.ratedPressureKpa": "Injector rated pressure",
  "injectors.minPulseWidthMs": "Minimum pulse width",
  "regulator.type": "Regulator",
  "regulator.basePressureKpa": "Base pressure",
  "electrical.voltageAtPump": "Voltage at the pump",
  "electrical.wiring.sourceVoltage": "Wiring: supply voltage",
  "electrical.wiring.gaugeAwg": "Wiring: gauge (AWG)",
  "electrical.wiring.roundTripLengthM": "Wiring: length there and back",
  "electrical.wiring.currentA": "Wiring: pump current",
};
const LINE_FIELDS: Record<string, string> = {
  insideDiameterMm: "inside diameter",
  lengthM: "length",
  roughnessMm: "roughness",
  fittingsK: "fittings K",
  filterDropKpa: "filter drop",
};
const PUMP_FIELDS: Record<string, string> = { pressureKpa: "pressure", flowLPerH: "flow" };

/** A readable name for an input path; unknown paths read as their path. */
export function labelOf(path: string): string {
  const line = /^lines\.(feed|return)\.(\w+)$/.exec(path);
  if (line)
    return `${line[1] === "feed" ? "Feed" : "Return"} line ${LINE_FIELDS[line[2]!] ?? line[2]}`;
  const pt = /^pumps\.(\d+)\.curves\.(\d+)\.points\.(\d+)\.(\w+)$/.exec(path);
  if (pt)
    return `Pump ${Number(pt[1]) + 1} curve ${Number(pt[2]) + 1} point ${Number(pt[3]) + 1} ${PUMP_FIELDS[pt[4]!] ?? pt[4]}`;
  return (
    LABELS[path] ?? path.replace(/\.(\d+)/g, (_m, i) => ` ${Number(i) + 1}`).replace(/\./g, " › ")
  );
}

export interface InputChange {
  path: string;
  label: string;
  before: string;
  after: string;
}

function shown(
  path: string,
  v: string | number | boolean | null | undefined,
  units: UnitSystem,
): string {
  if (v === undefined || v === null) return "—";
  if (typeof v !== "number") return String(v);
  const q = quantityOf(path);
  return q ? `${toShown(q, v, units)} ${converter(q, units).unit}` : String(v);
}

/** What changed from `a` to `b` in a build's inputs, in the person's units. */
export function diffInputs(a: unknown, b: unknown, units: UnitSystem): InputChange[] {
  const fa = flatten(a);
  const fb = flatten(b);
  const paths = [...new Set([...Object.keys(fa), ...Object.keys(fb)])].sort();
  return paths
    .filter((p) => fa[p] !== fb[p])
    .map((p) => ({
      path: p,
      label: labelOf(p),
      before: shown(p, fa[p], units),
      after: shown(p, fb[p], units),
    }));
}

export interface KeyFigure {
  label: string;
  before: string;
  after: string;
  changed: boolean;
}

/** The headline figures of two results side by side. */
export function compareKeyFigures(
  a: FuelSystemResult | null,
  b: FuelSystemResult | null,
  units: UnitSystem,
): KeyFigure[] {
  const fig = (
    r: FuelSystemResult | null,
    pick: (r: FuelSystemResult) => number,
    q?: Parameters<typeof toShown>[0],
    unit = "",
    d = 1,
  ) => {
    if (!r) return "—";
    const v = pick(r);
    if (!Number.isFinite(v)) return "—";
    return q ? `${toShown(q, v, units)} ${converter(q, units).unit}` : `${v.toFixed(d)}${unit}`;
  };
  const rows: [
    string,
    (r: FuelSystemResult) => number,
    Parameters<typeof toShown>[0] | undefined,
    string,
    number,
  ][] = [
    ["Duty at the richest blend", (r) => r.blend.rich.dutyPct, undefined, " %", 1],
    [
      "Smallest injector rating",
      (r) => r.injector.requiredRatedFlowCcPerMin,
      "injectorFlow",
      "",
      0,
    ],
    ["Pump demand", (r) => r.pump.demandLPerH, "volumeFlow", "", 0],
    ["Pump supply", (r) => r.pump.supplyLPerH, "volumeFlow", "", 0],
    ["Pump margin", (r) => r.pump.marginPct, undefined, " %", 0],
    ["Rail pressure", (r) => r.pump.railPressureKpa, "pressure", "", 0],
    ["Power ceiling (crank)", (r) => r.powerCeiling.kw, "power", "", 0],
  ];
  return rows.map(([label, pick, q, unit, d]) => {
    const before = fig(a, pick, q, unit, d);
    const after = fig(b, pick, q, unit, d);
    return { label, before, after, changed: before !== after };
  });
}
