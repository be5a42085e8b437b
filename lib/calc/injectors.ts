import { CalcInputError, requirePositive, requireRange } from "./_lib/input-error";
import { clamp, interpolateLinear } from "./_lib/interpolate";
import { ATMOSPHERE_KPA, R_AIR_J_PER_KG_K } from "./constants";

/*
 * Injectors: orifice law, pressure across the injector, duty, pulse widths, dead time, idle.
 * docs/calculations.md §3.
 */

/** A regulator at a manifold pressure; `risingRateRatio` (default 1: 1:1) only for a referenced one. */
export interface RegulatorQuery {
  type: RegulatorType;
  basePressureKpa: number;
  manifoldKpa: number;
  /**
   * Fuel-pressure rise per unit of boost of a boost-referenced regulator: 1 for 1:1, up to 12
   * for a 1:12 rising-rate unit. Under vacuum the regulator follows the manifold 1:1.
   */
  risingRateRatio?: number;
}

/** Largest rising-rate ratio the library takes (1:12 units are the largest sold; 20 for slack). */
export const MAX_RISING_RATE_RATIO = 20;

const regulatorQuery = (q: RegulatorQuery): number => {
  if (q.type !== "boost-referenced" && q.type !== "fixed")
    throw new CalcInputError("type", "Regulator must be boost-referenced or fixed");
  requirePositive("basePressureKpa", q.basePressureKpa, 1e4, "Base pressure");
  requireRange("manifoldKpa", q.manifoldKpa, -ATMOSPHERE_KPA, 1e4, "Manifold pressure (gauge)");
  return q.risingRateRatio === undefined
    ? 1
    : requireRange(
        "risingRateRatio",
        q.risingRateRatio,
        1,
        MAX_RISING_RATE_RATIO,
        "Rising-rate ratio",
      );
};

/** What a rising-rate regulator adds above 1:1: (ratio − 1) × boost, none under vacuum. */
const risingRateExtra = (ratio: number, manifoldKpa: number): number =>
  ratio === 1 || manifoldKpa <= 0 ? 0 : (ratio - 1) * manifoldKpa;

/**
 * Flow of an injector at another differential pressure, by the orifice law
 * Q₂ = Q₁·√(ΔP₂/ΔP₁).
 * @example injectorFlowAtPressure({ ratedFlowCcPerMin: 1000, ratedPressureKpa: 300, differentialPressureKpa: 400 }) // 1154.7
 */
export function injectorFlowAtPressure(q: {
  ratedFlowCcPerMin: number;
  ratedPressureKpa: number;
  differentialPressureKpa: number;
}): number {
  requirePositive("ratedFlowCcPerMin", q.ratedFlowCcPerMin, 1e9, "Rated flow");
  requireRange("ratedPressureKpa", q.ratedPressureKpa, 1, 1e4, "Rated pressure");
  requireRange(
    "differentialPressureKpa",
    q.differentialPressureKpa,
    0,
    1e4,
    "Differential pressure",
  );
  return q.ratedFlowCcPerMin * Math.sqrt(q.differentialPressureKpa / q.ratedPressureKpa);
}

export type RegulatorType = "boost-referenced" | "fixed";

/**
 * Volume flow of the fuel through an injector rated with a test fluid of another density, at
 * the same pressure: an orifice passes Q = C·A·√(2ΔP/ρ), so Q_fuel = Q_test·√(ρ_test/ρ_fuel)
 * (mass flow goes with √(ρ_fuel/ρ_test)). docs/calculations.md §3.10.
 * @example injectorFlowForFuel({ flowCcPerMin: 1000, ratingFluidDensityKgPerL: 0.684, fuelDensityKgPerL: 0.787 }) // 932.3
 */
