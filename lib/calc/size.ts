// Reference: docs/calculations.md §7 (and §2–§5 for each stage).
import { CalcInputError } from "./_lib/input-error";
import { Tracer } from "./_lib/trace";
import { fuelBlend, type FuelBlend } from "./fuel";
import {
  cycleTimeMs,
  deadTimeMs,
  gaugeFromAbsKpa,
  idleFuelPerCylinderMg,
  injectorDifferentialPressureKpa,
  injectorDutyPct,
  injectorFlowAtPressure,
  railPressureKpa,
  requiredInjectorFlowCcPerMin,
} from "./injectors";
import { AN_SIZES, linePressureDrop, type LineDrop, type LineSegment } from "./lines";
import { bsfcAtBlend, crankPowerFromWheel, defaultBsfc, fuelMassFlowGPerMin } from "./power";
import { pumpMarginPct, pumpSupplyFunction } from "./pumps";
import type { FigureParams } from "./quantities";
import { FuelSystemInputSchema, type FuelSystemInput, type ParsedFuelSystemInput } from "./schema";
import type { Severity, TraceStep, Warning } from "./types";
import { INJECTOR_RATING_DENSITY_KG_PER_L } from "./units";
import { wireVoltageDropV } from "./wire";

/** Bumped whenever a formula or default changes, so saved results say what made them. */
export const CALC_VERSION = "1.1.0";

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
    dutyBand: "ok" | "caution" | "danger" | "static";
    powerCeilingKw: number;
    pulseWidthRedline: PulseWidth;
    pulseWidthIdle: PulseWidth & {
      differentialPressureKpa: number;
      minPulseWidthMs: number | null;
      fuelPerInjectionMg: number;
    };
  };
  pump: {
    voltageUsed: number;
    wireDropV: number | null;
    railPressureKpa: number;
    outletPressureKpa: number;
    demandLPerH: number;
    supplyLPerH: number;
    marginPct: number;
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
  powerCeiling: { kw: number; limitedBy: "injectors" | "pump" | "feed-line"; headroomPct: number };
  limits: {
    designDutyPct: number;
    dutyCautionPct: number;
    dutyDangerPct: number;
    minPumpMarginPct: number;
    maxLineDropKpa: number;
  };
  warnings: Warning[];
  trace: TraceStep[];
}

/** The library's limits where neither the build nor the shop gives one (calc-spec §3–§5, common practice). */
export const DEFAULT_LIMITS = {
  designDutyPct: 80,
  dutyCautionPct: 80,
  dutyDangerPct: 90,
  minPumpMarginPct: 25,
  maxLineDropKpa: 14,
};
/** Figures of a warning without numbers. */
const NO_PARAMS: FigureParams = Object.freeze({}) as FigureParams;
/** The rating fluid behind lb/h injector ratings: a constant only the imperial formulas need. */
const RATING_FLUID = {
  label: "rating fluid density",
  value: INJECTOR_RATING_DENSITY_KG_PER_L,
  quantity: "density",
  only: "imperial",
} as const;
/** The largest hose size the recommendation tries. */
const LARGEST_DASH = { value: AN_SIZES[AN_SIZES.length - 1]!.dash, quantity: "anDash" } as const;
/** The library's drivetrain loss where neither the build nor the shop gives one (common practice, no source). */
export const DEFAULT_DRIVETRAIN_LOSS_PCT = 15;
/** Line length assumed for a recommendation when the build gives none. */
const ASSUMED_LINE_LENGTH_M = 5;

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

