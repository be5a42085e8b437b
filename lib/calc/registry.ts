// Reference: docs/calculations.md §9.

import {
  ASPIRATION_LABELS,
  BLEND_END_LABELS,
  BSFC_SOURCE_LABELS,
  CEILING_SEVERITY_LABELS,
  DRIVE_TYPE_LABELS,
  DUTY_BAND_LABELS,
  FLOW_REGIME_LABELS,
  LIMITED_BY_LABELS,
  MEASURED_AT_LABELS,
  REGULATOR_LABELS,
} from "./code-labels";
import { ASPIRATIONS, REGULATOR_TYPES } from "./input-codes";
import {
  converter,
  formatValue,
  fromShown,
  ownDecimals,
  QUANTITIES,
  toShown,
  type Quantity,
} from "./quantities";
import type { UnitSystem } from "./units";

export {
  ASPIRATION_LABELS,
  REGULATOR_LABELS,
  MEASURED_AT_LABELS,
  DRIVE_TYPE_LABELS,
  DUTY_BAND_LABELS,
  LIMITED_BY_LABELS,
  CEILING_SEVERITY_LABELS,
  BSFC_SOURCE_LABELS,
  BLEND_END_LABELS,
  FLOW_REGIME_LABELS,
} from "./code-labels";

/**
 * The one registry of the sizing's fields: every input path of the schema and every figure of a
 * sizing result has a label, a quantity (so its canonical unit and its display in each unit
 * system) or the labels of its codes. The editor, the results, the revision view, compare, the
 * spec sheet and the error messages all name and format fields through it.
 *
 * Paths are dotted; array indices are written `*`, and a label's `#` marks take the 1-based
 * indices in order ("Pump # curve # point # flow" → "Pump 1 curve 2 point 3 flow").
 */
export interface FieldSpec {
  /** The field's name on its own ("Feed line inside diameter"). */
  label: string;
  /** Its name inside its form section ("Inside diameter"), where that differs. */
  short?: string;
  /** For numbers: what kind, hence unit and precision. */
  quantity?: Quantity;
  /** Overrides the quantity's precision (units alike in both systems only: %, ms, V). */
  decimals?: number;
  /** For codes: the label of each. */
  options?: Readonly<Record<string, string>>;
  /** Free text (a pump's own name). */
  text?: true;
  /** A yes/no figure. */
  flag?: true;
  /** Results: which way is better when two revisions are compared. */
  better?: "higher" | "lower";
}

const line = (side: "feed" | "return"): Record<string, FieldSpec> => {
  const L = side === "feed" ? "Feed line" : "Return line";
  return {
    [`lines.${side}`]: { label: L },
    [`lines.${side}.insideDiameterMm`]: {
      label: `${L} inside diameter`,
      short: "Inside diameter",
      quantity: "diameter",
    },
    [`lines.${side}.lengthM`]: { label: `${L} length`, short: "Length", quantity: "length" },
    [`lines.${side}.roughnessMm`]: {
      label: `${L} roughness`,
      short: "Roughness",
      quantity: "roughness",
    },
    [`lines.${side}.fittingsK`]: {
      label: `${L} fittings (sum of K)`,
      short: "Fittings (sum of K)",
      quantity: "lossCoefficient",
    },
  };
};

