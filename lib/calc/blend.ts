// Reference: docs/calculations.md §1.
import { CalcInputError, requireRange } from "./_lib/input-error";
import type { FigureParams } from "./quantities";

export interface FuelVolume {
  volumeL: number;
  ethanolVolPct: number;
}

const fmtL = (l: number) => `${(Math.round(l * 10) / 10).toFixed(1)} L`;
const fmtE = (e: number) => `E${Math.round(e * 10) / 10}`;
const EPS = 1e-9;

/**
 * What a tank holds after several fills: volumes add and ethanol volumes add (the small
 * contraction on mixing ethanol with gasoline is ignored).
 *
 * @example mixFuels([{ volumeL: 20, ethanolVolPct: 10 }, { volumeL: 20, ethanolVolPct: 85 }]) // { volumeL: 40, ethanolVolPct: 47.5 }
 */
export function mixFuels(parts: readonly FuelVolume[]): FuelVolume {
  if (!Array.isArray(parts) || parts.length === 0) {
    throw new CalcInputError("parts", "Add at least one fuel to mix");
  }
  let volume = 0;
  let ethanol = 0;
  parts.forEach((p, i) => {
    requireRange(`parts.${i}.volumeL`, p.volumeL, 0, 1e6, "Volume");
    requireRange(`parts.${i}.ethanolVolPct`, p.ethanolVolPct, 0, 100, "Ethanol content");
    volume += p.volumeL;
    ethanol += (p.volumeL * p.ethanolVolPct) / 100;
  });
  if (volume <= 0) throw new CalcInputError("parts", "The fuels to mix add up to no volume");
  return { volumeL: volume, ethanolVolPct: Math.min(100, Math.max(0, (ethanol / volume) * 100)) };
}

export interface VolumeToAddQuery {
  tankVolumeL: number;
  tankEthanolVolPct: number;
  addedEthanolVolPct: number;
  targetEthanolVolPct: number;
  tankCapacityL?: number;
}

export type VolumeToAddResult =
  | { ok: true; volumeL: number; finalVolumeL: number }
  | {
      ok: false;
      code: "target-unreachable" | "overflow" | "tank-over-capacity";
      message: string;
      /** The message with `{name}` places for its volumes, said in the reader's units. */
      template?: string;
      figures?: FigureParams;
      drainL?: number;
      thenAddL?: number;
    };

/**
 * Litres of fuel B to add to a tank holding V litres of fuel A to reach a target ethanol
 * content: x = V·(target − A)/(B − target). A target not between the two fuels, or a fill that
 * would overflow the tank, is an explained refusal (with how much to drain first).
 *
 * @example volumeToAdd({ tankVolumeL: 20, tankEthanolVolPct: 10, addedEthanolVolPct: 85, targetEthanolVolPct: 50 }) // { ok: true, volumeL: 22.857… }
 */
