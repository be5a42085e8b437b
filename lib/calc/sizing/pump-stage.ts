// Reference: docs/calculations.md §4 (stage "pump operating point" of §7).
import type { FuelBlend } from "../fuel";
import { idleFuelConsumptionLPerH, railPressureKpa } from "../injectors";
import { linePressureDrop, type LineDrop, type LineSegment } from "../lines";
import { pumpMarginPct, pumpPowerCeilingKw, pumpSupplyFunction, type PumpFlow } from "../pumps";
import { regulatorBypassCapacityLPerH } from "../regulator";
import { supplyAgainstBoost, type SupplyPoint } from "../staging";
import { voltageAfterWiringV } from "../wire";
import type { SizingContext } from "./context";
import type { IdleStage } from "./idle-stage";
import type { BlendEnd } from "./result";

/** The fuel in the lines: the richest blend (densest, most viscous) at a flow. */
export type LineFluid = (flowLPerH: number) => {
  flowLPerH: number;
  densityKgPerL: number;
  viscosityMPaS: number;
};

/** Stage "pump voltage": the voltage at the pump, after its wiring where the wiring is given. */
export function pumpVoltageStage({ input, t }: SizingContext): {
  voltageUsed: number;
  wireDropV: number | null;
} {
  const { electrical } = input;
  const w = electrical.wiring;
  if (!w) return { voltageUsed: electrical.voltageAtPump, wireDropV: null };
  const after = voltageAfterWiringV(w);
  const voltageUsed = t.add({
    id: "pump-voltage",
    label: "Voltage at the pump",
    formula: "supply voltage − current × copper resistance of the wire (round trip)",
    inputs: [
      { label: "supply voltage", value: w.sourceVoltage, quantity: "voltage" },
      { label: "current", value: w.currentA, quantity: "current" },
      { label: "gauge", value: w.gaugeAwg, quantity: "wireGauge" },
      { label: "length", value: w.roundTripLengthM, quantity: "length" },
    ],
    value: after.voltage,
    quantity: "voltage",
  });
  return { voltageUsed, wireDropV: after.dropV };
}

export interface PumpStage {
  rail: number;
  outlet: number;
  feedDrop: LineDrop | null;
  demand: number;
  supply: PumpFlow;
  /** Where it is worst over the boost range (§4.4). */
  margin: number;
  fullLoadMargin: number;
  /** The point below full boost where the margin is worst, if lower than at full boost. */
  worstAt: SupplyPoint | null;
  supplyVsBoost: SupplyPoint[];
  pumpCeiling: number;
  idleRail: number;
  idleSupply: PumpFlow;
  idleReturn: number;
  /** Regulator bypass capacity at the idle rail pressure; null without a rating. */
  bypassAtIdle: number | null;
  fluid: LineFluid;
}

/**
 * Stage "pump operating point": the outlet pressure (rail + post-pump filter + the feed line's drop at
 * the pump's own flow), supply there, demand at the worse end, margin, the pump's power
 * ceiling, and at idle the supply and the return flow the return line carries.
 */