/** Every input of the sizing schema (and the groups that hold them, for messages about a group). */
export const INPUT_FIELDS: Readonly<Record<string, FieldSpec>> = {
  engine: { label: "Engine" },
  "engine.cylinders": { label: "Cylinders", quantity: "count" },
  "engine.displacementL": { label: "Displacement", quantity: "displacement" },
  "engine.aspiration": { label: "Aspiration", options: ASPIRATION_LABELS },
  "engine.redlineRpm": { label: "Redline", quantity: "speed" },
  "engine.idleRpm": { label: "Idle speed", short: "Idle", quantity: "speed" },
  "engine.maxBoostKpa": { label: "Boost", quantity: "pressure" },
  "engine.idleManifoldKpaAbs": { label: "Idle manifold pressure", quantity: "pressureAbs" },
  "engine.idleVolumetricEfficiency": { label: "Idle volumetric efficiency", quantity: "ratio" },
  "engine.intakeTempC": { label: "Intake air temperature", quantity: "temperature" },
  "engine.ambientKpaAbs": { label: "Ambient (barometric) pressure", quantity: "pressureAbs" },
  target: { label: "Power goal" },
  "target.powerKw": { label: "Target power", quantity: "power" },
  "target.measuredAt": {
    label: "Power measured at",
    short: "Measured at",
    options: MEASURED_AT_LABELS,
  },
  "target.drivetrainLossPct": { label: "Drivetrain loss", quantity: "percent", decimals: 0 },
  "target.driveType": { label: "Drive type", options: DRIVE_TYPE_LABELS },
  fuel: { label: "Fuel" },
  "fuel.ethanolMinVolPct": {
    label: "Lowest ethanol content",
    short: "Lowest ethanol",
    quantity: "ethanol",
  },
  "fuel.ethanolMaxVolPct": {
    label: "Highest ethanol content",
    short: "Highest ethanol",
    quantity: "ethanol",
  },
  "fuel.bsfcGPerKwh": { label: "BSFC", short: "BSFC (blank: rule of thumb)", quantity: "bsfc" },
  "fuel.bsfcEthanolVolPct": {
    label: "Ethanol content the BSFC was taken at",
    short: "BSFC taken at (blank: lowest ethanol)",
    quantity: "ethanol",
  },
  "fuel.targetLambda": {
    label: "Target lambda",
    short: "Target lambda (blank: reference)",
    quantity: "lambda",
  },
  "fuel.properties": { label: "Fuel properties" },
  "fuel.properties.gasoline": { label: "Gasoline properties" },
  "fuel.properties.gasoline.densityKgPerL": { label: "Gasoline density", quantity: "density" },
  "fuel.properties.gasoline.stoichAfr": { label: "Gasoline stoichiometric AFR", quantity: "afr" },
  "fuel.properties.ethanol": { label: "Ethanol properties" },
  "fuel.properties.ethanol.densityKgPerL": { label: "Ethanol density", quantity: "density" },
  "fuel.properties.ethanol.stoichAfr": { label: "Ethanol stoichiometric AFR", quantity: "afr" },
  "fuel.bsfcDefaults": { label: "BSFC defaults" },
  "fuel.bsfcDefaults.gasolineNaGPerKwh": { label: "BSFC default, gasoline NA", quantity: "bsfc" },
  "fuel.bsfcDefaults.gasolineBoostedGPerKwh": {
    label: "BSFC default, gasoline boosted",
    quantity: "bsfc",
  },
  "fuel.bsfcDefaults.e85NaGPerKwh": { label: "BSFC default, E85 NA", quantity: "bsfc" },
  "fuel.bsfcDefaults.e85BoostedGPerKwh": { label: "BSFC default, E85 boosted", quantity: "bsfc" },
  "fuel.bsfcDefaults.referenceLambdaNa": { label: "Reference lambda, NA", quantity: "lambda" },
  "fuel.bsfcDefaults.referenceLambdaBoosted": {
    label: "Reference lambda, boosted",
    quantity: "lambda",
  },
  injectors: { label: "Injectors" },
  "injectors.count": { label: "Injector count", short: "Injectors", quantity: "count" },
  "injectors.ratedFlowCcPerMin": {
    label: "Injector rated flow",
    short: "Rated flow",
    quantity: "injectorFlow",
  },
  "injectors.ratedPressureKpa": {
    label: "Injector rated pressure",
    short: "Rated at",
    quantity: "pressure",
  },
  "injectors.minPulseWidthMs": { label: "Minimum pulse width", quantity: "time" },
  "injectors.ratingFluidDensityKgPerL": {
    label: "Density of the injector's rating fluid (blank: rated with the fuel)",
    short: "Rating fluid density (blank: the fuel)",
    quantity: "density",
  },
  "injectors.deadTime": { label: "Dead-time table" },
  "injectors.deadTime.voltages": { label: "Dead-time voltages" },
  "injectors.deadTime.voltages.*": { label: "Dead-time voltage, row #", quantity: "voltage" },
  "injectors.deadTime.pressuresKpa": { label: "Dead-time pressures" },
  "injectors.deadTime.pressuresKpa.*": {
    label: "Dead-time pressure, column #",
    quantity: "pressure",
  },
  "injectors.deadTime.deadTimeMs": { label: "Dead-time table" },
  "injectors.deadTime.deadTimeMs.*": { label: "Dead-time row #" },
  "injectors.deadTime.deadTimeMs.*.*": { label: "Dead time at row #, column #", quantity: "time" },
  regulator: { label: "Regulator" },
  "regulator.type": { label: "Regulator", options: REGULATOR_LABELS },
  "regulator.basePressureKpa": { label: "Base pressure", quantity: "pressure" },
  "regulator.bypass": { label: "Regulator bypass rating" },
  "regulator.bypass.flowLPerH": {
    label: "Regulator bypass flow (rated)",
    short: "Bypass flow (rated)",
    quantity: "volumeFlow",
  },
  "regulator.bypass.atPressureKpa": {
    label: "Regulator bypass rated at",
    short: "Bypass flow rated at",
    quantity: "pressure",
  },
  "regulator.risingRateRatio": {
    label: "Rising-rate ratio (fuel pressure per unit of boost)",
    short: "Rising-rate ratio",
    quantity: "risingRate",
  },
  pumps: { label: "Pumps" },
  "pumps.*": { label: "Pump #" },
  "pumps.*.label": { label: "Pump # name", text: true },
  "pumps.*.quantity": {
    label: "Pump #: how many in parallel",
    short: "Pumps in parallel",
    quantity: "count",
  },
  "pumps.*.curves": { label: "Pump # flow curves" },
  "pumps.*.curves.*": { label: "Pump # curve #" },
  "pumps.*.curves.*.voltage": {
    label: "Pump # curve # voltage",
    short: "Curve tested at",
    quantity: "voltage",
  },
  "pumps.*.curves.*.points": { label: "Pump # curve # points" },
  "pumps.*.curves.*.points.*": { label: "Pump # curve # point #" },
  "pumps.*.curves.*.points.*.pressureKpa": {
    label: "Pump # curve # point # pressure",
    short: "Point # pressure",
    quantity: "pressure",
  },
  "pumps.*.curves.*.points.*.flowLPerH": {
    label: "Pump # curve # point # flow",
    short: "Point # flow",
    quantity: "volumeFlow",
  },
  "pumps.*.switchOnBoostKpa": {
    label: "Pump #: switches on at boost (blank: always on)",
    short: "Switches on at boost (blank: always on)",
    quantity: "pressure",
  },
  electrical: { label: "Electrical" },
  "electrical.voltageAtPump": { label: "Voltage at the pump", quantity: "voltage" },
  "electrical.injectorVoltage": {
    label: "Voltage at the injectors (battery, charging)",
    short: "Voltage at the injectors",
    quantity: "voltage",
  },
  "electrical.wiring": { label: "Pump wiring" },
  "electrical.wiring.sourceVoltage": {
    label: "Wiring: supply voltage",
    short: "Supply voltage (charging)",
    quantity: "voltage",
  },
  "electrical.wiring.gaugeAwg": {
    label: "Wiring: gauge",
    short: "Wire gauge",
    quantity: "wireGauge",
  },
  "electrical.wiring.roundTripLengthM": {
    label: "Wiring: length there and back",
    short: "Wire length, there and back",
    quantity: "length",
  },
  "electrical.wiring.currentA": {
    label: "Wiring: pump current",
    short: "Pump current",
    quantity: "current",
  },
  lines: { label: "Lines" },
  ...line("feed"),
  ...line("return"),
  filters: { label: "Filters" },
  "filters.prePumpDropKpa": {
    label: "Pre-pump filter drop (suction side)",
    short: "Pre-pump filter drop",
    quantity: "pressureDrop",
  },
  "filters.postPumpDropKpa": {
    label: "Post-pump filter drop (pump to rail)",
    short: "Post-pump filter drop",
    quantity: "pressureDrop",
  },
  limits: { label: "Limits" },
  "limits.designDutyPct": { label: "Design duty", quantity: "percent", decimals: 0 },
  "limits.dutyCautionPct": { label: "Duty caution level", quantity: "percent", decimals: 0 },
  "limits.dutyDangerPct": { label: "Duty danger level", quantity: "percent", decimals: 0 },
  "limits.minPumpMarginPct": { label: "Minimum pump margin", quantity: "percent", decimals: 0 },
  "limits.maxLineDropKpa": { label: "Line drop limit", quantity: "pressureDrop" },
};

