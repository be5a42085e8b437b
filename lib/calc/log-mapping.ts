// Reference: docs/calculations.md §6.
import { z } from "zod";

import {
  ATMOSPHERE_KPA,
  celsiusFromFahrenheit,
  KPA_PER_BAR,
  KPA_PER_PSI,
  KW_PER_HP,
} from "./constants";
import type { Datalog } from "./datalog";
import type { PullSample } from "./dyno";

/** The library's one set of NIST SP 811 factors (./constants); absolute MAP minus the standard atmosphere is boost. */
const KPA_PER = { kPa: 1, bar: KPA_PER_BAR, psi: KPA_PER_PSI } as const;
const KW_PER = { kW: 1, hp: KW_PER_HP } as const;

const col = z.string({ error: "Choose a column" }).min(1, "Choose a column");
const pressureUnit = z.enum(["kPa", "bar", "psi"], { error: "Choose kPa, bar or psi" });
const temperatureUnit = z.enum(["C", "F"], { error: "Choose °C or °F" });
/** Most cylinders an engine of the sizing schema has (EngineSchema): one EGT column each at most. */
export const MAX_EGT_COLUMNS = 16;

/** Which log column is what, and in which units: what the tuner picks on the mapping screen. */
export const DatalogMappingSchema = z.object({
  rpm: col,
  duty: z.object({
    column: col,
    kind: z.enum(["duty_pct", "pulse_ms"], { error: "Duty in % or pulse width in ms" }),
  }),
  mixture: z
    .object({
      column: col,
      kind: z.enum(["lambda", "afr"]),
      afrStoich: z.number().min(5).max(20).default(14.7),
    })
    .optional(),
  boost: z
    .object({ column: col, kind: z.enum(["gauge", "absolute"]), unit: pressureUnit })
    .optional(),
  fuelPressure: z
    .object({ column: col, kind: z.enum(["rail", "differential"]), unit: pressureUnit })
    .optional(),
  ethanol: z.object({ column: col }).optional(),
  power: z.object({ column: col, unit: z.enum(["kW", "hp"]) }).optional(),
  /** Exhaust gas temperature, one column per cylinder (any number of them), in cylinder order. */
  egt: z
    .object({
      columns: z
        .array(col)
        .min(1, "Choose at least one EGT column")
        .max(MAX_EGT_COLUMNS, `At most ${MAX_EGT_COLUMNS} EGT columns`),
      unit: temperatureUnit,
    })
    .optional(),
  /** Exhaust manifold pressure (before the turbine). */
  exhaustPressure: z
    .object({ column: col, kind: z.enum(["gauge", "absolute"]), unit: pressureUnit })
    .optional(),
  turboSpeed: z
    .object({ column: col, unit: z.enum(["rpm", "krpm"], { error: "Choose rpm or krpm" }) })
    .optional(),
  intakeTemp: z.object({ column: col, unit: temperatureUnit }).optional(),
  /** Ignition timing in degrees before top dead centre. */
  timing: z.object({ column: col }).optional(),
});
export type DatalogMapping = z.output<typeof DatalogMappingSchema>;

/** The same logger writes the same header set: the key under which a shop's mapping is kept. */
export function headerKey(headers: string[]): string {
  return [...headers]
    .map((h) => h.trim().toLowerCase())
    .sort()
    .join("\u0001");
}

/** Every column the mapping names must be in the log. */
export function mappingProblems(
  m: DatalogMapping,
  headers: string[],
): { path: string; message: string }[] {
  const named: [string, string | undefined][] = [
    ["rpm", m.rpm],
    ["duty.column", m.duty.column],
    ["mixture.column", m.mixture?.column],
    ["boost.column", m.boost?.column],
    ["fuelPressure.column", m.fuelPressure?.column],
    ["ethanol.column", m.ethanol?.column],
    ["power.column", m.power?.column],
    ...(m.egt?.columns ?? []).map((c, i): [string, string] => [`egt.columns.${i}`, c]),
    ["exhaustPressure.column", m.exhaustPressure?.column],
    ["turboSpeed.column", m.turboSpeed?.column],
    ["intakeTemp.column", m.intakeTemp?.column],
    ["timing.column", m.timing?.column],
  ];
  return named
    .filter(([, c]) => c !== undefined && !headers.includes(c))
    .map(([path, c]) => ({ path, message: `The log has no column "${c}"` }));
}

const celsius = (v: number | null, unit: "C" | "F") =>
  v === null ? null : unit === "F" ? celsiusFromFahrenheit(v) : v;

/**
 * The log's rows as samples in canonical units (kPa gauge, differential pressure, lambda, kW,
 * °C, rpm, degrees): °F, psi, bar, absolute pressures, AFR and krpm converted here.
 */
