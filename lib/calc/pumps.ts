import { CalcInputError, requireRange } from "./_lib/input-error";
import { interpolateLinear } from "./_lib/interpolate";

/*
 * Pump supply: curves, parallel pumps, margin. docs/calculations.md §4.
 */

export interface PumpCurve {
  voltage: number;
  points: { pressureKpa: number; flowLPerH: number }[];
}

export interface Pump {
  quantity: number;
  curves: PumpCurve[];
  label?: string;
  /**
   * A staged pump runs only from this boost up (kPa gauge; a boost-switched second stage).
   * Left out: it runs all the time. docs/calculations.md §4.4.
   */
  switchOnBoostKpa?: number;
}

export interface PumpFlow {
  flowLPerH: number;
  /** The pressure lay outside a curve's data: the end segment was extended. */
  pressureOutOfRange: boolean;
  /** The pressure lay below a curve's first point (the flow read is an estimate above it). */
  pressureBelowCurve: boolean;
  /**
   * The voltage lay outside the tested voltages (or only one curve exists). Below the lowest
   * the flow is derated in proportion to the voltage; above the highest it is held there.
   */
  voltageOutOfRange: boolean;
  /** Several pumps: how many ran (each entry's quantity, for the entries switched on). */
  pumpsOn?: number;
}

interface PreparedPump {
  quantity: number;
  /** Boost from which it runs; -Infinity: always. */
  switchOn: number;
  voltages: number[];
  curves: { xs: number[]; ys: number[] }[];
  /** Reused buffer: one flow per tested voltage. */
  scratch: number[];
}

/**
 * Refuses a curve that is not a pump curve: a pressure given twice, or a flow that rises with
 * pressure, named by its point (`pumps.0.curves.1.points.2.flowLPerH`).
 */
export function validatePumpCurve(curve: PumpCurve, path = "curve"): void {
  requireRange(`${path}.voltage`, curve.voltage, 1, 60, "Curve voltage");
  if (!Array.isArray(curve.points) || curve.points.length < 2)
    throw new CalcInputError(`${path}.points`, "A pump curve needs at least two points");
  const order = curve.points
    .map((_, i) => i)
    .sort((a, b) => curve.points[a]!.pressureKpa - curve.points[b]!.pressureKpa);
  for (const i of order) {
    const pt = curve.points[i]!;
    requireRange(`${path}.points.${i}.pressureKpa`, pt.pressureKpa, 0, 1e4, "Curve pressure");
    requireRange(`${path}.points.${i}.flowLPerH`, pt.flowLPerH, 0, 1e5, "Curve flow");
  }
  for (let k = 1; k < order.length; k++) {
    const a = curve.points[order[k - 1]!]!;
    const b = curve.points[order[k]!]!;
    if (b.pressureKpa === a.pressureKpa)
      throw new CalcInputError(
        `${path}.points.${order[k]}.pressureKpa`,
        `Point ${order[k]! + 1} repeats the pressure of point ${order[k - 1]! + 1}: each pressure once on a curve`,
      );
    if (b.flowLPerH > a.flowLPerH)
      throw new CalcInputError(
        `${path}.points.${order[k]}.flowLPerH`,
        `Point ${order[k]! + 1} flows more than point ${order[k - 1]! + 1} at a lower pressure: a pump's flow falls as pressure rises`,
      );
  }
}

/** Sorts each pump's curves once, so that repeated look-ups (solvers, charts) stay cheap. */
function prepare(pump: Pump, index = 0): PreparedPump {
  if (!Array.isArray(pump.curves) || pump.curves.length === 0)
    throw new CalcInputError(`pumps.${index}.curves`, "A pump needs at least one flow curve");
  requireRange(`pumps.${index}.quantity`, pump.quantity, 0, 100, "Pump quantity");
  if (pump.switchOnBoostKpa !== undefined)
    requireRange(
      `pumps.${index}.switchOnBoostKpa`,
      pump.switchOnBoostKpa,
      0,
      1e4,
      "Switch-on boost",
    );
  pump.curves.forEach((c, j) => validatePumpCurve(c, `pumps.${index}.curves.${j}`));
  const curves = [...pump.curves].sort((a, b) => a.voltage - b.voltage);
  for (let j = 1; j < curves.length; j++)
    if (curves[j]!.voltage === curves[j - 1]!.voltage)
      throw new CalcInputError(`pumps.${index}.curves`, "Two curves at one voltage");
  return {
    quantity: pump.quantity,
    switchOn: pump.switchOnBoostKpa ?? -Infinity,
    voltages: curves.map((c) => c.voltage),
    scratch: curves.map(() => 0),
    curves: curves.map((c) => {
      const pts = [...c.points].sort((a, b) => a.pressureKpa - b.pressureKpa);
      return { xs: pts.map((p) => p.pressureKpa), ys: pts.map((p) => p.flowLPerH) };
    }),
  };
}