const pulse = (prefix: string, at: string): Record<string, FieldSpec> => ({
  [`${prefix}.rpm`]: { label: `Engine speed ${at}`, quantity: "speed" },
  [`${prefix}.cycleMs`]: { label: `Cycle time ${at}`, quantity: "time" },
  [`${prefix}.effectiveMs`]: { label: `Effective pulse width ${at}`, quantity: "time" },
  [`${prefix}.deadTimeMs`]: { label: `Injector dead time ${at}`, quantity: "time" },
  [`${prefix}.commandedMs`]: { label: `Commanded pulse width ${at}`, quantity: "time" },
});
const blendEnd = (which: "lean" | "rich"): Record<string, FieldSpec> => {
  const end = which === "lean" ? "lowest ethanol" : "highest ethanol";
  const at = `at the ${end}`;
  const p = `blend.${which}`;
  return {
    [`${p}.ethanolVolPct`]: { label: `Ethanol content, ${end} end`, quantity: "ethanol" },
    [`${p}.densityKgPerL`]: { label: `Fuel density ${at}`, quantity: "density" },
    [`${p}.stoichAfr`]: { label: `Stoichiometric AFR ${at}`, quantity: "afr" },
    [`${p}.bsfcGPerKwh`]: { label: `BSFC ${at}`, quantity: "bsfc" },
    [`${p}.bsfcSource`]: { label: `BSFC source ${at}`, options: BSFC_SOURCE_LABELS },
    [`${p}.fuelMassFlowGPerMin`]: { label: `Fuel needed ${at}`, quantity: "massFlow" },
    [`${p}.fuelVolumeFlowLPerH`]: { label: `Fuel volume needed ${at}`, quantity: "volumeFlow" },
    [`${p}.requiredFlowAtOperatingCcPerMin`]: {
      label: `Flow each injector must give ${at}`,
      quantity: "injectorFlow",
    },
    [`${p}.requiredRatedFlowCcPerMin`]: {
      label: `Smallest injector rating ${at}`,
      quantity: "injectorFlow",
    },
    [`${p}.injectorFlowCcPerMin`]: {
      label: `Injector flow of the fuel ${at}`,
      quantity: "injectorFlow",
    },
    [`${p}.dutyPct`]: { label: `Injector duty ${at}`, quantity: "percent", better: "lower" },
    [`${p}.powerCeilingKw`]: {
      label: `Injector power ceiling ${at}`,
      quantity: "power",
      better: "higher",
    },
    ...pulse(`${p}.pulseWidthRedline`, `at redline (${end})`),
  };
};
const lineResult = (side: "feed" | "return"): Record<string, FieldSpec> => {
  const L = side === "feed" ? "Feed line" : "Return line";
  const p = `lines.${side}`;
  return {
    [p]: { label: L },
    [`${p}.velocityMPerS`]: { label: `${L} velocity`, quantity: "velocity" },
    [`${p}.reynolds`]: { label: `${L} Reynolds number`, quantity: "reynolds" },
    [`${p}.regime`]: { label: `${L} flow`, options: FLOW_REGIME_LABELS },
    [`${p}.frictionFactor`]: { label: `${L} friction factor`, quantity: "frictionFactor" },
    [`${p}.pressureDropKpa`]: {
      label: `${L} pressure drop`,
      quantity: "pressureDrop",
      better: "lower",
    },
    [`${p}.flowLPerH`]: {
      label: side === "feed" ? "Feed line flow at full load" : "Return line flow at idle",
      quantity: "volumeFlow",
    },
    [`${p}.insideDiameterMm`]: { label: `${L} inside diameter`, quantity: "diameter" },
    [`${p}.lengthM`]: { label: `${L} length`, quantity: "length" },
    [`${p}.withinLimit`]: { label: `${L} drop within the limit`, flag: true },
  };
};