export function pumpStage(
  { input, limits, t }: SizingContext,
  worst: BlendEnd,
  richProps: FuelBlend,
  leanProps: FuelBlend,
  voltageUsed: number,
  idle: IdleStage,
): PumpStage {
  const { engine, regulator, pumps } = input;
  const rail = t.add({
    id: "rail-full-boost",
    label: "Rail pressure at full boost",
    formula:
      regulator.type === "fixed"
        ? "base pressure (a fixed regulator ignores boost)"
        : "base pressure + rising-rate ratio × boost",
    inputs: [
      { label: "base pressure", value: regulator.basePressureKpa, quantity: "pressure" },
      { label: "boost", value: engine.maxBoostKpa, quantity: "pressure" },
      ...(regulator.type === "fixed"
        ? []
        : [
            {
              label: "rising-rate ratio",
              value: regulator.risingRateRatio,
              quantity: "risingRate" as const,
            },
          ]),
    ],
    value: railPressureKpa({
      type: regulator.type,
      basePressureKpa: regulator.basePressureKpa,
      manifoldKpa: engine.maxBoostKpa,
      risingRateRatio: regulator.risingRateRatio,
    }),
    quantity: "pressure",
  });
  const demand = worst.fuelVolumeFlowLPerH;
  const feedLine = input.lines?.feed;
  const fluid: LineFluid = (flowLPerH) => ({
    flowLPerH,
    densityKgPerL: richProps.densityKgPerL,
    viscosityMPaS: richProps.viscosityMPaS,
  });
  const supplyAt = pumpSupplyFunction(pumps);
  const postFilter = input.filters.postPumpDropKpa;
  const base = rail + postFilter;
  const fullBoost = engine.maxBoostKpa;
  const { outlet, feedDrop } = pumpOperatingPoint(base, feedLine, (p) =>
    fluid(supplyAt(p, voltageUsed, fullBoost).flowLPerH),
  );
  const supply = supplyAt(outlet, voltageUsed, fullBoost);
  t.add({
    id: "pump-outlet",
    label: "Pressure the pump works against",
    formula: "rail pressure + post-pump filter drop + feed-line drop",
    inputs: [
      { label: "rail pressure", value: rail, quantity: "pressure" },
      { label: "post-pump filter drop", value: postFilter, quantity: "pressureDrop" },
      { label: "feed-line drop", value: feedDrop?.pressureDropKpa ?? 0, quantity: "pressureDrop" },
    ],
    value: outlet,
    quantity: "pressure",
  });
  t.add({
    id: "pump-demand",
    label: "Fuel demand at {ethanol} (the worse end)",
    params: { ethanol: { value: worst.ethanolVolPct, quantity: "ethanol" } },
    formula: "fuel needed ÷ density × 0.06",
    formulaImperial: "fuel needed ÷ density",
    inputs: [
      { label: "fuel needed", value: worst.fuelMassFlowGPerMin, quantity: "massFlow" },
      { label: "density", value: worst.densityKgPerL, quantity: "density" },
    ],
    value: demand,
    quantity: "volumeFlow",
  });
  t.add({
    id: "pump-supply",
    label: "Pump supply",
    formula:
      "sum over the pumps running at full boost of quantity × flow on the curve at the outlet pressure and voltage",
    inputs: [
      { label: "outlet pressure", value: outlet, quantity: "pressure" },
      { label: "voltage", value: voltageUsed, quantity: "voltage" },
    ],
    value: supply.flowLPerH,
    quantity: "volumeFlow",
  });
  const fullLoadMargin = t.add({
    id: "pump-margin",
    label: "Pump margin at full boost",
    formula: "(supply ÷ demand − 1) × 100",
    inputs: [
      { label: "supply", value: supply.flowLPerH, quantity: "volumeFlow" },
      { label: "demand", value: demand, quantity: "volumeFlow" },
    ],
    value: pumpMarginPct(supply.flowLPerH, demand),
    quantity: "percent",
  });
  const pumpCeiling = t.add({
    id: "pump-ceiling",
    label: "Pump power ceiling",
    formula: "supply ÷ (1 + minimum margin) × density × 1000 ÷ BSFC",
    formulaImperial: "supply ÷ (1 + minimum margin) × density ÷ BSFC",
    inputs: [
      { label: "supply", value: supply.flowLPerH, quantity: "volumeFlow" },
      { label: "minimum margin", value: limits.minPumpMarginPct, quantity: "percent", decimals: 0 },
      { label: "density", value: worst.densityKgPerL, quantity: "density" },
      { label: "BSFC", value: worst.bsfcGPerKwh, quantity: "bsfc" },
    ],
    value: pumpPowerCeilingKw({
      supplyLPerH: supply.flowLPerH,
      minMarginPct: limits.minPumpMarginPct,
      densityKgPerL: worst.densityKgPerL,
      bsfcGPerKwh: worst.bsfcGPerKwh,
    }),
    quantity: "power",
  });

  // Idle: the return line carries almost the whole pump flow.
  const idleRail = railPressureKpa({
    type: regulator.type,
    basePressureKpa: regulator.basePressureKpa,
    manifoldKpa: idle.manifoldGaugeKpa,
    risingRateRatio: regulator.risingRateRatio,
  });
  const idleSupply = supplyAt(Math.max(0, idleRail), voltageUsed, idle.manifoldGaugeKpa);
  const idleConsumption = idleFuelConsumptionLPerH({
    fuelPerCylinderMg: idle.fuelPerCylinderMg,
    cylinders: engine.cylinders,
    rpm: engine.idleRpm,
    densityKgPerL: leanProps.densityKgPerL,
  });
  const idleReturn = Math.max(0, idleSupply.flowLPerH - idleConsumption);
  const bypass = regulator.bypass;
  const bypassAtIdle = bypass
    ? t.add({
        id: "regulator-bypass",
        label: "Regulator bypass capacity at the idle rail pressure",
        formula: "rated bypass flow × √(idle rail pressure ÷ rating pressure)",
        inputs: [
          { label: "rated bypass flow", value: bypass.flowLPerH, quantity: "volumeFlow" },
          { label: "rating pressure", value: bypass.atPressureKpa, quantity: "pressure" },
          { label: "idle rail pressure", value: Math.max(0, idleRail), quantity: "pressure" },
          { label: "idle return flow", value: idleReturn, quantity: "volumeFlow" },
        ],
        value: regulatorBypassCapacityLPerH({
          ratedFlowLPerH: bypass.flowLPerH,
          ratedPressureKpa: bypass.atPressureKpa,
          railPressureKpa: Math.max(0, idleRail),
        }),
        quantity: "volumeFlow",
      })
    : null;

  // Supply against demand over the boost range; the margin is taken where it is worst (§4.4).
  const supplyVsBoost = supplyAgainstBoost({
    pumps,
    supplyAt,
    voltage: voltageUsed,
    regulator,
    maxBoostKpa: fullBoost,
    ambientKpaAbs: engine.ambientKpaAbs,
    demandAtFullBoostLPerH: demand,
    lossesKpa: Math.max(0, outlet - rail),
    // Six even points (plus each stage's two) keep a sizing within its time budget.
    points: 6,
  });
  let worstAt: SupplyPoint | null = null;
  for (let i = 0; i < supplyVsBoost.length - 1; i++) {
    const p = supplyVsBoost[i]!;
    if (p.marginPct < fullLoadMargin && (!worstAt || p.marginPct < worstAt.marginPct)) worstAt = p;
  }
  let margin = fullLoadMargin;
  if (worstAt) {
    margin = t.add({
      id: "pump-margin-worst",
      label: "Pump margin where it is worst, at {boost} boost ({pumps} pumps running)",
      params: {
        boost: { value: worstAt.boostKpa, quantity: "pressure" },
        pumps: { value: worstAt.pumpsOn, quantity: "count" },
      },
      formula:
        "(supply ÷ demand − 1) × 100, demand = demand at full boost × (ambient + boost) ÷ (ambient + full boost)",
      inputs: [
        { label: "outlet pressure", value: worstAt.outletKpa, quantity: "pressure" },
        { label: "supply", value: worstAt.supplyLPerH, quantity: "volumeFlow" },
        { label: "demand at full boost", value: demand, quantity: "volumeFlow" },
        { label: "ambient", value: engine.ambientKpaAbs, quantity: "pressureAbs" },
        { label: "demand there", value: worstAt.demandLPerH, quantity: "volumeFlow" },
      ],
      value: worstAt.marginPct,
      quantity: "percent",
    });
  }
  return {
    rail,
    outlet,
    feedDrop,
    demand,
    supply,
    margin,
    fullLoadMargin,
    worstAt,
    supplyVsBoost,
    pumpCeiling,
    idleRail,
    idleSupply,
    idleReturn,
    bypassAtIdle,
    fluid,
  };
}