/** The same on input already parsed by the schema (hot paths: sweeps, charts). */
export function sizeParsedFuelSystem(input: ParsedFuelSystemInput): FuelSystemResult {
  const t = new Tracer();
  const warnings: Warning[] = [];
  const warn = (
    code: string,
    severity: Severity,
    message: string,
    fix: string,
    params: FigureParams = NO_PARAMS,
  ) => warnings.push({ code, severity, message, fix, params });
  const { engine, target, fuel, injectors, regulator, pumps, electrical } = input;
  const l = input.limits;
  const limits = {
    designDutyPct: l?.designDutyPct ?? DEFAULT_LIMITS.designDutyPct,
    dutyCautionPct: l?.dutyCautionPct ?? DEFAULT_LIMITS.dutyCautionPct,
    dutyDangerPct: l?.dutyDangerPct ?? DEFAULT_LIMITS.dutyDangerPct,
    minPumpMarginPct: l?.minPumpMarginPct ?? DEFAULT_LIMITS.minPumpMarginPct,
    maxLineDropKpa: l?.maxLineDropKpa ?? DEFAULT_LIMITS.maxLineDropKpa,
  };
  const lossPct = target.drivetrainLossPct ?? DEFAULT_DRIVETRAIN_LOSS_PCT;
  const design = limits.designDutyPct / 100;
  const n = injectors.count;

  // Power
  const wheelPowerKw =
    target.measuredAt === "wheel" ? target.powerKw : target.powerKw * (1 - lossPct / 100);
  const crankPowerKw =
    target.measuredAt === "wheel"
      ? t.add({
          id: "crank-power",
          label: "Crank power",
          formula: "wheel power ÷ (1 − drivetrain loss)",
          inputs: [
            { label: "wheel power", value: target.powerKw, quantity: "power" },
            { label: "drivetrain loss", value: lossPct, quantity: "percent" },
          ],
          value: crankPowerFromWheel({ wheelPowerKw: target.powerKw, drivetrainLossPct: lossPct }),
          quantity: "power",
        })
      : target.powerKw;

  // Pressures at full load
  const dpOp = injectorDifferentialPressureKpa({
    type: regulator.type,
    basePressureKpa: regulator.basePressureKpa,
    manifoldKpa: engine.maxBoostKpa,
  });
  t.add({
    id: "injector-dp",
    label: "Pressure across the injector at full boost",
    formula:
      regulator.type === "boost-referenced"
        ? "base pressure (the regulator follows boost 1:1)"
        : "base pressure − boost",
    inputs: [
      { label: "base pressure", value: regulator.basePressureKpa, quantity: "pressure" },
      { label: "boost", value: engine.maxBoostKpa, quantity: "pressure" },
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

  // Voltage at the pump
  let voltageUsed = electrical.voltageAtPump;
  let wireDropV: number | null = null;
  if (electrical.wiring) {
    wireDropV = wireVoltageDropV(electrical.wiring);
    voltageUsed = t.add({
      id: "pump-voltage",
      label: "Voltage at the pump",
      formula: "supply voltage − current × copper resistance of the wire (round trip)",
      inputs: [
        { label: "supply voltage", value: electrical.wiring.sourceVoltage, quantity: "voltage" },
        { label: "current", value: electrical.wiring.currentA, quantity: "current" },
        { label: "gauge", value: electrical.wiring.gaugeAwg, quantity: "wireGauge" },
        { label: "length", value: electrical.wiring.roundTripLengthM, quantity: "length" },
      ],
      value: Math.max(0, electrical.wiring.sourceVoltage - wireDropV),
      quantity: "voltage",
    });
  }

  // Dead time at the voltage the injectors see (calc-spec §3), not the pump's.
  const injectorVoltage = electrical.injectorVoltage;
  const dead = (dp: number): number | null =>
    injectors.deadTime ? deadTimeMs(injectors.deadTime, injectorVoltage, dp).value : null;
  const redlineCycle = cycleTimeMs(engine.redlineRpm);

  const endOf = (
    ethanolVolPct: number,
    which: "lean" | "rich",
  ): { props: FuelBlend; end: BlendEnd } => {
    const b = fuelBlend(ethanolVolPct, fuel.properties);
    const e = { ethanol: { value: ethanolVolPct, quantity: "ethanol" as const } };
    let bsfc: number;
    let bsfcSource: BlendEnd["bsfcSource"];
    if (fuel.bsfcGPerKwh !== undefined) {
      // A given BSFC belongs to the fuel it was taken at (calc-spec §2); the other end of the
      // range gets it scaled by the rule-of-thumb ratio between the two contents.
      const at = fuel.bsfcEthanolVolPct ?? fuel.ethanolMinVolPct;
      if (at === ethanolVolPct) {
        bsfc = fuel.bsfcGPerKwh;
        bsfcSource = "given";
      } else {
        const scaled = bsfcAtBlend({
          bsfcGPerKwh: fuel.bsfcGPerKwh,
          fromEthanolVolPct: at,
          toEthanolVolPct: ethanolVolPct,
          aspiration: engine.aspiration,
          defaults: fuel.bsfcDefaults,
          properties: fuel.properties,
        });
        bsfcSource = "scaled";
        bsfc = t.add({
          id: `bsfc-${which}`,
          label: "BSFC at {ethanol}, from the given BSFC at {given}",
          params: { ...e, given: { value: at, quantity: "ethanol" } },
          formula:
            "given BSFC × rule-of-thumb BSFC at this content ÷ rule-of-thumb BSFC at the given content (never less fuel volume per kWh at more ethanol)",
          inputs: [
            { label: "given BSFC", value: fuel.bsfcGPerKwh, quantity: "bsfc" },
            { label: "ratio", value: scaled.ratio, quantity: "ratio" },
          ],
          value: scaled.bsfcGPerKwh,
          quantity: "bsfc",
        });
      }
    } else {
      const est = defaultBsfc({
        ethanolVolPct,
        aspiration: engine.aspiration,
        targetLambda: fuel.targetLambda,
        defaults: fuel.bsfcDefaults,
      });
      bsfcSource = "rule-of-thumb";
      bsfc = t.add({
        id: `bsfc-${which}`,
        label:
          which === "lean"
            ? "BSFC at {ethanol} (lowest ethanol)"
            : "BSFC at {ethanol} (highest ethanol)",
        params: e,
        formula:
          "gasoline and E85 rules of thumb, linear in ethanol %, × reference lambda ÷ target lambda",
        inputs: [
          { label: "at reference lambda", value: est.atReferenceGPerKwh, quantity: "bsfc" },
          { label: "reference lambda", value: est.referenceLambda, quantity: "lambda" },
          {
            label: "target lambda",
            value: fuel.targetLambda ?? est.referenceLambda,
            quantity: "lambda",
          },
        ],
        value: est.bsfcGPerKwh,
        quantity: "bsfc",
      });
    }
    const mdot = t.add({
      id: `fuel-mass-${which}`,
      label: "Fuel needed at {ethanol}",
      params: e,
      formula: "crank power × BSFC ÷ 60",
      formulaImperial: "crank power × BSFC",
      inputs: [
        { label: "crank power", value: crankPowerKw, quantity: "power" },
        { label: "BSFC", value: bsfc, quantity: "bsfc" },
      ],
      value: fuelMassFlowGPerMin({ powerKw: crankPowerKw, bsfcGPerKwh: bsfc }),
      quantity: "massFlow",
    });
    const volLPerH = (mdot / b.densityKgPerL) * 0.06;
    const reqOp = t.add({
      id: `injector-required-${which}`,
      label: "Flow each injector must give at {ethanol}",
      params: e,
      formula: "fuel needed ÷ (density × injectors × design duty)",
      formulaImperial:
        "fuel needed × rating fluid density ÷ density ÷ (injectors × design duty), lb/h being rated with the rating fluid",
      inputs: [
        { label: "fuel needed", value: mdot, quantity: "massFlow" },
        { label: "density", value: b.densityKgPerL, quantity: "density" },
        { label: "injectors", value: n, quantity: "count" },
        { label: "design duty", value: limits.designDutyPct, quantity: "percent", decimals: 0 },
        RATING_FLUID,
      ],
      value: requiredInjectorFlowCcPerMin({
        fuelMassFlowGPerMin: mdot,
        densityKgPerL: b.densityKgPerL,
        injectorCount: n,
        designDutyPct: limits.designDutyPct,
      }),
      quantity: "injectorFlow",
    });
    const reqRated = t.add({
      id: `injector-rating-${which}`,
      label: "Smallest injector rating at {ethanol}",
      params: e,
      formula: "required flow × √(rated pressure ÷ pressure across)",
      inputs: [
        { label: "required flow", value: reqOp, quantity: "injectorFlow" },
        { label: "rated pressure", value: injectors.ratedPressureKpa, quantity: "pressure" },
        { label: "pressure across", value: dpOp, quantity: "pressure" },
      ],
      // The orifice law run backwards: the rating that gives reqOp at dpOp.
      value: injectorFlowAtPressure({
        ratedFlowCcPerMin: reqOp,
        ratedPressureKpa: dpOp,
        differentialPressureKpa: injectors.ratedPressureKpa,
      }),
      quantity: "injectorFlow",
    });
    const duty = t.add({
      id: `duty-${which}`,
      label: "Injector duty at {ethanol}",
      params: e,
      formula: "fuel needed ÷ (density × injectors × injector flow) × 100",
      formulaImperial:
        "fuel needed × rating fluid density ÷ density ÷ (injectors × injector flow) × 100",
      inputs: [
        { label: "fuel needed", value: mdot, quantity: "massFlow" },
        { label: "density", value: b.densityKgPerL, quantity: "density" },
        { label: "injectors", value: n, quantity: "count" },
        { label: "injector flow", value: qOp, quantity: "injectorFlow" },
        RATING_FLUID,
      ],
      value: injectorDutyPct({
        fuelMassFlowGPerMin: mdot,
        densityKgPerL: b.densityKgPerL,
        injectorCount: n,
        flowAtOperatingCcPerMin: qOp,
      }),
      quantity: "percent",
    });
    const ceiling = t.add({
      id: `injector-ceiling-${which}`,
      label: "Injector power ceiling at {ethanol}",
      params: e,
      formula: "design duty × injectors × injector flow × density × 60 ÷ BSFC",
      formulaImperial:
        "design duty × injectors × injector flow × density ÷ rating fluid density ÷ BSFC",
      inputs: [
        { label: "design duty", value: limits.designDutyPct, quantity: "percent", decimals: 0 },
        { label: "injectors", value: n, quantity: "count" },
        { label: "injector flow", value: qOp, quantity: "injectorFlow" },
        { label: "density", value: b.densityKgPerL, quantity: "density" },
        { label: "BSFC", value: bsfc, quantity: "bsfc" },
        RATING_FLUID,
      ],
      value: (design * n * qOp * b.densityKgPerL * 60) / bsfc,
      quantity: "power",
    });
    const effective = (duty / 100) * redlineCycle;
    const dt = dead(dpOp);
    const end: BlendEnd = {
      ethanolVolPct,
      densityKgPerL: b.densityKgPerL,
      stoichAfr: b.stoichAfr,
      bsfcGPerKwh: bsfc,
      bsfcSource,
      fuelMassFlowGPerMin: mdot,
      fuelVolumeFlowLPerH: volLPerH,
      requiredFlowAtOperatingCcPerMin: reqOp,
      requiredRatedFlowCcPerMin: reqRated,
      dutyPct: duty,
      powerCeilingKw: ceiling,
      pulseWidthRedline: {
        rpm: engine.redlineRpm,
        cycleMs: redlineCycle,
        effectiveMs: effective,
        deadTimeMs: dt,
        commandedMs: dt === null ? null : effective + dt,
      },
    };
    return { props: b, end };
  };

  const { props: leanProps, end: lean } = endOf(fuel.ethanolMinVolPct, "lean");
  const { props: richProps, end: rich } = endOf(fuel.ethanolMaxVolPct, "rich");
  // The worse end needs more fuel volume per injector-minute: duty and pump demand both go with
  // ṁ ÷ ρ, so one end is the worst for both (calc-spec §7). A tie is the rich end.
  const worstEnd: "lean" | "rich" = lean.dutyPct > rich.dutyPct ? "lean" : "rich";
  const worst = worstEnd === "lean" ? lean : rich;
  t.add({
    id: "pulse-redline",
    label: "Effective pulse width at {rpm} ({ethanol})",
    params: {
      rpm: { value: engine.redlineRpm, quantity: "speed" },
      ethanol: { value: worst.ethanolVolPct, quantity: "ethanol" },
    },
    formula: "duty × cycle, the cycle being 120 000 ÷ rpm",
    inputs: [
      { label: "duty", value: worst.dutyPct, quantity: "percent" },
      { label: "cycle", value: redlineCycle, quantity: "time" },
    ],
    value: worst.pulseWidthRedline.effectiveMs,
    quantity: "time",
  });

  // Idle: the least fuel is needed at the lowest ethanol content.
  const idleManifoldGauge = gaugeFromAbsKpa(engine.idleManifoldKpaAbs, engine.ambientKpaAbs);
  const dpIdle = injectorDifferentialPressureKpa({
    type: regulator.type,
    basePressureKpa: regulator.basePressureKpa,
    manifoldKpa: idleManifoldGauge,
  });
  const idleFuel = idleFuelPerCylinderMg({
    displacementL: engine.displacementL,
    cylinders: engine.cylinders,
    volumetricEfficiency: engine.idleVolumetricEfficiency,
    manifoldKpaAbs: engine.idleManifoldKpaAbs,
    intakeTempC: engine.intakeTempC,
    stoichAfr: leanProps.stoichAfr,
  });
  const fuelPerInjectionMg = (idleFuel.fuelMg * engine.cylinders) / n;
  const qIdle = injectorFlowAtPressure({
    ratedFlowCcPerMin: injectors.ratedFlowCcPerMin,
    ratedPressureKpa: injectors.ratedPressureKpa,
    differentialPressureKpa: dpIdle,
  });
  const idleEffective = t.add({
    id: "pulse-idle",
    label: "Effective pulse width at idle ({ethanol}, λ 1)",
    params: { ethanol: { value: lean.ethanolVolPct, quantity: "ethanol" } },
    formula: "fuel per injection ÷ (density × injector flow at idle pressure) × 60",
    formulaImperial:
      "fuel per injection ÷ (injector flow at idle pressure × density ÷ rating fluid density) × 7.937 (ms per mg at 1 lb/h)",
    inputs: [
      { label: "air per cylinder", value: idleFuel.airMg, quantity: "mass" },
      { label: "fuel per injection", value: fuelPerInjectionMg, quantity: "mass", decimals: 2 },
      { label: "density", value: leanProps.densityKgPerL, quantity: "density" },
      { label: "pressure across at idle", value: dpIdle, quantity: "pressure" },
      { label: "injector flow at idle", value: qIdle, quantity: "injectorFlow" },
      RATING_FLUID,
    ],
    value: (fuelPerInjectionMg / 1000 / leanProps.densityKgPerL / qIdle) * 60000,
    quantity: "time",
  });
  const idleDead = dead(dpIdle);

  // Pump: outlet pressure = rail + filter + feed-line drop at the pump's own flow (fixed point).
  const rail = railPressureKpa({
    type: regulator.type,
    basePressureKpa: regulator.basePressureKpa,
    manifoldKpa: engine.maxBoostKpa,
  });
  const demand = worst.fuelVolumeFlowLPerH;
  const feedLine = input.lines?.feed;
  const returnLine = input.lines?.return;
  const fluid = (flowLPerH: number) => ({
    flowLPerH,
    densityKgPerL: richProps.densityKgPerL,
    viscosityMPaS: richProps.viscosityMPaS,
  });
  const supplyAt = pumpSupplyFunction(pumps);
  const base = rail + (feedLine?.filterDropKpa ?? 0);
  const { outlet, feedDrop } = pumpOperatingPoint(base, feedLine, (p) =>
    fluid(supplyAt(p, voltageUsed).flowLPerH),
  );
  const supply = supplyAt(outlet, voltageUsed);
  t.add({
    id: "pump-outlet",
    label: "Pressure the pump works against",
    formula:
      regulator.type === "boost-referenced"
        ? "base pressure + boost + filter and feed-line losses"
        : "base pressure + filter and feed-line losses",
    inputs: [
      { label: "rail pressure", value: rail, quantity: "pressure" },
      { label: "filter drop", value: feedLine?.filterDropKpa ?? 0, quantity: "pressureDrop" },
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
    formula: "sum over pumps of quantity × flow on the curve at the outlet pressure and voltage",
    inputs: [
      { label: "outlet pressure", value: outlet, quantity: "pressure" },
      { label: "voltage", value: voltageUsed, quantity: "voltage" },
    ],
    value: supply.flowLPerH,
    quantity: "volumeFlow",
  });
  const margin = t.add({
    id: "pump-margin",
    label: "Pump margin",
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
    value:
      ((supply.flowLPerH / (1 + limits.minPumpMarginPct / 100)) * worst.densityKgPerL * 1000) /
      worst.bsfcGPerKwh,
    quantity: "power",
  });

  // Idle: the return line carries almost the whole pump flow.
  const idleRail = railPressureKpa({
    type: regulator.type,
    basePressureKpa: regulator.basePressureKpa,
    manifoldKpa: idleManifoldGauge,
  });
  const idleSupply = supplyAt(Math.max(0, idleRail), voltageUsed);
  const idleConsumptionLPerH =
    ((idleFuel.fuelMg * engine.cylinders * (engine.idleRpm / 2)) / 1000 / leanProps.densityKgPerL) *
    0.06;
  const idleReturn = Math.max(0, idleSupply.flowLPerH - idleConsumptionLPerH);

  // Lines
  const lineResult = (
    line: { insideDiameterMm: number; lengthM: number; roughnessMm?: number; fittingsK: number },
    flow: number,
  ): LineResult => {
    // Fields listed one by one: object spread is slow on V8's hot path here (measured, ~8 µs).
    const d = linePressureDrop(line, fluid(flow));
    return {
      velocityMPerS: d.velocityMPerS,
      reynolds: d.reynolds,
      regime: d.regime,
      frictionFactor: d.frictionFactor,
      pressureDropKpa: d.pressureDropKpa,
      flowLPerH: flow,
      insideDiameterMm: line.insideDiameterMm,
      lengthM: line.lengthM,
      withinLimit: d.pressureDropKpa <= limits.maxLineDropKpa,
    };
  };
  const feed = feedLine ? lineResult(feedLine, supply.flowLPerH) : null;
  const ret = returnLine ? lineResult(returnLine, idleReturn) : null;
  if (feed) {
    t.add({
      id: "feed-drop",
      label: "Feed-line pressure drop at full load",
      formula: "(friction factor × length ÷ diameter + fittings K) × density × velocity² ÷ 2",
      inputs: [
        { label: "flow", value: feed.flowLPerH, quantity: "volumeFlow" },
        { label: "inside diameter", value: feed.insideDiameterMm, quantity: "diameter" },
        { label: "velocity", value: feed.velocityMPerS, quantity: "velocity" },
        { label: "Reynolds number", value: feed.reynolds, quantity: "reynolds" },
        { label: "friction factor", value: feed.frictionFactor, quantity: "frictionFactor" },
      ],
      value: feed.pressureDropKpa,
      quantity: "pressureDrop",
    });
  }
  if (ret) {
    t.add({
      id: "return-drop",
      label: "Return-line pressure drop at idle",
      formula: "(friction factor × length ÷ diameter + fittings K) × density × velocity² ÷ 2",
      inputs: [
        { label: "return flow at idle", value: ret.flowLPerH, quantity: "volumeFlow" },
        { label: "inside diameter", value: ret.insideDiameterMm, quantity: "diameter" },
        { label: "velocity", value: ret.velocityMPerS, quantity: "velocity" },
        { label: "friction factor", value: ret.frictionFactor, quantity: "frictionFactor" },
      ],
      value: ret.pressureDropKpa,
      quantity: "pressureDrop",
    });
  }
  const recommend = (
    flow: number,
    like?: { lengthM: number; roughnessMm?: number; fittingsK: number },
  ): number | null => {
    for (const size of AN_SIZES) {
      const drop = linePressureDrop(
        {
          insideDiameterMm: size.typicalHoseIdMm,
          lengthM: like?.lengthM ?? ASSUMED_LINE_LENGTH_M,
          roughnessMm: like?.roughnessMm,
          fittingsK: like?.fittingsK ?? 0,
        },
        fluid(flow),
      );
      if (drop.pressureDropKpa <= limits.maxLineDropKpa) return size.dash;
    }
    return null;
  };
  const recommendedFeedDash = recommend(supply.flowLPerH, feedLine);
  const recommendedReturnDash = recommend(idleReturn, returnLine);

  // Ceiling
  const injCeiling = Math.min(lean.powerCeilingKw, rich.powerCeilingKw);
  const pumpLimited = pumpCeiling < injCeiling;
  const ceilingKw = Math.min(injCeiling, pumpCeiling);
  const limitedBy: FuelSystemResult["powerCeiling"]["limitedBy"] = pumpLimited
    ? feed && !feed.withinLimit
      ? "feed-line"
      : "pump"
    : "injectors";

  // Warnings: templates with their figures as data, formatted at the edge in the reader's units.
  const dutyMax = Math.max(lean.dutyPct, rich.dutyPct);
  const dutyBand =
    dutyMax >= 100
      ? "static"
      : dutyMax > limits.dutyDangerPct
        ? "danger"
        : dutyMax > limits.dutyCautionPct
          ? "caution"
          : "ok";
  const needRating = Math.max(lean.requiredRatedFlowCcPerMin, rich.requiredRatedFlowCcPerMin);
  const biggerInjector =
    "Fit injectors rated at least {needRating} at {ratedPressure}, add injectors, or raise the base pressure.";
  const injectorFix = {
    needRating: { value: Math.ceil(needRating), quantity: "injectorFlow" as const },
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
  const idleCommanded = idleDead === null ? null : idleEffective + idleDead;
  if (
    injectors.minPulseWidthMs !== undefined &&
    (idleCommanded ?? idleEffective) < injectors.minPulseWidthMs
  ) {
    warn(
      "idle-pulse-short",
      "caution",
      idleCommanded === null
        ? "At idle the injectors would open for {pulse} (opening time; no dead-time table, so the commanded pulse is unknown and a little longer), below their {min} minimum: expect a rough, uneven idle."
        : "At idle the commanded pulse would be {pulse} (opening time plus dead time), below the injectors' {min} minimum: expect a rough, uneven idle.",
      "Choose smaller injectors, lower the base pressure, or raise idle speed or airflow.",
      {
        pulse: { value: idleCommanded ?? idleEffective, quantity: "time" },
        min: { value: injectors.minPulseWidthMs, quantity: "time" },
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
    deadTimeMs(injectors.deadTime, injectorVoltage, dpOp).outOfRange ||
    deadTimeMs(injectors.deadTime, injectorVoltage, dpIdle).outOfRange
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
  } else if (margin < limits.minPumpMarginPct) {
    warn(
      "pump-margin-low",
      "caution",
      "Pump margin is {margin}, below the {min} minimum.",
      "Fit a larger pump or a second one, or improve the pump's wiring.",
      {
        margin: { value: margin, quantity: "percent", decimals: 0 },
        min: { value: limits.minPumpMarginPct, quantity: "percent", decimals: 0 },
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
  const limiterWarned =
    limitedBy === "injectors"
      ? dutyBand !== "ok"
      : limitedBy === "pump"
        ? supply.flowLPerH < demand || margin < limits.minPumpMarginPct
        : feed !== null && !feed.withinLimit;
  if (ceilingKw < crankPowerKw && !limiterWarned) {
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
  if (fuel.ethanolMaxVolPct - fuel.ethanolMinVolPct >= 20) {
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

  return {
    calcVersion: CALC_VERSION,
    wheelPowerKw,
    crankPowerKw,
    fuelMassFlowGPerMin: worst.fuelMassFlowGPerMin,
    fuelVolumeFlowLPerH: worst.fuelVolumeFlowLPerH,
    blend: { lean, rich, worstEnd },
    injector: {
      count: n,
      voltage: injectorVoltage,
      differentialPressureKpa: dpOp,
      flowAtOperatingCcPerMin: qOp,
      requiredFlowAtOperatingCcPerMin: Math.max(
        lean.requiredFlowAtOperatingCcPerMin,
        rich.requiredFlowAtOperatingCcPerMin,
      ),
      requiredRatedFlowCcPerMin: needRating,
      dutyPct: worst.dutyPct,
      dutyBand,
      powerCeilingKw: injCeiling,
      pulseWidthRedline: worst.pulseWidthRedline,
      pulseWidthIdle: {
        rpm: engine.idleRpm,
        cycleMs: cycleTimeMs(engine.idleRpm),
        effectiveMs: idleEffective,
        deadTimeMs: idleDead,
        commandedMs: idleCommanded,
        differentialPressureKpa: dpIdle,
        minPulseWidthMs: injectors.minPulseWidthMs ?? null,
        fuelPerInjectionMg,
      },
    },
    pump: {
      voltageUsed,
      wireDropV,
      railPressureKpa: rail,
      outletPressureKpa: outlet,
      demandLPerH: demand,
      supplyLPerH: supply.flowLPerH,
      marginPct: margin,
      returnFlowLPerH: Math.max(0, supply.flowLPerH - demand),
      powerCeilingKw: pumpCeiling,
      idleRailPressureKpa: idleRail,
      idleSupplyLPerH: idleSupply.flowLPerH,
      idleReturnFlowLPerH: idleReturn,
    },
    lines: {
      feed,
      return: ret,
      recommendedFeedDash,
      recommendedReturnDash,
      assumedLengthM: feedLine && returnLine ? null : ASSUMED_LINE_LENGTH_M,
    },
    powerCeiling: { kw: ceilingKw, limitedBy, headroomPct: (ceilingKw / crankPowerKw - 1) * 100 },
    limits,
    warnings,
    trace: t.steps,
  };
}

/**
 * Stage "pump operating point" (docs/calculations.md §4.1): the outlet pressure p solves
 * g(p) = p − base − drop(supply(p)) = 0, base being rail + filter. g rises with p and the root
 * lies between base and base + drop(supply(base)). Illinois false position.
 */
function pumpOperatingPoint(
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