/** Every figure of a sizing result (warnings and working steps carry their own quantities). */
export const RESULT_FIELDS: Readonly<Record<string, FieldSpec>> = {
  calcVersion: { label: "Calculation library version", text: true },
  wheelPowerKw: { label: "Wheel power", quantity: "power" },
  crankPowerKw: { label: "Crank power", quantity: "power" },
  fuelMassFlowGPerMin: { label: "Fuel needed (worse end of the blend)", quantity: "massFlow" },
  fuelVolumeFlowLPerH: {
    label: "Fuel volume needed (worse end of the blend)",
    quantity: "volumeFlow",
  },
  ...blendEnd("lean"),
  ...blendEnd("rich"),
  "blend.worstEnd": { label: "Worse end of the blend", options: BLEND_END_LABELS },
  "injector.count": { label: "Injectors", quantity: "count" },
  "injector.differentialPressureKpa": {
    label: "Pressure across the injectors at full boost",
    quantity: "pressure",
  },
  "injector.flowAtOperatingCcPerMin": {
    label: "Injector flow at that pressure",
    quantity: "injectorFlow",
  },
  "injector.requiredFlowAtOperatingCcPerMin": {
    label: "Flow each injector must give",
    quantity: "injectorFlow",
  },
  "injector.requiredRatedFlowCcPerMin": {
    label: "Smallest injector rating",
    quantity: "injectorFlow",
  },
  "injector.dutyPct": {
    label: "Duty at the worse end of the blend",
    quantity: "percent",
    better: "lower",
  },
  "injector.dutyBand": { label: "Duty verdict", options: DUTY_BAND_LABELS },
  "injector.powerCeilingKw": {
    label: "Injector power ceiling",
    quantity: "power",
    better: "higher",
  },
  ...pulse("injector.pulseWidthRedline", "at redline"),
  ...pulse("injector.pulseWidthIdle", "at idle"),
  "injector.pulseWidthIdle.differentialPressureKpa": {
    label: "Pressure across the injectors at idle",
    quantity: "pressure",
  },
  "injector.pulseWidthIdle.minPulseWidthMs": {
    label: "Injectors' minimum pulse width",
    quantity: "time",
  },
  "injector.pulseWidthIdle.fuelPerInjectionMg": {
    label: "Fuel per injection at idle",
    quantity: "mass",
    decimals: 2,
  },
  "regulator.type": { label: "Regulator", options: REGULATOR_LABELS },
  "regulator.risingRateRatio": { label: "Rising-rate ratio", quantity: "risingRate" },
  "regulator.bypassCapacityAtIdleLPerH": {
    label: "Regulator bypass capacity at the idle rail pressure",
    quantity: "volumeFlow",
    better: "higher",
  },
  "regulator.pressureVsBoost.*.boostKpa": { label: "Boost, point #", quantity: "pressure" },
  "regulator.pressureVsBoost.*.railKpa": {
    label: "Rail pressure at boost point #",
    quantity: "pressure",
  },
  "regulator.pressureVsBoost.*.differentialKpa": {
    label: "Pressure across the injectors at boost point #",
    quantity: "pressure",
  },
  "pump.voltageUsed": { label: "Voltage at the pump", quantity: "voltage" },
  "injector.voltage": { label: "Voltage at the injectors", quantity: "voltage" },
  "pump.wireDropV": {
    label: "Pump wiring drop",
    quantity: "voltage",
    decimals: 2,
    better: "lower",
  },
  "pump.railPressureKpa": { label: "Rail pressure", quantity: "pressure" },
  "pump.outletPressureKpa": { label: "Pressure the pump works against", quantity: "pressure" },
  "pump.demandLPerH": { label: "Pump demand (worse end of the blend)", quantity: "volumeFlow" },
  "pump.supplyLPerH": { label: "Pump supply", quantity: "volumeFlow", better: "higher" },
  "pump.marginPct": {
    label: "Pump margin",
    quantity: "percent",
    decimals: 0,
    better: "higher",
  },
  "pump.fullLoadMarginPct": {
    label: "Pump margin at full boost",
    quantity: "percent",
    decimals: 0,
    better: "higher",
  },
  "pump.worstMarginBoostKpa": {
    label: "Boost where the pump margin is worst",
    quantity: "pressure",
  },
  "pump.supplyVsBoost.*.boostKpa": { label: "Boost, supply point #", quantity: "pressure" },
  "pump.supplyVsBoost.*.outletKpa": {
    label: "Pump outlet pressure at supply point #",
    quantity: "pressure",
  },
  "pump.supplyVsBoost.*.supplyLPerH": {
    label: "Pump supply at supply point #",
    quantity: "volumeFlow",
  },
  "pump.supplyVsBoost.*.demandLPerH": {
    label: "Fuel demand at supply point #",
    quantity: "volumeFlow",
  },
  "pump.supplyVsBoost.*.marginPct": {
    label: "Pump margin at supply point #",
    quantity: "percent",
    decimals: 0,
  },
  "pump.supplyVsBoost.*.pumpsOn": { label: "Pumps running at supply point #", quantity: "count" },
  "pump.returnFlowLPerH": { label: "Return flow at full load", quantity: "volumeFlow" },
  "pump.powerCeilingKw": { label: "Pump power ceiling", quantity: "power", better: "higher" },
  "pump.idleRailPressureKpa": { label: "Rail pressure at idle", quantity: "pressure" },
  "pump.idleSupplyLPerH": { label: "Pump supply at idle", quantity: "volumeFlow" },
  "pump.idleReturnFlowLPerH": { label: "Return flow at idle", quantity: "volumeFlow" },
  ...lineResult("feed"),
  ...lineResult("return"),
  "lines.recommendedFeedDash": { label: "Recommended feed line", quantity: "anDash" },
  "lines.recommendedReturnDash": { label: "Recommended return line", quantity: "anDash" },
  "lines.assumedLengthM": { label: "Line length assumed", quantity: "length" },
  "powerCeiling.kw": { label: "Power ceiling (crank)", quantity: "power", better: "higher" },
  "powerCeiling.limitedBy": { label: "Limited by", options: LIMITED_BY_LABELS },
  "powerCeiling.severity": { label: "Power ceiling verdict", options: CEILING_SEVERITY_LABELS },
  "powerCeiling.headroomPct": {
    label: "Headroom over the target",
    quantity: "percent",
    decimals: 0,
    better: "higher",
  },
  "limits.designDutyPct": { label: "Design duty", quantity: "percent", decimals: 0 },
  "limits.dutyCautionPct": { label: "Duty caution level", quantity: "percent", decimals: 0 },
  "limits.dutyDangerPct": { label: "Duty danger level", quantity: "percent", decimals: 0 },
  "limits.minPumpMarginPct": { label: "Minimum pump margin", quantity: "percent", decimals: 0 },
  "limits.maxLineDropKpa": { label: "Line drop limit", quantity: "pressureDrop" },
};

