// Reference: docs/calculations.md §7 (and §2–§5 for each stage).
import { CalcInputError } from "./_lib/input-error";
import { Tracer } from "./_lib/trace";
import { cycleTimeMs, dutyBand } from "./injectors";
import { fuelPressureAgainstBoost } from "./regulator";
import { FuelSystemInputSchema, type FuelSystemInput, type ParsedFuelSystemInput } from "./schema";
import { blendEndStage, worseEnd } from "./sizing/blend-ends";
import { ceilingStage } from "./sizing/ceiling-stage";
import { limitsOf, type SizingContext } from "./sizing/context";
import { idleStage } from "./sizing/idle-stage";
import { injectorOperatingPoint, redlinePulseStep } from "./sizing/injector-stage";
import { linesStage } from "./sizing/lines-stage";
import { powerStage } from "./sizing/power-fuel";
import { pumpStage, pumpVoltageStage } from "./sizing/pump-stage";
import type { FuelSystemResult } from "./sizing/result";
import { sizingWarnings } from "./sizing/warnings-stage";

export { DEFAULT_DRIVETRAIN_LOSS_PCT, DEFAULT_LIMITS } from "./sizing/context";
export type { SizingLimits } from "./sizing/context";
export type { BlendEnd, FuelSystemResult, LineResult, PulseWidth } from "./sizing/result";

/** Bumped whenever a formula or default changes, so saved results say what made them. */
export const CALC_VERSION = "1.3.0";

/**
 * Sizes a fuel system: fuel needed at the target power across the blend range, injector duty,
 * pulse widths, pump margin at rail pressure and real voltage, line drops, the power ceiling
 * and what limits it, warnings and the worked trace. Validates with the schema first (throws
 * CalcInputError naming the first bad field).
 *
 * @example sizeFuelSystem(demoInput).injector.dutyPct // e.g. 78.4
 */
export function sizeFuelSystem(input: FuelSystemInput): FuelSystemResult {
  const parsed = FuelSystemInputSchema.safeParse(input);
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    throw new CalcInputError(issue.path.join(".") || "input", issue.message);
  }
  return sizeParsedFuelSystem(parsed.data);
}

/**
 * The same on input already parsed by the schema (hot paths: sweeps, charts). The stages run
 * in the order of docs/calculations.md §7: power and fuel, injectors, pump voltage, blend
 * ends, idle, pump operating point, lines, ceiling, warnings.
 */