export function injectorFlowForFuel(q: {
  flowCcPerMin: number;
  ratingFluidDensityKgPerL: number;
  fuelDensityKgPerL: number;
}): number {
  requireRange("flowCcPerMin", q.flowCcPerMin, 0, 1e5, "Injector flow");
  requireRange(
    "ratingFluidDensityKgPerL",
    q.ratingFluidDensityKgPerL,
    0.1,
    2,
    "Rating fluid density",
  );
  requireRange("fuelDensityKgPerL", q.fuelDensityKgPerL, 0.1, 2, "Fuel density");
  return q.flowCcPerMin * Math.sqrt(q.ratingFluidDensityKgPerL / q.fuelDensityKgPerL);
}

/**
 * Pressure across the injector for a manifold pressure (kPa gauge: boost positive, vacuum
 * negative). A boost-referenced (1:1) regulator holds ΔP at the base pressure, a rising-rate
 * one (ratio r) adds (r − 1) × boost; a fixed one leaves the rail at base, so
 * ΔP = base − manifold (boost lowers it, vacuum raises it). A referenced rail that the vacuum
 * would pull below atmosphere sits at 0 kPa gauge, so ΔP is then 0 − manifold (more than base).
 * docs/calculations.md §3.2.
 * @example injectorDifferentialPressureKpa({ type: "fixed", basePressureKpa: 400, manifoldKpa: 150 }) // 250
 * @example injectorDifferentialPressureKpa({ type: "boost-referenced", basePressureKpa: 300, manifoldKpa: 100, risingRateRatio: 4 }) // 600
 */
export function injectorDifferentialPressureKpa(q: RegulatorQuery): number {
  const ratio = regulatorQuery(q);
  // Referenced: the rail follows the manifold, but a rail pulled below atmosphere sits at 0 kPa
  // gauge (railPressureKpa), so the pressure across is that rail less the manifold (§3.2).
  const dp =
    q.type === "boost-referenced"
      ? Math.max(q.basePressureKpa + risingRateExtra(ratio, q.manifoldKpa), -q.manifoldKpa)
      : q.basePressureKpa - q.manifoldKpa;
  if (dp <= 0)
    throw new CalcInputError(
      "basePressureKpa",
      `A fixed regulator set to ${q.basePressureKpa} kPa leaves no pressure across the injectors at ${q.manifoldKpa} kPa boost: the base pressure must exceed the boost`,
    );
  return dp;
}

/**
 * Rail pressure (kPa gauge) the pump must reach at a manifold pressure: referenced base +
 * boost (+ (r − 1) × boost for a rising-rate ratio r); fixed base.
 * @example railPressureKpa({ type: "boost-referenced", basePressureKpa: 300, manifoldKpa: 150 }) // 450
 */
export function railPressureKpa(q: RegulatorQuery): number {
  const ratio = regulatorQuery(q);
  const rail =
    q.type === "boost-referenced"
      ? q.basePressureKpa + q.manifoldKpa + risingRateExtra(ratio, q.manifoldKpa)
      : q.basePressureKpa;
  // A base pressure below the manifold vacuum cannot pull the rail below atmosphere: the
  // regulator closes and the rail sits at (about) 0 kPa gauge. Never a negative pressure.
  return rail < 0 ? 0 : rail;
}

/**
 * Injector duty (%) to deliver a fuel mass flow: duty = ṁ / (ρ · n · Q_op).
 * @example injectorDutyPct({ fuelMassFlowGPerMin: 3000, densityKgPerL: 0.787, injectorCount: 6, flowAtOperatingCcPerMin: 1000 }) // 63.5
 */
export function injectorDutyPct(q: {
  fuelMassFlowGPerMin: number;
  densityKgPerL: number;
  injectorCount: number;
  flowAtOperatingCcPerMin: number;
}): number {
  requireRange("fuelMassFlowGPerMin", q.fuelMassFlowGPerMin, 0, 1e7, "Fuel mass flow");
  requireRange("densityKgPerL", q.densityKgPerL, 0.1, 2, "Fuel density");
  requireCount("injectorCount", q.injectorCount);
  requireRange("flowAtOperatingCcPerMin", q.flowAtOperatingCcPerMin, 0.01, 1e5, "Injector flow");
  return (
    (100 * q.fuelMassFlowGPerMin) / (q.densityKgPerL * q.injectorCount * q.flowAtOperatingCcPerMin)
  );
}

