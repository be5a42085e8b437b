// Reference: docs/calculations.md §7.
import type { DutyBand, RegulatorType } from "../injectors";
import type { LineDrop } from "../lines";
import type { BoostPressurePoint } from "../regulator";
import type { SupplyPoint } from "../staging";
import type { TraceStep, Warning } from "../types";
import type { CeilingSeverity } from "./ceiling-stage";
import type { SizingLimits } from "./context";

export interface BlendEnd {
  ethanolVolPct: number;
  densityKgPerL: number;
  stoichAfr: number;
  bsfcGPerKwh: number;
  bsfcSource: "given" | "scaled" | "rule-of-thumb";
  fuelMassFlowGPerMin: number;
  fuelVolumeFlowLPerH: number;
  requiredFlowAtOperatingCcPerMin: number;
  requiredRatedFlowCcPerMin: number;
  /** The injector's flow of this fuel at full-boost ΔP (corrected for the rating fluid, §3.10). */
  injectorFlowCcPerMin: number;
  dutyPct: number;
  powerCeilingKw: number;
  pulseWidthRedline: PulseWidth;
}

export interface PulseWidth {
  rpm: number;
  cycleMs: number;
  effectiveMs: number;
  deadTimeMs: number | null;
  commandedMs: number | null;
}

export interface LineResult extends LineDrop {
  flowLPerH: number;
  insideDiameterMm: number;
  lengthM: number;
  withinLimit: boolean;
}

export interface FuelSystemResult {
  calcVersion: string;
  wheelPowerKw: number;
  crankPowerKw: number;
  /** At the worse end of the blend range (`blend.worstEnd`): the one needing more fuel volume. */
  fuelMassFlowGPerMin: number;
  fuelVolumeFlowLPerH: number;
  /** Each end of the blend range, and which is the worse (duty and demand are taken there). */
  blend: { lean: BlendEnd; rich: BlendEnd; worstEnd: "lean" | "rich" };
  injector: {
    count: number;
    /** Battery/charging voltage the dead time was looked up at. */
    voltage: number;
    differentialPressureKpa: number;
    flowAtOperatingCcPerMin: number;
    requiredFlowAtOperatingCcPerMin: number;
    requiredRatedFlowCcPerMin: number;
    /** At the worse end (`blend.worstEnd`); each end's is in `blend.lean` / `blend.rich`. */
    dutyPct: number;
    dutyBand: DutyBand;
    powerCeilingKw: number;
    pulseWidthRedline: PulseWidth;
    pulseWidthIdle: PulseWidth & {
      differentialPressureKpa: number;
      minPulseWidthMs: number | null;
      fuelPerInjectionMg: number;
    };
  };
  regulator: {
    type: RegulatorType;
    /** 1 for 1:1; r for a 1:r rising-rate regulator (a fixed one: 1, unused). */
    risingRateRatio: number;
    /** Rail, manifold (= boost) and pressure across the injector over 0…max boost (§3.8). */
    pressureVsBoost: BoostPressurePoint[];
    /** What the bypass passes at the idle rail pressure (§3.9); null: no rating given. */
    bypassCapacityAtIdleLPerH: number | null;
  };
  pump: {
    voltageUsed: number;
    wireDropV: number | null;
    railPressureKpa: number;
    outletPressureKpa: number;
    demandLPerH: number;
    supplyLPerH: number;
    /** Where it is worst over the boost range (§4.4); at full boost unless a stage is late. */
    marginPct: number;
    fullLoadMarginPct: number;
    /** Boost at which the margin is worst. */
    worstMarginBoostKpa: number;
    /** Supply against demand over 0…max boost (with a point either side of each stage). */
    supplyVsBoost: SupplyPoint[];
    returnFlowLPerH: number;
    powerCeilingKw: number;
    idleRailPressureKpa: number;
    idleSupplyLPerH: number;
    idleReturnFlowLPerH: number;
  };
  lines: {
    feed: LineResult | null;
    return: LineResult | null;
    recommendedFeedDash: number | null;
    recommendedReturnDash: number | null;
    assumedLengthM: number | null;
  };
  powerCeiling: {
    kw: number;
    limitedBy: "injectors" | "pump" | "feed-line";
    headroomPct: number;
    /** The ceiling's one severity, its limiting figure's (§7.2): the same wherever it is shown. */
    severity: CeilingSeverity;
  };
  limits: SizingLimits;
  warnings: Warning[];
  trace: TraceStep[];
}