export function volumeToAdd(q: VolumeToAddQuery): VolumeToAddResult {
  const V = requireRange("tankVolumeL", q.tankVolumeL, 0, 1e5, "Fuel in the tank");
  const a = requireRange(
    "tankEthanolVolPct",
    q.tankEthanolVolPct,
    0,
    100,
    "Ethanol content in the tank",
  );
  const b = requireRange(
    "addedEthanolVolPct",
    q.addedEthanolVolPct,
    0,
    100,
    "Ethanol content of the added fuel",
  );
  const t = requireRange(
    "targetEthanolVolPct",
    q.targetEthanolVolPct,
    0,
    100,
    "Target ethanol content",
  );
  const cap =
    q.tankCapacityL === undefined
      ? undefined
      : requireRange("tankCapacityL", q.tankCapacityL, 0.1, 1e5, "Tank capacity");
  if (cap !== undefined && V > cap + EPS) {
    return {
      ok: false,
      code: "tank-over-capacity",
      message: `The tank holds at most ${fmtL(cap)}, less than the ${fmtL(V)} said to be in it`,
      template: "The tank holds at most {cap}, less than the {tank} said to be in it",
      figures: { cap: { value: cap, quantity: "volume" }, tank: { value: V, quantity: "volume" } },
    };
  }
  if (Math.abs(t - a) < EPS || V === 0) {
    if (V === 0 && Math.abs(t - b) > EPS && Math.abs(t - a) > EPS) {
      return {
        ok: false,
        code: "target-unreachable",
        message: `The tank is empty: filling it with ${fmtE(b)} gives ${fmtE(b)}, not ${fmtE(t)}`,
      };
    }
    return { ok: true, volumeL: 0, finalVolumeL: V };
  }
  const between = (a < t && t < b) || (b < t && t < a);
  if (!between) {
    const direction = t > a ? "richer" : "leaner";
    return {
      ok: false,
      code: "target-unreachable",
      message: `${fmtE(t)} cannot be reached by adding ${fmtE(b)} to ${fmtE(a)}: adding it only moves the tank toward ${fmtE(b)}. Add a fuel ${direction} in ethanol than ${fmtE(t)}.`,
    };
  }
  const ratio = (t - a) / (b - t);
  const x = V * ratio;
  if (cap !== undefined && V + x > cap + EPS) {
    const keep = cap / (1 + ratio);
    const drain = V - keep;
    const add = cap - keep;
    return {
      ok: false,
      code: "overflow",
      message: `Adding ${fmtL(x)} would overflow the ${fmtL(cap)} tank. Drain ${fmtL(drain)} first, then add ${fmtL(add)} of ${fmtE(b)} to reach ${fmtE(t)} with a full tank.`,
      template: `Adding {add} would overflow the {cap} tank. Drain {drain} first, then add {then} of ${fmtE(b)} to reach ${fmtE(t)} with a full tank.`,
      figures: {
        add: { value: x, quantity: "volume" },
        cap: { value: cap, quantity: "volume" },
        drain: { value: drain, quantity: "volume" },
        then: { value: add, quantity: "volume" },
      },
      drainL: drain,
      thenAddL: add,
    };
  }
  return { ok: true, volumeL: x, finalVolumeL: V + x };
}

export interface FillSplitQuery {
  fillVolumeL: number;
  fuelAEthanolVolPct: number;
  fuelBEthanolVolPct: number;
  targetEthanolVolPct: number;
  /** Fuel already in the tank (optional). */
  tankVolumeL?: number;
  tankEthanolVolPct?: number;
}

export type FillSplitResult =
  | { ok: true; fuelAL: number; fuelBL: number; finalEthanolVolPct: number }
  | { ok: false; code: "target-unreachable"; message: string; closestEthanolVolPct: number };

/**
 * How to split a fill of V litres between fuel A and fuel B so that the tank (with what it
 * already holds) reaches the target.
 *
 * @example fillSplit({ fillVolumeL: 50, fuelAEthanolVolPct: 85, fuelBEthanolVolPct: 10, targetEthanolVolPct: 40 }) // { ok: true, fuelAL: 20, fuelBL: 30 }
 */
export function fillSplit(q: FillSplitQuery): FillSplitResult {
  const V = requireRange("fillVolumeL", q.fillVolumeL, 0.1, 1e5, "Fill volume");
  const eA = requireRange(
    "fuelAEthanolVolPct",
    q.fuelAEthanolVolPct,
    0,
    100,
    "Ethanol content of fuel A",
  );
  const eB = requireRange(
    "fuelBEthanolVolPct",
    q.fuelBEthanolVolPct,
    0,
    100,
    "Ethanol content of fuel B",
  );
  const t = requireRange(
    "targetEthanolVolPct",
    q.targetEthanolVolPct,
    0,
    100,
    "Target ethanol content",
  );
  const V0 = requireRange("tankVolumeL", q.tankVolumeL ?? 0, 0, 1e5, "Fuel in the tank");
  const e0 = requireRange(
    "tankEthanolVolPct",
    q.tankEthanolVolPct ?? 0,
    0,
    100,
    "Ethanol content in the tank",
  );
  const total = V0 + V;
  const mixWith = (a: number) => (V0 * e0 + a * eA + (V - a) * eB) / total;
  if (Math.abs(eA - eB) < EPS) {
    const e = mixWith(V);
    if (Math.abs(e - t) < 0.05) return { ok: true, fuelAL: V, fuelBL: 0, finalEthanolVolPct: e };
    return {
      ok: false,
      code: "target-unreachable",
      message: `Both fuels are ${fmtE(eA)}: the tank ends at ${fmtE(e)} whatever the split`,
      closestEthanolVolPct: e,
    };
  }
  const a = (total * t - V0 * e0 - V * eB) / (eA - eB);
  if (a < -EPS || a > V + EPS) {
    const lo = Math.min(mixWith(0), mixWith(V));
    const hi = Math.max(mixWith(0), mixWith(V));
    const closest = t < lo ? lo : hi;
    return {
      ok: false,
      code: "target-unreachable",
      message: `With this fill the tank can only end between ${fmtE(lo)} and ${fmtE(hi)}; ${fmtE(t)} needs a larger fill or draining first`,
      closestEthanolVolPct: closest,
    };
  }
  const fuelAL = Math.min(V, Math.max(0, a));
  return { ok: true, fuelAL, fuelBL: V - fuelAL, finalEthanolVolPct: mixWith(fuelAL) };
}

