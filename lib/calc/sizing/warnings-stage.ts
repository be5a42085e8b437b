// Reference: docs/calculations.md §7.2, §7.3 (stage "warnings" of §7).
import { flexSensorAdvice } from "../blend";
import { cycleTimeMs, deadTimeMs, type DutyBand } from "../injectors";
import { AN_SIZES } from "../lines";
import type { PumpFlow } from "../pumps";
import type { FigureParams } from "../quantities";
import type { SupplyPoint } from "../staging";
import type { Severity, Warning } from "../types";
import type { Ceiling } from "./ceiling-stage";
import type { SizingContext } from "./context";
import type { IdleStage } from "./idle-stage";
import type { BlendEnd, LineResult } from "./result";

/**
 * Above this drop a pre-pump (suction-side) filter is a caution: the pump's inlet falls toward
 * the fuel's vapour pressure (common practice, no source; docs/calculations.md §4.5).
 */
export const PRE_PUMP_FILTER_CAUTION_KPA = 10;
/** Figures of a warning without numbers. */
const NO_PARAMS: FigureParams = Object.freeze({}) as FigureParams;
/** The largest hose size the recommendation tries. */
const LARGEST_DASH = { value: AN_SIZES[AN_SIZES.length - 1]!.dash, quantity: "anDash" } as const;

/** What the warnings are judged on: the figures the other stages worked out. */
export interface SizingFacts {
  crankPowerKw: number;
  lean: BlendEnd;
  rich: BlendEnd;
  worst: BlendEnd;
  dpOp: number;
  dutyBand: DutyBand;
  /** The larger of the two ends' smallest rating. */
  needRating: number;
  idle: IdleStage;
  voltageUsed: number;
  wireDropV: number | null;
  outlet: number;
  demand: number;
  supply: PumpFlow;
  margin: number;
  /** Where the margin is worst below full boost, if lower than at full boost (§4.4). */
  worstAt: SupplyPoint | null;
  idleRail: number;
  idleSupply: PumpFlow;
  idleReturn: number;
  bypassAtIdle: number | null;
  feed: LineResult | null;
  ret: LineResult | null;
  recommendedFeedDash: number | null;
  recommendedReturnDash: number | null;
  ceiling: Ceiling;
}

/**
 * Stage "warnings": each finding once, at its figure's severity (calc-spec §7). Templates carry
 * their figures as data, formatted at the edge in the reader's units.
 */