export function samplesFromLog(log: Datalog, m: DatalogMapping): PullSample[] {
  const at = (c: string | undefined) => (c === undefined ? -1 : log.headers.indexOf(c));
  const i = {
    rpm: at(m.rpm),
    duty: at(m.duty.column),
    mix: at(m.mixture?.column),
    boost: at(m.boost?.column),
    fuel: at(m.fuelPressure?.column),
    power: at(m.power?.column),
    egt: (m.egt?.columns ?? []).map((c) => at(c)),
    exhaust: at(m.exhaustPressure?.column),
    turbo: at(m.turboSpeed?.column),
    iat: at(m.intakeTemp?.column),
    timing: at(m.timing?.column),
  };
  const v = (row: (number | null)[], idx: number) => (idx < 0 ? null : (row[idx] ?? null));
  return log.rows.map((row) => {
    const rawBoost = v(row, i.boost);
    const boostKpa =
      rawBoost === null || !m.boost
        ? null
        : rawBoost * KPA_PER[m.boost.unit] - (m.boost.kind === "absolute" ? ATMOSPHERE_KPA : 0);
    const rawFuel = v(row, i.fuel);
    const fuelKpa =
      rawFuel === null || !m.fuelPressure ? null : rawFuel * KPA_PER[m.fuelPressure.unit];
    const fuelDiffKpa =
      fuelKpa === null
        ? null
        : m.fuelPressure!.kind === "differential"
          ? fuelKpa
          : boostKpa === null
            ? null
            : fuelKpa - boostKpa;
    const mix = v(row, i.mix);
    const power = v(row, i.power);
    const duty = v(row, i.duty);
    return {
      rpm: v(row, i.rpm) ?? 0,
      dutyPct: m.duty.kind === "duty_pct" ? duty : null,
      pulseMs: m.duty.kind === "pulse_ms" ? duty : null,
      lambda:
        mix === null || !m.mixture
          ? null
          : m.mixture.kind === "lambda"
            ? mix
            : mix / m.mixture.afrStoich,
      boostKpa,
      fuelDiffKpa,
      powerKw: power === null || !m.power ? null : power * KW_PER[m.power.unit],
      ...(m.egt ? { egtC: i.egt.map((idx) => celsius(v(row, idx), m.egt!.unit)) } : {}),
      ...(m.exhaustPressure
        ? {
            exhaustKpa: ((raw) =>
              raw === null
                ? null
                : raw * KPA_PER[m.exhaustPressure!.unit] -
                  (m.exhaustPressure!.kind === "absolute" ? ATMOSPHERE_KPA : 0))(v(row, i.exhaust)),
          }
        : {}),
      ...(m.turboSpeed
        ? {
            turboRpm: ((raw) =>
              raw === null ? null : m.turboSpeed!.unit === "krpm" ? raw * 1000 : raw)(
              v(row, i.turbo),
            ),
          }
        : {}),
      ...(m.intakeTemp ? { intakeTempC: celsius(v(row, i.iat), m.intakeTemp.unit) } : {}),
      ...(m.timing ? { timingDeg: v(row, i.timing) } : {}),
    };
  });
}

/** The cylinder number a column names ("EGT 3" → 3); columns without one sort last. */
function cylinderOf(h: string): number {
  const n = /(\d+)(?!.*\d)/.exec(h);
  return n ? Number(n[1]) : Number.MAX_SAFE_INTEGER;
}

/** Below this (kPa) a pressure cannot be absolute in an exhaust manifold: the atmosphere at about 3000 m (ISA, from memory). */
export const EXHAUST_MIN_ABSOLUTE_KPA = 70;

/**
 * Whether a pressure column reads gauge or absolute, decided as a tuner would (docs/calculations.md
 * §6.5): its name or units row first ("psia", "abs", "kPa(a)" → absolute; "psig", "gauge" → gauge);
 * then its readings (a negative reading is gauge; an exhaust manifold never runs below the
 * atmosphere, so an exhaust reading under 70 kPa is gauge); else `otherwise` (boost: gauge, MAP:
 * absolute, exhaust: the boost's reference).
 * @example pressureReference(parseDatalog("RPM,EMAP\n3000,12\n"), "EMAP", "kPa", { exhaust: true, otherwise: "absolute" }) // { kind: "gauge", reason: "readings" }
 */
