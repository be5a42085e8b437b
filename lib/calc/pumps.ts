import { interpolateLinear } from "./_lib/interpolate";

export interface PumpCurve {
  voltage: number;
  points: { pressureKpa: number; flowLPerH: number }[];
}

export interface Pump {
  quantity: number;
  curves: PumpCurve[];
  label?: string;
}

export interface PumpFlow {
  flowLPerH: number;
  /** The pressure lay outside a curve's data: the end segment was extended. */
  pressureOutOfRange: boolean;
  /** The voltage lay outside the tested voltages (or only one curve exists). */
  voltageOutOfRange: boolean;
}

interface PreparedPump {
  quantity: number;
  voltages: number[];
  curves: { xs: number[]; ys: number[] }[];
  /** Reused buffer: one flow per tested voltage. */
  scratch: number[];
}

/** Sorts each pump's curves once, so that repeated look-ups (solvers, charts) stay cheap. */
function prepare(pump: Pump): PreparedPump {
  const curves = [...pump.curves].sort((a, b) => a.voltage - b.voltage);
  return {
    quantity: pump.quantity,
    voltages: curves.map((c) => c.voltage),
    scratch: curves.map(() => 0),
    curves: curves.map((c) => {
      const pts = [...c.points].sort((a, b) => a.pressureKpa - b.pressureKpa);
      return { xs: pts.map((p) => p.pressureKpa), ys: pts.map((p) => p.flowLPerH) };
    }),
  };
}

function flowOf(p: PreparedPump, pressureKpa: number, voltage: number): PumpFlow {
  if (p.curves.length === 0)
    return { flowLPerH: 0, pressureOutOfRange: true, voltageOutOfRange: true };
  let pressureOutOfRange = false;
  const atVoltage = p.scratch;
  for (let i = 0; i < p.curves.length; i++) {
    const c = p.curves[i]!;
    const r = interpolateLinear(c.xs, c.ys, pressureKpa);
    if (r.outOfRange) pressureOutOfRange = true;
    atVoltage[i] = Math.max(0, r.value);
  }
  const v = interpolateLinear(p.voltages, atVoltage, voltage);
  const voltageOutOfRange =
    p.voltages.length === 1 ? Math.abs(voltage - p.voltages[0]!) > 0.05 : v.outOfRange;
  return { flowLPerH: Math.max(0, v.value), pressureOutOfRange, voltageOutOfRange };
}

/**
 * Flow of one pump at an outlet pressure and voltage: piecewise-linear in pressure on each
 * tested voltage's curve, then linear between the two nearest voltages. Outside the data the
 * result is flagged, never silently extended, and never below zero.
 * @example pumpFlowLPerH({ quantity: 1, curves: [{ voltage: 12, points: [{ pressureKpa: 300, flowLPerH: 300 }, { pressureKpa: 600, flowLPerH: 200 }] }] }, 450, 12) // { flowLPerH: 250, … }
 */
export function pumpFlowLPerH(pump: Pump, pressureKpa: number, voltage: number): PumpFlow {
  return flowOf(prepare(pump), pressureKpa, voltage);
}

/** A reusable evaluator of several pumps in parallel (flows add at the same pressure). */
export function pumpSupplyFunction(
  pumps: readonly Pump[],
): (pressureKpa: number, voltage: number) => PumpFlow {
  const prepared = pumps.map(prepare);
  return (pressureKpa, voltage) => {
    let flow = 0;
    let pressureOutOfRange = false;
    let voltageOutOfRange = false;
    for (const p of prepared) {
      const r = flowOf(p, pressureKpa, voltage);
      flow += r.flowLPerH * p.quantity;
      pressureOutOfRange ||= r.pressureOutOfRange;
      voltageOutOfRange ||= r.voltageOutOfRange;
    }
    return { flowLPerH: flow, pressureOutOfRange, voltageOutOfRange };
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
  return demandLPerH > 0 ? (supplyLPerH / demandLPerH - 1) * 100 : 0;
}