export function sizingWarnings({ input, limits }: SizingContext, f: SizingFacts): Warning[] {
  const warnings: Warning[] = [];
  const warn = (
    code: string,
    severity: Severity,
    message: string,
    fix: string,
    params: FigureParams = NO_PARAMS,
  ) => warnings.push({ code, severity, message, fix, params });
  const { engine, fuel, injectors, regulator, electrical } = input;
  const { crankPowerKw, lean, rich, worst, dpOp, dutyBand, needRating, idle, voltageUsed } = f;
  const { wireDropV, outlet, demand, supply, margin, idleRail, idleSupply, feed, ret } = f;
  const { recommendedFeedDash, recommendedReturnDash, worstAt } = f;
  const { kw: ceilingKw, limitedBy } = f.ceiling;
  const pumpLimited = limitedBy !== "injectors";
  const dutyMax = Math.max(lean.dutyPct, rich.dutyPct);
  const biggerInjector =
    "Fit injectors rated at least {needRating} at {ratedPressure}, add injectors, or raise the base pressure.";
  const injectorFix = {
    // The same figure as the "Smallest rating" beside it, rounded the same way in every unit.
    needRating: { value: needRating, quantity: "injectorFlow" as const },
    ratedPressure: { value: injectors.ratedPressureKpa, quantity: "pressure" as const },
  };
  const duty0 = { value: dutyMax, quantity: "percent" as const, decimals: 0 };
  if (dutyBand === "static") {
    warn(
      "injector-static",
      "danger",
      "The injectors would need {duty} duty at {ethanol}: they cannot deliver the fuel for this power.",
      biggerInjector,
      {
        duty: duty0,
        ethanol: { value: worst.ethanolVolPct, quantity: "ethanol" },
        ...injectorFix,
      },
    );
  } else if (dutyBand === "danger") {
    warn(
      "injector-duty-danger",
      "danger",
      "Injector duty reaches {duty}: almost no headroom for a richer blend, hot fuel or voltage sag.",
      biggerInjector,
      { duty: duty0, ...injectorFix },
    );
  } else if (dutyBand === "caution") {
    warn(
      "injector-duty-caution",
      "caution",
      "Injector duty reaches {duty}, above the {caution} comfort level.",
      biggerInjector,
      {
        duty: duty0,
        caution: { value: limits.dutyCautionPct, quantity: "percent", decimals: 0 },
        ...injectorFix,
      },
    );
  }
  if (regulator.type === "fixed" && engine.maxBoostKpa > 0) {
    warn(
      "fixed-regulator-boost",
      "caution",
      "With a fixed regulator the pressure across the injectors falls from {base} to {dp} at full boost, and injector flow falls with it.",
      "Use a boost-referenced regulator, or size the injectors for the pressure at full boost (done here).",
      {
        base: { value: regulator.basePressureKpa, quantity: "pressure" },
        dp: { value: dpOp, quantity: "pressure" },
      },
    );
  }
  // The minimum reliable pulse is a commanded (electrical) pulse: compare the commanded idle
  // pulse where the dead time is known, else the opening time, and say which (calc-spec §3).
  if (
    injectors.minPulseWidthMs !== undefined &&
    (idle.commandedMs ?? idle.effectiveMs) < injectors.minPulseWidthMs
  ) {
    warn(
      "idle-pulse-short",
      "caution",
      idle.commandedMs === null
        ? "At idle the injectors would open for {pulse} (opening time; no dead-time table, so the commanded pulse is unknown and a little longer), below their {min} minimum: expect a rough, uneven idle."
        : "At idle the commanded pulse would be {pulse} (opening time plus dead time), below the injectors' {min} minimum: expect a rough, uneven idle.",
      "Choose smaller injectors, lower the base pressure, or raise idle speed or airflow.",
      {
        pulse: { value: idle.commandedMs ?? idle.effectiveMs, quantity: "time" },
        min: { value: injectors.minPulseWidthMs, quantity: "time" },
      },
    );
  }
  // At idle the pulse must also fit in the engine's cycle: a pulse as long as the cycle leaves
  // the injector open all the time (static), so the idle mixture is not controlled (§3.7).
  const idleCycleMs = cycleTimeMs(engine.idleRpm);
  const idlePulseMs = idle.commandedMs ?? idle.effectiveMs;
  if (idlePulseMs >= idleCycleMs) {
    warn(
      "idle-injector-static",
      "danger",
      "At idle the injectors would have to stay open for {pulse}, longer than the {cycle} cycle at {rpm}: they would be static and the idle mixture out of control.",
      "Check the idle inputs (manifold pressure, volumetric efficiency, idle speed), or fit larger injectors or more of them.",
      {
        pulse: { value: idlePulseMs, quantity: "time" },
        cycle: { value: idleCycleMs, quantity: "time" },
        rpm: { value: engine.idleRpm, quantity: "speed" },
      },
    );
  }
  if (!injectors.deadTime) {
    warn(
      "dead-time-missing",
      "info",
      "No dead-time table for these injectors: commanded pulse widths cannot be given, only effective opening times.",
      "Enter the injector's dead-time table (from its data sheet) or pick it from the catalog.",
    );
  } else if (
    deadTimeMs(injectors.deadTime, electrical.injectorVoltage, dpOp).outOfRange ||
    deadTimeMs(injectors.deadTime, electrical.injectorVoltage, idle.dpIdle).outOfRange
  ) {
    warn(
      "dead-time-outside-table",
      "info",
      "The voltage or pressure lies outside the injector's dead-time table; the nearest edge of the table was used.",
      "Extend the dead-time table to the operating voltage and pressure.",
    );
  }
  const pumpAt = {
    supply: { value: supply.flowLPerH, quantity: "volumeFlow" as const },
    outlet: { value: outlet, quantity: "pressure" as const },
    voltage: { value: voltageUsed, quantity: "voltage" as const },
    demand: { value: demand, quantity: "volumeFlow" as const },
  };
  if (supply.flowLPerH < demand) {
    warn(
      "pump-short",
      "danger",
      "The pumps deliver {supply} at {outlet} and {voltage}, less than the {demand} the engine needs: the rail pressure will collapse at full load.",
      "Add a pump or fit a larger one, raise the voltage at the pump, or lower the target power.",
      pumpAt,
    );
  } else if (worstAt && worstAt.supplyLPerH < worstAt.demandLPerH) {
    // Staged pumps: short below full boost, before a stage switches on (§4.4).
    warn(
      "pump-short",
      "danger",
      "At {boost} boost the pumps running deliver {supply} at {outlet}, less than the {demand} the engine needs there: the rail pressure will collapse before the next stage switches on.",
      "Switch the second stage on at a lower boost, or fit a larger first stage.",
      {
        boost: { value: worstAt.boostKpa, quantity: "pressure" },
        supply: { value: worstAt.supplyLPerH, quantity: "volumeFlow" },
        outlet: { value: worstAt.outletKpa, quantity: "pressure" },
        demand: { value: worstAt.demandLPerH, quantity: "volumeFlow" },
      },
    );
  } else if (margin < limits.minPumpMarginPct) {
    warn(
      "pump-margin-low",
      "caution",
      worstAt
        ? "Pump margin is {margin} at {boost} boost, before the next stage switches on, below the {min} minimum."
        : "Pump margin is {margin}, below the {min} minimum.",
      worstAt
        ? "Switch the second stage on at a lower boost, or fit a larger first stage."
        : "Fit a larger pump or a second one, or improve the pump's wiring.",
      {
        margin: { value: margin, quantity: "percent", decimals: 0 },
        min: { value: limits.minPumpMarginPct, quantity: "percent", decimals: 0 },
        ...(worstAt ? { boost: { value: worstAt.boostKpa, quantity: "pressure" as const } } : {}),
      },
    );
  }
  if (f.bypassAtIdle !== null && f.bypassAtIdle < f.idleReturn) {
    warn(
      "regulator-bypass-short",
      "caution",
      "At idle the regulator must return {idleReturn}, but its bypass passes only {capacity} at {idleRail}: the rail pressure will rise above its setting at idle and light load.",
      "Fit a regulator with a larger bypass, or a smaller (or staged) pump.",
      {
        idleReturn: { value: f.idleReturn, quantity: "volumeFlow" },
        capacity: { value: f.bypassAtIdle, quantity: "volumeFlow" },
        idleRail: { value: Math.max(0, idleRail), quantity: "pressure" },
      },
    );
  }
  if (input.filters.prePumpDropKpa > PRE_PUMP_FILTER_CAUTION_KPA) {
    warn(
      "pre-pump-filter-drop",
      "caution",
      "The pre-pump filter loses {drop} on the suction side, more than {limit}: the pump may draw vapour (cavitate) with hot fuel or a low tank.",
      "Use a coarser or larger pre-pump filter (a sock or strainer) and do the fine filtering after the pump.",
      {
        drop: { value: input.filters.prePumpDropKpa, quantity: "pressureDrop" },
        limit: { value: PRE_PUMP_FILTER_CAUTION_KPA, quantity: "pressureDrop" },
      },
    );
  }
  const neverOn = input.pumps.findIndex(
    (p) => p.switchOnBoostKpa !== undefined && p.switchOnBoostKpa > engine.maxBoostKpa,
  );
  if (neverOn >= 0) {
    warn(
      "pump-stage-never-on",
      "caution",
      "Pump {pump} switches on at {switchOn}, above the engine's {boost} boost: it never runs.",
      "Lower its switch-on boost, or leave it blank to run it all the time.",
      {
        pump: { value: neverOn + 1, quantity: "count" },
        switchOn: { value: input.pumps[neverOn]!.switchOnBoostKpa!, quantity: "pressure" },
        boost: { value: engine.maxBoostKpa, quantity: "pressure" },
      },
    );
  }
  if (supply.pressureOutOfRange) {
    warn(
      "pump-curve-pressure-range",
      "caution",
      "The pump curve has no data at {outlet}; its end segment was extended, so the supply figure is an estimate.",
      "Enter curve points that cover the working pressure.",
      { outlet: pumpAt.outlet },
    );
  }
  if (idleSupply.pressureBelowCurve) {
    warn(
      "pump-curve-idle-range",
      "caution",
      "At idle the rail sits at {idleRail}, below the first point of the pump curve: the idle supply of {idleSupply} (and the return flow the return line is sized for) is read off the curve's end segment, an estimate.",
      "Enter a curve point at or below the idle rail pressure.",
      {
        idleRail: { value: idleRail, quantity: "pressure" },
        idleSupply: { value: idleSupply.flowLPerH, quantity: "volumeFlow" },
      },
    );
  }
  if (supply.voltageOutOfRange) {
    warn(
      "pump-curve-voltage-range",
      "caution",
      "The pump curves do not cover {voltage}: below the lowest tested voltage the flow is derated in proportion to the voltage, above the highest it is held at that curve.",
      "Enter a curve at (or around) the real voltage at the pump.",
      { voltage: pumpAt.voltage },
    );
  }
  if (electrical.wiring && wireDropV !== null && wireDropV > 0.5) {
    warn(
      "pump-wire-drop",
      "caution",
      "The pump wiring loses {drop} at {current}.",
      "Use heavier wire, a shorter run or a relay close to the pump.",
      {
        drop: { value: wireDropV, quantity: "voltage", decimals: 2 },
        current: { value: electrical.wiring.currentA, quantity: "current" },
      },
    );
  }
  const maxDrop = { value: limits.maxLineDropKpa, quantity: "pressureDrop" as const };
  if (feed && !feed.withinLimit) {
    warn(
      "feed-line-drop",
      "caution",
      "The feed line loses {drop} at {flow}, above the {limit} limit.",
      recommendedFeedDash
        ? "Use {dash} or larger."
        : "Use a larger line than {largest} or split the feed.",
      {
        drop: { value: feed.pressureDropKpa, quantity: "pressureDrop" },
        flow: { value: feed.flowLPerH, quantity: "volumeFlow" },
        limit: maxDrop,
        dash: { value: recommendedFeedDash ?? 0, quantity: "anDash" },
        largest: LARGEST_DASH,
      },
    );
  }
  if (ret && !ret.withinLimit) {
    warn(
      "return-line-drop",
      "caution",
      "At idle the return line carries {flow} and loses {drop}: rail pressure will sit high at idle and the fuel will heat.",
      recommendedReturnDash ? "Use {dash} or larger for the return." : "Use a larger return line.",
      {
        flow: { value: ret.flowLPerH, quantity: "volumeFlow" },
        drop: { value: ret.pressureDropKpa, quantity: "pressureDrop" },
        dash: { value: recommendedReturnDash ?? 0, quantity: "anDash" },
      },
    );
  }
  if (
    supply.flowLPerH > 0 &&
    supply.flowLPerH - demand <= 0.05 * supply.flowLPerH &&
    supply.flowLPerH >= demand
  ) {
    warn(
      "no-return-flow",
      "caution",
      "At full load almost no fuel returns to the tank: the regulator is at the edge of regulating.",
      "A return-style system must always return some fuel; add pump capacity.",
    );
  }
  // One figure, one severity (calc-spec §7): a ceiling below the target is the limiting
  // figure's own finding (duty band, pump margin, line drop), already warned at that figure's
  // severity. Only a limiter within the shop's bands (a duty above the design duty yet below
  // the caution level) leaves the ceiling to say it, as a note.
  // One figure, one severity (calc-spec §7): the ceiling's severity is its limiter's; only a
  // limiter within its bands leaves the ceiling to say it, as a note.
  if (f.ceiling.severity === "info") {
    warn(
      "ceiling-below-target",
      "info",
      limitedBy === "injectors"
        ? "At the {design} design duty the system tops out at {ceiling} crank, below the {target} target (limited by the injectors); the duty itself is within the comfort level."
        : limitedBy === "pump"
          ? "At the {design} design duty the system tops out at {ceiling} crank, below the {target} target (limited by the pump)."
          : "At the {design} design duty the system tops out at {ceiling} crank, below the {target} target (limited by the feed line).",
      pumpLimited ? "Add pump capacity." : biggerInjector,
      {
        ceiling: { value: ceilingKw, quantity: "power" },
        target: { value: crankPowerKw, quantity: "power" },
        design: { value: limits.designDutyPct, quantity: "percent", decimals: 0 },
        ...injectorFix,
      },
    );
  }
  if (lean.bsfcSource === "rule-of-thumb") {
    warn(
      "bsfc-rule-of-thumb",
      "info",
      "BSFC comes from rules of thumb; verify the fuel flow on the dyno.",
      "Enter a measured BSFC once the engine has been on the dyno.",
    );
  }
  if (flexSensorAdvice(fuel).needed) {
    warn(
      "blend-range-flex",
      "info",
      "The blend can run from {lowest} to {highest}: the tune needs an ethanol content sensor to follow it.",
      "Fit an ethanol content sensor and a flex-fuel tune.",
      {
        lowest: { value: fuel.ethanolMinVolPct, quantity: "ethanol" },
        highest: { value: fuel.ethanolMaxVolPct, quantity: "ethanol" },
      },
    );
  }

  return warnings;
}