/** Frequency range of the common flex-fuel content sensor convention: 50 Hz = E0 … 150 Hz = E100. */
export const FLEX_SENSOR_HZ = { min: 50, max: 150 } as const;

/**
 * Ethanol content from a flex-fuel sensor's output frequency (50 Hz = E0 … 150 Hz = E100,
 * linear; common practice). Frequencies outside 50–150 Hz mean a sensor fault or water.
 * @example ethanolFromFlexSensorHz(135) // 85
 */
export function ethanolFromFlexSensorHz(frequencyHz: number): number {
  requireRange(
    "frequencyHz",
    frequencyHz,
    FLEX_SENSOR_HZ.min,
    FLEX_SENSOR_HZ.max,
    "Sensor frequency (a reading outside 50–150 Hz points to a sensor fault or water in the fuel)",
  );
  return frequencyHz - FLEX_SENSOR_HZ.min;
}

/** The inverse: the frequency a sensor shows for a given ethanol content. @example flexSensorHzFromEthanol(10) // 60 */
export function flexSensorHzFromEthanol(ethanolVolPct: number): number {
  requireRange("ethanolVolPct", ethanolVolPct, 0, 100, "Ethanol content");
  return ethanolVolPct + FLEX_SENSOR_HZ.min;
}

/** A blend range this wide or wider needs an ethanol content sensor (common practice, no source). */
export const FLEX_SENSOR_MIN_SPAN_PCT = 20;

/** Whether a build needs an ethanol content sensor, and why (the one rule; §1). */
export interface FlexSensorAdvice {
  needed: boolean;
  /** `fixed`: one content; `narrow`: closed-loop trims cover it; `wide`: the tune must follow it. */
  reason: "fixed" | "narrow" | "wide";
  spanPct: number;
}

/**
 * The one rule for the ethanol content sensor, read by the build sheet's warning and the kit
 * alike: a blend range of 20 points or more needs one; a narrower one (E0–E10 pump fuel) is left
 * to the closed-loop fuel trims. docs/calculations.md §1.
 * @example flexSensorAdvice({ ethanolMinVolPct: 51, ethanolMaxVolPct: 83 }) // { needed: true, reason: "wide", spanPct: 32 }
 */
export function flexSensorAdvice(q: {
  ethanolMinVolPct: number;
  ethanolMaxVolPct: number;
}): FlexSensorAdvice {
  const lo = requireRange("ethanolMinVolPct", q.ethanolMinVolPct, 0, 100, "Lowest ethanol content");
  const hi = requireRange(
    "ethanolMaxVolPct",
    q.ethanolMaxVolPct,
    0,
    100,
    "Highest ethanol content",
  );
  if (hi < lo)
    throw new CalcInputError(
      "ethanolMaxVolPct",
      "The highest ethanol content must not be below the lowest",
    );
  const spanPct = hi - lo;
  const reason = spanPct === 0 ? "fixed" : spanPct >= FLEX_SENSOR_MIN_SPAN_PCT ? "wide" : "narrow";
  return { needed: reason === "wide", reason, spanPct };
}
