// Reference: docs/calculations.md §2.3, §3.3 (stage "blend ends" of §7).
import { fuelBlend, type FuelBlend } from "../fuel";
import {
  injectorDutyPct,
  injectorFlowAtPressure,
  injectorFlowForFuel,
  injectorPowerCeilingKw,
  requiredInjectorFlowCcPerMin,
} from "../injectors";
import { bsfcAtBlend, defaultBsfc, fuelMassFlowGPerMin, fuelVolumeFlowLPerH } from "../power";
import { INJECTOR_RATING_DENSITY_KG_PER_L } from "../units";
import type { SizingContext } from "./context";
import { redlinePulse, type InjectorOperatingPoint } from "./injector-stage";
import type { BlendEnd } from "./result";

/** The rating fluid behind lb/h injector ratings: a constant only the imperial formulas need. */
export const RATING_FLUID = {
  label: "rating fluid density",
  value: INJECTOR_RATING_DENSITY_KG_PER_L,
  quantity: "density",
  only: "imperial",
} as const;

/**
 * BSFC at one end of the blend range (calc-spec §2): a given BSFC belongs to the fuel it was
 * taken at, and the other end gets it scaled by the rule-of-thumb ratio between the contents;
 * without one, the rule of thumb.
 */
function bsfcAtEnd(
  { input, t }: SizingContext,
  ethanolVolPct: number,
  which: "lean" | "rich",
): { bsfc: number; source: BlendEnd["bsfcSource"] } {
  const { fuel, engine } = input;
  const e = { ethanol: { value: ethanolVolPct, quantity: "ethanol" as const } };
  if (fuel.bsfcGPerKwh !== undefined) {
    const at = fuel.bsfcEthanolVolPct ?? fuel.ethanolMinVolPct;
    if (at === ethanolVolPct) return { bsfc: fuel.bsfcGPerKwh, source: "given" };
    const scaled = bsfcAtBlend({
      bsfcGPerKwh: fuel.bsfcGPerKwh,
      fromEthanolVolPct: at,
      toEthanolVolPct: ethanolVolPct,
      aspiration: engine.aspiration,
      defaults: fuel.bsfcDefaults,
      properties: fuel.properties,
    });
    const bsfc = t.add({
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
    return { bsfc, source: "scaled" };
  }
  const est = defaultBsfc({
    ethanolVolPct,
    aspiration: engine.aspiration,
    targetLambda: fuel.targetLambda,
    defaults: fuel.bsfcDefaults,
  });
  const bsfc = t.add({
    id: `bsfc-${which}`,
    label:
      which === "lean"
        ? "BSFC at {ethanol} (lowest ethanol)"
        : "BSFC at {ethanol} (highest ethanol)",
    params: e,
    formula:
      "gasoline and E85 rules of thumb, linear in ethanol %, × reference lambda ÷ target lambda",
    inputs: [
      // The rule of thumb's BSFC (taken at the reference lambda, named next): a label that ends
      // in a word of its own, so the figure never reads as the lambda's ("… lambda 0.800 lb/hp/h").
      { label: "rule-of-thumb BSFC", value: est.atReferenceGPerKwh, quantity: "bsfc" },
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
  return { bsfc, source: "rule-of-thumb" };
}

/**
 * Stage "blend ends": at one end of the blend range, the BSFC, fuel needed, the flow each
 * injector must give and the rating that means, the chosen injector's duty, its power ceiling
 * at the design duty and the pulse width at redline.
 */
export function blendEndStage(
  ctx: SizingContext,
  op: InjectorOperatingPoint,
  crankPowerKw: number,
  ethanolVolPct: number,
  which: "lean" | "rich",
): { props: FuelBlend; end: BlendEnd } {
  const { input, limits, t } = ctx;
  const { injectors } = input;
  const n = injectors.count;
  const { dpOp, qOp } = op;
  const b = fuelBlend(ethanolVolPct, input.fuel.properties);
  const e = { ethanol: { value: ethanolVolPct, quantity: "ethanol" as const } };
  // The rating's test fluid (§3.10): this fuel's volume flow, and the rating's scale back.
  const testFluid = injectors.ratingFluidDensityKgPerL;
  const qFuel =
    testFluid === undefined
      ? qOp
      : t.add({
          id: `injector-flow-fuel-${which}`,
          label: "Injector flow of the fuel at {ethanol}",
          params: e,
          formula: "flow at that pressure × √(rating fluid density ÷ fuel density)",
          inputs: [
            { label: "flow at that pressure", value: qOp, quantity: "injectorFlow" },
            { label: "rating fluid density", value: testFluid, quantity: "density" },
            { label: "fuel density", value: b.densityKgPerL, quantity: "density" },
          ],
          value: injectorFlowForFuel({
            flowCcPerMin: qOp,
            ratingFluidDensityKgPerL: testFluid,
            fuelDensityKgPerL: b.densityKgPerL,
          }),
          quantity: "injectorFlow",
        });
  const { bsfc, source } = bsfcAtEnd(ctx, ethanolVolPct, which);
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
  const volLPerH = fuelVolumeFlowLPerH({
    fuelMassFlowGPerMin: mdot,
    densityKgPerL: b.densityKgPerL,
  });
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
    // The orifice law run backwards: the rating that gives reqOp at dpOp (in the rating's
    // test fluid where its density is given).
    value: ((rated: number) =>
      testFluid === undefined
        ? rated
        : injectorFlowForFuel({
            flowCcPerMin: rated,
            ratingFluidDensityKgPerL: b.densityKgPerL,
            fuelDensityKgPerL: testFluid,
          }))(
      injectorFlowAtPressure({
        ratedFlowCcPerMin: reqOp,
        ratedPressureKpa: dpOp,
        differentialPressureKpa: injectors.ratedPressureKpa,
      }),
    ),
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
      { label: "injector flow", value: qFuel, quantity: "injectorFlow" },
      RATING_FLUID,
    ],
    value: injectorDutyPct({
      fuelMassFlowGPerMin: mdot,
      densityKgPerL: b.densityKgPerL,
      injectorCount: n,
      flowAtOperatingCcPerMin: qFuel,
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
      { label: "injector flow", value: qFuel, quantity: "injectorFlow" },
      { label: "density", value: b.densityKgPerL, quantity: "density" },
      { label: "BSFC", value: bsfc, quantity: "bsfc" },
      RATING_FLUID,
    ],
    value: injectorPowerCeilingKw({
      dutyPct: limits.designDutyPct,
      injectorCount: n,
      flowAtOperatingCcPerMin: qFuel,
      densityKgPerL: b.densityKgPerL,
      bsfcGPerKwh: bsfc,
    }),
    quantity: "power",
  });
  const end: BlendEnd = {
    ethanolVolPct,
    densityKgPerL: b.densityKgPerL,
    stoichAfr: b.stoichAfr,
    bsfcGPerKwh: bsfc,
    bsfcSource: source,
    fuelMassFlowGPerMin: mdot,
    fuelVolumeFlowLPerH: volLPerH,
    requiredFlowAtOperatingCcPerMin: reqOp,
    requiredRatedFlowCcPerMin: reqRated,
    injectorFlowCcPerMin: qFuel,
    dutyPct: duty,
    powerCeilingKw: ceiling,
    pulseWidthRedline: redlinePulse(ctx, op, duty),
  };
  return { props: b, end };
}

/**
 * The worse end needs more fuel volume per injector-minute: duty and pump demand both go with
 * ṁ ÷ ρ, so one end is the worst for both (calc-spec §7). A tie is the rich end.
 */
export const worseEnd = (lean: BlendEnd, rich: BlendEnd): "lean" | "rich" =>
  lean.dutyPct > rich.dutyPct ? "lean" : "rich";
