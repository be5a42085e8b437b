// Reference: docs/calculations.md §3 (stage "injectors" of §7).
import {
  cycleTimeMs,
  deadTimeMs,
  effectivePulseWidthMs,
  injectorDifferentialPressureKpa,
  injectorFlowAtPressure,
} from "../injectors";
import type { SizingContext } from "./context";
import type { BlendEnd, PulseWidth } from "./result";

export interface InjectorOperatingPoint {
  /** Pressure across the injector at full boost. */
  dpOp: number;
  /** Injector flow at that pressure. */
  qOp: number;
  /** One four-stroke cycle at redline, ms. */
  redlineCycle: number;
  /** Dead time at the injectors' voltage (calc-spec §3) and a ΔP; null without a table. */
  dead: (dp: number) => number | null;
}

/** Stage "injectors": pressure across the injector and its flow at full boost. */
export function injectorOperatingPoint({ input, t }: SizingContext): InjectorOperatingPoint {
  const { engine, injectors, regulator, electrical } = input;
  const dpOp = injectorDifferentialPressureKpa({
    type: regulator.type,
    basePressureKpa: regulator.basePressureKpa,
    manifoldKpa: engine.maxBoostKpa,
    risingRateRatio: regulator.risingRateRatio,
  });
  const rising = regulator.type === "boost-referenced" && regulator.risingRateRatio !== 1;
  t.add({
    id: "injector-dp",
    label: "Pressure across the injector at full boost",
    formula:
      regulator.type === "fixed"
        ? "base pressure − boost"
        : rising
          ? "base pressure + (rising-rate ratio − 1) × boost"
          : "base pressure (the regulator follows boost 1:1)",
    inputs: [
      { label: "base pressure", value: regulator.basePressureKpa, quantity: "pressure" },
      { label: "boost", value: engine.maxBoostKpa, quantity: "pressure" },
      ...(rising
        ? [
            {
              label: "rising-rate ratio",
              value: regulator.risingRateRatio,
              quantity: "risingRate" as const,
            },
          ]
        : []),
    ],
    value: dpOp,
    quantity: "pressure",
  });
  const qOp = t.add({
    id: "injector-flow-op",
    label: "Injector flow at that pressure",
    formula: "rated flow × √(pressure across ÷ rated pressure)",
    inputs: [
      { label: "rated flow", value: injectors.ratedFlowCcPerMin, quantity: "injectorFlow" },
      { label: "pressure across", value: dpOp, quantity: "pressure" },
      { label: "rated pressure", value: injectors.ratedPressureKpa, quantity: "pressure" },
    ],
    value: injectorFlowAtPressure({
      ratedFlowCcPerMin: injectors.ratedFlowCcPerMin,
      ratedPressureKpa: injectors.ratedPressureKpa,
      differentialPressureKpa: dpOp,
    }),
    quantity: "injectorFlow",
  });
  const table = injectors.deadTime;
  const voltage = electrical.injectorVoltage;
  return {
    dpOp,
    qOp,
    redlineCycle: cycleTimeMs(engine.redlineRpm),
    dead: table ? (dp) => deadTimeMs(table, voltage, dp).value : () => null,
  };
}

/** Pulse width at redline for a duty: opening time, and the commanded pulse where the dead time is known. */
export function redlinePulse(
  { input }: SizingContext,
  op: InjectorOperatingPoint,
  dutyPct: number,
): PulseWidth {
  const effective = effectivePulseWidthMs({ dutyPct, cycleMs: op.redlineCycle });
  const dt = op.dead(op.dpOp);
  return {
    rpm: input.engine.redlineRpm,
    cycleMs: op.redlineCycle,
    effectiveMs: effective,
    deadTimeMs: dt,
    commandedMs: dt === null ? null : effective + dt,
  };
}

/** The working step of the pulse at redline, at the worse end of the blend. */
export function redlinePulseStep(
  ctx: SizingContext,
  worst: BlendEnd,
  op: InjectorOperatingPoint,
): void {
  const { input, t } = ctx;
  t.add({
    id: "pulse-redline",
    label: "Effective pulse width at {rpm} ({ethanol})",
    params: {
      rpm: { value: input.engine.redlineRpm, quantity: "speed" },
      ethanol: { value: worst.ethanolVolPct, quantity: "ethanol" },
    },
    formula: "duty × cycle, the cycle being 120 000 ÷ rpm",
    inputs: [
      { label: "duty", value: worst.dutyPct, quantity: "percent" },
      { label: "cycle", value: worst.pulseWidthRedline.cycleMs, quantity: "time" },
    ],
    value: worst.pulseWidthRedline.effectiveMs,
    quantity: "time",
  });
  const p = worst.pulseWidthRedline;
  if (p.deadTimeMs !== null && p.commandedMs !== null)
    commandedPulseSteps(ctx, "redline", op.dpOp, p.deadTimeMs, p.effectiveMs, p.commandedMs);
}

/**
 * The working steps of a commanded pulse: the dead time read off the injector's table at the
 * voltage the injectors see and the pressure across them (§3.5), then opening + dead time (§3.4).
 */
export function commandedPulseSteps(
  { input, t }: SizingContext,
  where: "idle" | "redline",
  dp: number,
  deadMs: number,
  effectiveMs: number,
  commandedMs: number,
): void {
  const at = where === "idle" ? "at idle" : "at redline";
  t.add({
    id: `dead-time-${where}`,
    label: `Injector dead time ${at}`,
    formula:
      "the injector's dead-time table read at the voltage at the injectors and the pressure across them",
    inputs: [
      {
        label: "voltage at the injectors",
        value: input.electrical.injectorVoltage,
        quantity: "voltage",
      },
      { label: "pressure across", value: dp, quantity: "pressure" },
    ],
    value: deadMs,
    quantity: "time",
    decimals: 2,
  });
  t.add({
    id: `pulse-${where}-commanded`,
    label: `Commanded pulse width ${at}`,
    formula: "effective opening time + dead time",
    inputs: [
      { label: "opening time", value: effectiveMs, quantity: "time", decimals: 2 },
      { label: "dead time", value: deadMs, quantity: "time", decimals: 2 },
    ],
    value: commandedMs,
    quantity: "time",
    decimals: 2,
  });
}