/**
 * Flow each injector must deliver at its operating pressure to carry ṁ at the design duty:
 * Q_req = ṁ / (ρ · n · duty).
 * @example requiredInjectorFlowCcPerMin({ fuelMassFlowGPerMin: 3000, densityKgPerL: 0.787, injectorCount: 6, designDutyPct: 80 }) // 794.2
 */
export function requiredInjectorFlowCcPerMin(q: {
  fuelMassFlowGPerMin: number;
  densityKgPerL: number;
  injectorCount: number;
  designDutyPct: number;
}): number {
  requireRange("fuelMassFlowGPerMin", q.fuelMassFlowGPerMin, 0, 1e7, "Fuel mass flow");
  requireRange("densityKgPerL", q.densityKgPerL, 0.1, 2, "Fuel density");
  requireCount("injectorCount", q.injectorCount);
  requireRange("designDutyPct", q.designDutyPct, 1, 100, "Design duty");
  return q.fuelMassFlowGPerMin / (q.densityKgPerL * q.injectorCount * (q.designDutyPct / 100));
}

/**
 * Power a set of injectors supports at a duty: P = duty × n × Q_op × ρ × 60 ÷ BSFC (kW).
 * @example injectorPowerCeilingKw({ dutyPct: 80, injectorCount: 6, flowAtOperatingCcPerMin: 1000, densityKgPerL: 0.787, bsfcGPerKwh: 486.6 }) // 465.9
 */
export function injectorPowerCeilingKw(q: {
  dutyPct: number;
  injectorCount: number;
  flowAtOperatingCcPerMin: number;
  densityKgPerL: number;
  bsfcGPerKwh: number;
}): number {
  requireRange("dutyPct", q.dutyPct, 0, 100, "Duty");
  requireCount("injectorCount", q.injectorCount);
  requireRange("flowAtOperatingCcPerMin", q.flowAtOperatingCcPerMin, 0, 1e5, "Injector flow");
  requireRange("densityKgPerL", q.densityKgPerL, 0.1, 2, "Fuel density");
  requirePositive("bsfcGPerKwh", q.bsfcGPerKwh, 2000, "BSFC");
  const duty = q.dutyPct / 100;
  return (
    (duty * q.injectorCount * q.flowAtOperatingCcPerMin * q.densityKgPerL * 60) / q.bsfcGPerKwh
  );
}

/** The band a duty falls in (docs/calculations.md §3.3): static at 100 % and above. */
export type DutyBand = "ok" | "caution" | "danger" | "static";

/**
 * Duty band by the shop's caution and danger levels: above danger is danger, above caution is
 * caution, 100 % or more is static (the injector never closes).
 * @example dutyBand(86, { dutyCautionPct: 80, dutyDangerPct: 90 }) // "caution"
 */
export function dutyBand(
  dutyPct: number,
  levels: { dutyCautionPct: number; dutyDangerPct: number },
): DutyBand {
  requireRange("dutyPct", dutyPct, 0, 1e6, "Duty");
  return dutyPct >= 100
    ? "static"
    : dutyPct > levels.dutyDangerPct
      ? "danger"
      : dutyPct > levels.dutyCautionPct
        ? "caution"
        : "ok";
}

/**
 * Effective (opening) pulse width for a duty: duty × cycle.
 * @example effectivePulseWidthMs({ dutyPct: 80, cycleMs: 20 }) // 16
 */
export function effectivePulseWidthMs(q: { dutyPct: number; cycleMs: number }): number {
  requireRange("dutyPct", q.dutyPct, 0, 1e6, "Duty");
  requireRange("cycleMs", q.cycleMs, 0, 1e6, "Cycle time");
  return (q.dutyPct / 100) * q.cycleMs;
}