export function pressureReference(
  log: Datalog,
  header: string,
  unit: keyof typeof KPA_PER,
  how: { exhaust: boolean; otherwise: "gauge" | "absolute" },
): { kind: "gauge" | "absolute"; reason: "name" | "readings" | "otherwise" } {
  const i = log.headers.indexOf(header);
  const text = `${header} ${i >= 0 ? (log.units[i] ?? "") : ""}`;
  if (/gauge|psig|\bbarg\b|kpa ?\(?g\b|\(g\)/i.test(text)) return { kind: "gauge", reason: "name" };
  if (/\babs\b|absolute|psia|\bbara\b|kpa ?\(?a\b|\(a\)/i.test(text))
    return { kind: "absolute", reason: "name" };
  const floor = how.exhaust ? EXHAUST_MIN_ABSOLUTE_KPA : 0;
  if (i >= 0 && log.rows.some((r) => typeof r[i] === "number" && r[i]! * KPA_PER[unit] < floor))
    return { kind: "gauge", reason: "readings" };
  return { kind: how.otherwise, reason: "otherwise" };
}

/** A first guess from the headers and units row, for a logger the shop has not mapped yet. */
export function suggestMapping(log: Datalog): Partial<DatalogMapping> {
  const find = (re: RegExp) => log.headers.find((h) => re.test(h));
  const unitOf = (h: string | undefined) =>
    h ? (log.units[log.headers.indexOf(h)] ?? "").toLowerCase() : "";
  const pu = (h: string | undefined) =>
    (/psi/.test(unitOf(h) + (h ?? "").toLowerCase())
      ? "psi"
      : /bar/.test(unitOf(h) + (h ?? "").toLowerCase())
        ? "bar"
        : "kPa") as "kPa" | "bar" | "psi";
  const out: Partial<DatalogMapping> = {};
  const rpm = log.headers.find(
    (h) => /\b(rpm|engine ?speed)\b/i.test(h) && !/turbo|shaft|\btss\b/i.test(h),
  );
  if (rpm) out.rpm = rpm;
  const duty = find(/duty|\bidc\b/i);
  const pw = find(/pulse|\bipw\b|inj(ector)? ?(pw|time)/i);
  if (duty) out.duty = { column: duty, kind: "duty_pct" };
  else if (pw) out.duty = { column: pw, kind: "pulse_ms" };
  const lam = find(/lambda|\blam\b/i);
  const afr = find(/\bafr\b|air.?fuel/i);
  if (lam) out.mixture = { column: lam, kind: "lambda", afrStoich: 14.7 };
  else if (afr) out.mixture = { column: afr, kind: "afr", afrStoich: 14.7 };
  // Exhaust and temperature columns name "manifold" too: they are not the intake's pressure.
  const notIntake = (h: string) => /exhaust|\bemap\b|\begt\b|temp|back ?press/i.test(h);
  const map = log.headers.find((h) => /\bmap\b|manifold/i.test(h) && !notIntake(h));
  const boost = log.headers.find((h) => /boost/i.test(h) && !notIntake(h));
  if (boost)
    out.boost = {
      column: boost,
      kind: pressureReference(log, boost, pu(boost), { exhaust: false, otherwise: "gauge" }).kind,
      unit: pu(boost),
    };
  else if (map)
    out.boost = {
      column: map,
      kind: pressureReference(log, map, pu(map), { exhaust: false, otherwise: "absolute" }).kind,
      unit: pu(map),
    };
  const fp = find(/fuel ?(press|pres|pressure)|\bfp\b|rail/i);
  if (fp)
    out.fuelPressure = {
      column: fp,
      kind: /diff|delta/i.test(fp) ? "differential" : "rail",
      unit: pu(fp),
    };
  const eth = find(/ethanol|flex|\be ?%|\beth\b/i);
  if (eth) out.ethanol = { column: eth };
  const power = find(/power|\bwhp\b|\bhp\b|\bkw\b/i);
  if (power) out.power = { column: power, unit: /kw/i.test(power + unitOf(power)) ? "kW" : "hp" };
  const tu = (h: string) =>
    (/°?\s*f\b|fahrenheit/i.test(`${unitOf(h)} ${h}`) ? "F" : "C") as "C" | "F";
  const egts = log.headers
    .filter((h) => /egt|exhaust gas temp/i.test(h))
    .sort((a, b) => cylinderOf(a) - cylinderOf(b))
    .slice(0, MAX_EGT_COLUMNS);
  if (egts.length) out.egt = { columns: egts, unit: tu(egts[0]!) };
  const emap = find(/\bemap\b|exhaust ?(manifold )?press|back ?press|drive ?press/i);
  if (emap)
    out.exhaustPressure = {
      column: emap,
      // Read on the boost's reference unless the column says otherwise (§6.5).
      kind: pressureReference(log, emap, pu(emap), {
        exhaust: true,
        otherwise: out.boost?.kind ?? "gauge",
      }).kind,
      unit: pu(emap),
    };
  const turbo = find(/turbo ?(shaft )?speed|shaft ?speed|\btss\b|turbo ?rpm/i);
  if (turbo)
    out.turboSpeed = { column: turbo, unit: /krpm/i.test(turbo + unitOf(turbo)) ? "krpm" : "rpm" };
  const iat = find(/\biat\b|intake ?(air )?temp|charge ?temp|\bmat\b|\bact\b/i);
  if (iat) out.intakeTemp = { column: iat, unit: tu(iat) };
  const timing = find(/timing|ignition|spark ?adv|advance/i);
  if (timing) out.timing = { column: timing };
  return out;
}