/** The figures compare puts side by side, in order. */
export const KEY_FIGURES = [
  "blend.rich.dutyPct",
  "blend.lean.dutyPct",
  "injector.requiredRatedFlowCcPerMin",
  "pump.demandLPerH",
  "pump.supplyLPerH",
  "pump.marginPct",
  "pump.railPressureKpa",
  "powerCeiling.kw",
  "powerCeiling.headroomPct",
] as const;

/** A registry entry with its `#` marks filled, or undefined for a path it does not know. */
export interface Field extends FieldSpec {
  path: string;
}

function lookup(table: Readonly<Record<string, FieldSpec>>, path: string): Field | undefined {
  const indices: number[] = [];
  const pattern = path.replace(/(^|\.)(\d+)(?=\.|$)/g, (_m, dot: string, i: string) => {
    indices.push(Number(i) + 1);
    return `${dot}*`;
  });
  const spec = table[pattern];
  if (!spec) return undefined;
  if (!indices.length) return { ...spec, path };
  const fill = (s: string | undefined) => {
    if (s === undefined) return s;
    let k = 0;
    return s.replace(/#/g, () => String(indices[k++] ?? ""));
  };
  // The short label names only the innermost indices ("Point 3 pressure").
  const shortFill = (s: string | undefined) => {
    if (s === undefined) return s;
    const marks = (s.match(/#/g) ?? []).length;
    let k = indices.length - marks;
    return s.replace(/#/g, () => String(indices[k++] ?? ""));
  };
  return { ...spec, path, label: fill(spec.label)!, short: shortFill(spec.short) };
}

/** The registry entry of an input path ("pumps.0.curves.1.points.2.flowLPerH"). */
export const inputField = (path: string): Field | undefined => lookup(INPUT_FIELDS, path);
/** The registry entry of a result path ("blend.rich.dutyPct"). */
export const resultField = (path: string): Field | undefined => lookup(RESULT_FIELDS, path);

/** The quantity of an input path, if it is a number. */
export const quantityOf = (path: string): Quantity | undefined => inputField(path)?.quantity;

/** A readable name for an input path; an unknown path reads as itself, spaced. */
export function labelOf(path: string): string {
  return inputField(path)?.label ?? path.replace(/\./g, " ");
}

/** The unit a form field shows beside its label ("psi", "count", "%" for E content). */
export function entryUnitOf(q: Quantity, system: UnitSystem): string {
  return QUANTITIES[q].entryUnit ?? converter(q, system).unit;
}

/** One value of a field as a person reads it: figure with unit, a code's label, or the text. */
export function formatField(
  field: FieldSpec | undefined,
  value: unknown,
  system: UnitSystem,
): string {
  if (value === undefined || value === null) return "—";
  if (typeof value === "number") {
    return field?.quantity
      ? formatValue(
          field.quantity,
          value,
          system,
          ownDecimals(field.quantity, system, field.decimals),
        )
      : Number.isFinite(value)
        ? String(value)
        : "—";
  }
  if (typeof value === "boolean") return value ? "yes" : "no";
  if (typeof value === "string") return field?.options?.[value] ?? value;
  return "—";
}

/** An input's value as a person reads it, in their unit system. */
export const formatInput = (path: string, value: unknown, system: UnitSystem): string =>
  formatField(inputField(path), value, system);
/** A result figure as a person reads it, in their unit system. */
export const formatResult = (path: string, value: unknown, system: UnitSystem): string =>
  formatField(resultField(path), value, system);

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
  // Metric shows canonical units: a plain deep copy, without working out a path per value.
  if (system === "metric") return copyPlain(value) as T;
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
    const q = cachedQuantityOf(path);
    if (!q) return v;
    const c = converter(q, system);
    if (c.to === converter(q, "metric").to) return v;
    if (direction === "toShown") return toShown(q, v, system);
    return fromShown(q, v, system, typeof orig === "number" ? orig : undefined);
  };
  return walk(value, "", original) as T;
}

/** `quantityOf`, remembered per path: the form converts its sixty values on every keystroke. */
const quantities = new Map<string, Quantity | undefined>();
function cachedQuantityOf(path: string): Quantity | undefined {
  if (quantities.has(path)) return quantities.get(path);
  const q = quantityOf(path);
  if (quantities.size > 2000) quantities.clear();
  quantities.set(path, q);
  return q;
}

/** A deep copy of arrays and objects (what `convertInputs` returns in metric). */
function copyPlain(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(copyPlain);
  if (v && typeof v === "object") {
    const out: Record<string, unknown> = {};
    for (const k in v) out[k] = copyPlain((v as Record<string, unknown>)[k]);
    return out;
  }
  return v;
}