/**
 * Opening time to deliver a fuel mass per injection: t = m ÷ (ρ × Q) (ms, m in mg).
 * @example pulseWidthForFuelMs({ fuelMg: 10, densityKgPerL: 0.745, flowCcPerMin: 500 }) // 1.611
 */
export function pulseWidthForFuelMs(q: {
  fuelMg: number;
  densityKgPerL: number;
  flowCcPerMin: number;
}): number {
  requireRange("fuelMg", q.fuelMg, 0, 1e6, "Fuel per injection");
  requireRange("densityKgPerL", q.densityKgPerL, 0.1, 2, "Fuel density");
  requirePositive("flowCcPerMin", q.flowCcPerMin, 1e5, "Injector flow");
  return (q.fuelMg / 1000 / q.densityKgPerL / q.flowCcPerMin) * 60000;
}

/**
 * Fuel an engine burns at idle, L/h: fuel per cylinder per cycle × cylinders × rpm ÷ 2 ÷ ρ.
 * @example idleFuelConsumptionLPerH({ fuelPerCylinderMg: 10, cylinders: 4, rpm: 850, densityKgPerL: 0.745 }) // 1.369
 */
export function idleFuelConsumptionLPerH(q: {
  fuelPerCylinderMg: number;
  cylinders: number;
  rpm: number;
  densityKgPerL: number;
}): number {
  requireRange("fuelPerCylinderMg", q.fuelPerCylinderMg, 0, 1e6, "Fuel per cylinder");
  requireCount("cylinders", q.cylinders);
  requireRange("rpm", q.rpm, 0, 30000, "Engine speed");
  requireRange("densityKgPerL", q.densityKgPerL, 0.1, 2, "Fuel density");
  return ((q.fuelPerCylinderMg * q.cylinders * (q.rpm / 2)) / 1000 / q.densityKgPerL) * 0.06;
}

/** Length of one four-stroke cycle in ms: 120 000 / rpm. @example cycleTimeMs(6000) // 20 */
export function cycleTimeMs(rpm: number): number {
  requireRange("rpm", rpm, 1, 30000, "Engine speed");
  return 120000 / rpm;
}

/** A dead-time (latency) table: rows by battery voltage, columns by differential pressure. */
export interface DeadTimeTable {
  voltages: number[];
  pressuresKpa: number[];
  /** deadTimeMs[i][j] at voltages[i] and pressuresKpa[j]. */
  deadTimeMs: number[][];
}

/**
 * Dead time by bilinear interpolation in voltage and ΔP, held at the table's edges outside it
 * (then `outOfRange` is true).
 * @example deadTimeMs({ voltages: [12, 14], pressuresKpa: [300, 400], deadTimeMs: [[1.0, 1.1], [0.8, 0.9]] }, 13, 350) // { value: 0.95, outOfRange: false }
 */