export function sizeParsedFuelSystem(input: ParsedFuelSystemInput): FuelSystemResult {
  const ctx: SizingContext = { input, limits: limitsOf(input), t: new Tracer() };
  const { engine, fuel, injectors, electrical } = input;
  const { limits, t } = ctx;

  const { wheelPowerKw, crankPowerKw } = powerStage(ctx);
  const op = injectorOperatingPoint(ctx);
  const { voltageUsed, wireDropV } = pumpVoltageStage(ctx);
  const L = blendEndStage(ctx, op, crankPowerKw, fuel.ethanolMinVolPct, "lean");
  const R = blendEndStage(ctx, op, crankPowerKw, fuel.ethanolMaxVolPct, "rich");
  const lean = L.end;
  const rich = R.end;
  const worstEnd = worseEnd(lean, rich);
  const worst = worstEnd === "lean" ? lean : rich;
  redlinePulseStep(ctx, worst, op);
  const idle = idleStage(ctx, op, lean, L.props);
  const pump = pumpStage(ctx, worst, R.props, L.props, voltageUsed, idle);
  const lines = linesStage(ctx, pump.fluid, pump.supply.flowLPerH, pump.idleReturn);
  const band = dutyBand(Math.max(lean.dutyPct, rich.dutyPct), limits);
  const worstSupply = pump.worstAt ? pump.worstAt.supplyLPerH : pump.supply.flowLPerH;
  const worstDemand = pump.worstAt ? pump.worstAt.demandLPerH : pump.demand;
  const ceiling = ceilingStage(
    crankPowerKw,
    { lean: lean.powerCeilingKw, rich: rich.powerCeilingKw },
    pump.pumpCeiling,
    lines.feed,
    {
      dutyBand: band,
      pumpShort: pump.supply.flowLPerH < pump.demand || worstSupply < worstDemand,
      pumpMarginLow: pump.margin < limits.minPumpMarginPct,
    },
  );
  const needRating = Math.max(lean.requiredRatedFlowCcPerMin, rich.requiredRatedFlowCcPerMin);
  const warnings = sizingWarnings(ctx, {
    crankPowerKw,
    lean,
    rich,
    worst,
    dpOp: op.dpOp,
    dutyBand: band,
    needRating,
    idle,
    voltageUsed,
    wireDropV,
    outlet: pump.outlet,
    demand: pump.demand,
    supply: pump.supply,
    margin: pump.margin,
    worstAt: pump.worstAt,
    idleRail: pump.idleRail,
    idleSupply: pump.idleSupply,
    idleReturn: pump.idleReturn,
    bypassAtIdle: pump.bypassAtIdle,
    feed: lines.feed,
    ret: lines.return,
    recommendedFeedDash: lines.recommendedFeedDash,
    recommendedReturnDash: lines.recommendedReturnDash,
    ceiling,
  });

  return {
    calcVersion: CALC_VERSION,
    wheelPowerKw,
    crankPowerKw,
    fuelMassFlowGPerMin: worst.fuelMassFlowGPerMin,
    fuelVolumeFlowLPerH: worst.fuelVolumeFlowLPerH,
    blend: { lean, rich, worstEnd },
    injector: {
      count: injectors.count,
      voltage: electrical.injectorVoltage,
      differentialPressureKpa: op.dpOp,
      flowAtOperatingCcPerMin: op.qOp,
      requiredFlowAtOperatingCcPerMin: Math.max(
        lean.requiredFlowAtOperatingCcPerMin,
        rich.requiredFlowAtOperatingCcPerMin,
      ),
      requiredRatedFlowCcPerMin: needRating,
      dutyPct: worst.dutyPct,
      dutyBand: band,
      powerCeilingKw: ceiling.injectorKw,
      pulseWidthRedline: worst.pulseWidthRedline,
      pulseWidthIdle: {
        rpm: engine.idleRpm,
        cycleMs: cycleTimeMs(engine.idleRpm),
        effectiveMs: idle.effectiveMs,
        deadTimeMs: idle.deadMs,
        commandedMs: idle.commandedMs,
        differentialPressureKpa: idle.dpIdle,
        minPulseWidthMs: injectors.minPulseWidthMs ?? null,
        fuelPerInjectionMg: idle.fuelPerInjectionMg,
      },
    },
    regulator: {
      type: input.regulator.type,
      risingRateRatio: input.regulator.type === "fixed" ? 1 : input.regulator.risingRateRatio,
      pressureVsBoost: fuelPressureAgainstBoost({
        type: input.regulator.type,
        basePressureKpa: input.regulator.basePressureKpa,
        risingRateRatio: input.regulator.risingRateRatio,
        maxBoostKpa: engine.maxBoostKpa,
        // Rail and ΔP are straight lines in boost (§3.8): the two ends draw them exactly.
        points: 2,
      }),
      bypassCapacityAtIdleLPerH: pump.bypassAtIdle,
    },
    pump: {
      voltageUsed,
      wireDropV,
      railPressureKpa: pump.rail,
      outletPressureKpa: pump.outlet,
      demandLPerH: pump.demand,
      supplyLPerH: pump.supply.flowLPerH,
      marginPct: pump.margin,
      fullLoadMarginPct: pump.fullLoadMargin,
      worstMarginBoostKpa: pump.worstAt ? pump.worstAt.boostKpa : engine.maxBoostKpa,
      supplyVsBoost: pump.supplyVsBoost,
      returnFlowLPerH: Math.max(0, pump.supply.flowLPerH - pump.demand),
      powerCeilingKw: pump.pumpCeiling,
      idleRailPressureKpa: pump.idleRail,
      idleSupplyLPerH: pump.idleSupply.flowLPerH,
      idleReturnFlowLPerH: pump.idleReturn,
    },
    lines,
    powerCeiling: {
      kw: ceiling.kw,
      limitedBy: ceiling.limitedBy,
      headroomPct: ceiling.headroomPct,
      severity: ceiling.severity,
    },
    limits,
    warnings,
    trace: t.steps,
  };
}