function flowOf(p: PreparedPump, pressureKpa: number, voltage: number): PumpFlow {
  let pressureOutOfRange = false;
  let pressureBelowCurve = false;
  const atVoltage = p.scratch;
  for (let i = 0; i < p.curves.length; i++) {
    const c = p.curves[i]!;
    const r = interpolateLinear(c.xs, c.ys, pressureKpa);
    if (r.outOfRange) pressureOutOfRange = true;
    if (pressureKpa < c.xs[0]!) pressureBelowCurve = true;
    atVoltage[i] = Math.max(0, r.value);
  }
  const vs = p.voltages;
  const lowest = vs[0]!;
  const highest = vs[vs.length - 1]!;
  let flow: number;
  // Below the lowest tested voltage the motor slows with the voltage: flow ∝ voltage (common
  // practice, no source; docs/calculations.md §4.2). Above the highest no gain is credited.
  if (voltage < lowest) flow = atVoltage[0]! * (Math.max(0, voltage) / lowest);
  else if (voltage > highest) flow = atVoltage[vs.length - 1]!;
  else flow = interpolateLinear(vs, atVoltage, voltage).value;
  const voltageOutOfRange =
    vs.length === 1 ? Math.abs(voltage - lowest) > 0.05 : voltage < lowest || voltage > highest;
  return {
    flowLPerH: Number.isFinite(flow) ? Math.max(0, flow) : 0,
    pressureOutOfRange,
    pressureBelowCurve,
    voltageOutOfRange,
  };
}

/**
 * Flow of one pump at an outlet pressure and voltage: piecewise-linear in pressure on each
 * tested voltage's curve, then linear between the two nearest voltages. Outside the data the
 * result is flagged, never silently extended, and never below zero.
 * @example pumpFlowLPerH({ quantity: 1, curves: [{ voltage: 12, points: [{ pressureKpa: 300, flowLPerH: 300 }, { pressureKpa: 600, flowLPerH: 200 }] }] }, 450, 12) // { flowLPerH: 250, … }
 */
export function pumpFlowLPerH(pump: Pump, pressureKpa: number, voltage: number): PumpFlow {
  requireRange("pressureKpa", pressureKpa, 0, 1e4, "Pump outlet pressure");
  requireRange("voltage", voltage, 0, 60, "Pump voltage");
  return flowOf(prepare(pump), pressureKpa, voltage);
}

/**
 * A reusable evaluator of several pumps in parallel (flows add at the same pressure). Given a
 * boost (kPa gauge), only the pumps switched on at that boost run; without one, all of them.
 */
export function pumpSupplyFunction(
  pumps: readonly Pump[],
): (pressureKpa: number, voltage: number, boostKpa?: number) => PumpFlow {
  if (!Array.isArray(pumps) || pumps.length === 0)
    throw new CalcInputError("pumps", "Add at least one fuel pump");
  const prepared = pumps.map((p, i) => prepare(p, i));
  return (pressureKpa, voltage, boostKpa) => {
    // The hot path (solver) stays check-free; out-of-range inputs are clamped to the physical.
    const pk = Number.isFinite(pressureKpa) && pressureKpa > 0 ? pressureKpa : 0;
    const v = Number.isFinite(voltage) && voltage > 0 ? voltage : 0;
    let flow = 0;
    let pressureOutOfRange = false;
    let pressureBelowCurve = false;
    let voltageOutOfRange = false;
    let pumpsOn = 0;
    for (const p of prepared) {
      if (boostKpa !== undefined && p.switchOn > boostKpa) continue;
      pumpsOn += p.quantity;
      const r = flowOf(p, pk, v);
      flow += r.flowLPerH * p.quantity;
      pressureOutOfRange ||= r.pressureOutOfRange;
      pressureBelowCurve ||= r.pressureBelowCurve;
      voltageOutOfRange ||= r.voltageOutOfRange;
    }
    return {
      flowLPerH: flow,
      pressureOutOfRange,
      pressureBelowCurve,
      voltageOutOfRange,
      pumpsOn,
    };
  };
}

/**
 * Total flow of several pumps in parallel at the same outlet pressure.
 * @example pumpsSupplyLPerH([pumpA, pumpA], 450, 12).flowLPerH // twice pumpA's flow
 */
export function pumpsSupplyLPerH(
  pumps: readonly Pump[],
  pressureKpa: number,
  voltage: number,
): PumpFlow {
  return pumpSupplyFunction(pumps)(pressureKpa, voltage);
}

/** Pump margin: supply / demand − 1, in %. @example pumpMarginPct(300, 240) // 25 */
export function pumpMarginPct(supplyLPerH: number, demandLPerH: number): number {
  requireRange("supplyLPerH", supplyLPerH, 0, 1e6, "Pump supply");
  requireRange("demandLPerH", demandLPerH, 0, 1e6, "Fuel demand");
  // No demand: no margin to speak of. A vanishing one (under a millilitre an hour) is no demand.
  return demandLPerH > 1e-3 ? (supplyLPerH / demandLPerH - 1) * 100 : 0;
}

/**
 * Power the pumps support with the minimum margin kept:
 * P = supply ÷ (1 + margin) × ρ × 1000 ÷ BSFC (kW; supply L/h, ρ kg/L, BSFC g/kWh).
 * @example pumpPowerCeilingKw({ supplyLPerH: 500, minMarginPct: 25, densityKgPerL: 0.787, bsfcGPerKwh: 486.6 }) // 646.9
 */
export function pumpPowerCeilingKw(q: {
  supplyLPerH: number;
  minMarginPct: number;
  densityKgPerL: number;
  bsfcGPerKwh: number;
}): number {
  requireRange("supplyLPerH", q.supplyLPerH, 0, 1e6, "Pump supply");
  requireRange("minMarginPct", q.minMarginPct, 0, 1000, "Minimum pump margin");
  requireRange("densityKgPerL", q.densityKgPerL, 0.1, 2, "Fuel density");
  requireRange("bsfcGPerKwh", q.bsfcGPerKwh, 1, 2000, "BSFC");
  return ((q.supplyLPerH / (1 + q.minMarginPct / 100)) * q.densityKgPerL * 1000) / q.bsfcGPerKwh;
}