export function deadTimeMs(
  table: DeadTimeTable,
  voltage: number,
  pressureKpa: number,
): { value: number; outOfRange: boolean } {
  const { voltages, pressuresKpa, deadTimeMs: grid } = table;
  requireRange("voltage", voltage, 0, 60, "Injector voltage");
  requireRange("pressureKpa", pressureKpa, 0, 1e4, "Pressure across the injector");
  if (!Array.isArray(voltages) || !Array.isArray(pressuresKpa) || !Array.isArray(grid))
    throw new CalcInputError("deadTime", "A dead-time table needs voltages, pressures and values");
  if (
    voltages.length === 0 ||
    pressuresKpa.length === 0 ||
    grid.length !== voltages.length ||
    grid.some((r) => r.length !== pressuresKpa.length)
  ) {
    throw new CalcInputError(
      "deadTime",
      "The dead-time table needs one row per voltage and one value per pressure",
    );
  }
  const rising = (xs: number[], field: string, label: string) =>
    xs.forEach((x, i) => {
      requireRange(`deadTime.${field}.${i}`, x, 0, 1e4, label);
      if (i > 0 && !(x > xs[i - 1]!))
        throw new CalcInputError(
          `deadTime.${field}.${i}`,
          `${label}s must rise from one column to the next, each once`,
        );
    });
  rising(voltages, "voltages", "Dead-time voltage");
  rising(pressuresKpa, "pressuresKpa", "Dead-time pressure");
  grid.forEach((row, i) =>
    row.forEach((x, j) => requireRange(`deadTime.deadTimeMs.${i}.${j}`, x, 0, 100, "Dead time")),
  );
  const v = clamp(voltage, voltages[0]!, voltages[voltages.length - 1]!);
  const p = clamp(pressureKpa, pressuresKpa[0]!, pressuresKpa[pressuresKpa.length - 1]!);
  const outOfRange = v !== voltage || p !== pressureKpa;
  // Interpolate each row in pressure, then the column of results in voltage.
  const column = grid.map((row) => interpolateLinear(pressuresKpa, row, p).value);
  return { value: interpolateLinear(voltages, column, v).value, outOfRange };
}

export interface IdleFuelQuery {
  displacementL: number;
  cylinders: number;
  volumetricEfficiency: number;
  manifoldKpaAbs: number;
  intakeTempC: number;
  stoichAfr: number;
}

/**
 * Air mass per cylinder per cycle (ideal gas) and the fuel for λ = 1, in mg:
 * m_air = (V_d / z) · VE · p_MAP / (R · T).
 * @example idleFuelPerCylinderMg({ displacementL: 2, cylinders: 4, volumetricEfficiency: 0.8, manifoldKpaAbs: 35, intakeTempC: 30, stoichAfr: 14.7 }) // { airMg: 161.0, fuelMg: 10.95 }
 */
export function idleFuelPerCylinderMg(q: IdleFuelQuery): { airMg: number; fuelMg: number } {
  requirePositive("displacementL", q.displacementL, 100, "Displacement");
  requireCount("cylinders", q.cylinders);
  requirePositive("volumetricEfficiency", q.volumetricEfficiency, 2, "Volumetric efficiency");
  requirePositive("manifoldKpaAbs", q.manifoldKpaAbs, 1e3, "Manifold pressure (absolute)");
  requireRange("intakeTempC", q.intakeTempC, -100, 300, "Intake air temperature");
  requirePositive("stoichAfr", q.stoichAfr, 30, "Stoichiometric AFR");
  const cylinderVolumeM3 = q.displacementL / 1000 / q.cylinders;
  const airKg =
    (cylinderVolumeM3 * q.volumetricEfficiency * q.manifoldKpaAbs * 1000) /
    (R_AIR_J_PER_KG_K * (q.intakeTempC + 273.15));
  const airMg = airKg * 1e6;
  return { airMg, fuelMg: airMg / q.stoichAfr };
}

/**
 * Manifold pressure in kPa gauge from an absolute reading, against the ambient (barometric)
 * pressure — the standard atmosphere unless given. docs/calculations.md §3.7.
 * @example gaugeFromAbsKpa(35, 95) // -60
 */
export function gaugeFromAbsKpa(absKpa: number, ambientKpaAbs: number = ATMOSPHERE_KPA): number {
  requireRange("absKpa", absKpa, 0, 1e4, "Absolute pressure");
  requirePositive("ambientKpaAbs", ambientKpaAbs, 200, "Ambient pressure");
  return absKpa - ambientKpaAbs;
}

function requireCount(field: string, n: number): number {
  requirePositive(field, n, 1000, field === "cylinders" ? "Cylinders" : "Injector count");
  if (!Number.isInteger(n)) throw new CalcInputError(field, `${field} must be a whole number`);
  return n;
}