/**
 * The outlet pressure p solves g(p) = p − base − drop(supply(p)) = 0, base being rail + filter
 * (docs/calculations.md §4.1). g rises with p and the root lies between base and
 * base + drop(supply(base)). Illinois false position.
 */
export function pumpOperatingPoint(
  base: number,
  feedLine: LineSegment | undefined,
  fluidAt: (pressureKpa: number) => {
    flowLPerH: number;
    densityKgPerL: number;
    viscosityMPaS: number;
  },
): { outlet: number; feedDrop: LineDrop | null } {
  if (!feedLine) return { outlet: base, feedDrop: null };
  const g = (p: number) => p - base - linePressureDrop(feedLine, fluidAt(p)).pressureDropKpa;
  let lo = base;
  let glo = g(lo);
  let hi = base - glo;
  let ghi = g(hi);
  let outlet = hi;
  if (glo < 0 && ghi > 0 && hi - lo > 1e-6) {
    let side = 0;
    for (let i = 0; i < 60; i++) {
      const guess = (lo * ghi - hi * glo) / (ghi - glo);
      const p = Number.isFinite(guess) && guess > lo && guess < hi ? guess : (lo + hi) / 2;
      const gp = g(p);
      outlet = p;
      if (Math.abs(gp) < 0.01) break;
      if (gp < 0) {
        lo = p;
        glo = gp;
        if (side === -1) ghi /= 2;
        side = -1;
      } else {
        hi = p;
        ghi = gp;
        if (side === 1) glo /= 2;
        side = 1;
      }
    }
  } else if (glo >= 0 || !(hi - lo > 1e-6)) outlet = lo;
  if (!Number.isFinite(outlet)) outlet = base;
  return { outlet, feedDrop: linePressureDrop(feedLine, fluidAt(outlet)) };
}
