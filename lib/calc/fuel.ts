// Reference: docs/calculations.md §1.
import { CalcInputError, requireRange } from "./_lib/input-error";
import {
  ATOMIC_MASS,
  ETHANOL_COMPOSITION,
  GASOLINE,
  METHANOL_COMPOSITION,
  OXYGEN_MASS_FRACTION_AIR,
  type FuelComponent,
} from "./constants";

export interface Composition {
  carbonMassFraction: number;
  hydrogenMassFraction: number;
  oxygenMassFraction: number;
}

/**
 * Stoichiometric air–fuel ratio (by mass) of a fuel from its elemental mass fractions.
 * Oxygen needed per kg of fuel = C·(32/12.011) + H·(8/1.008) − O, divided by oxygen's mass
 * fraction in dry air (0.2314).
 *
 * @example stoichAfrFromComposition({ carbonMassFraction: 0.5214, hydrogenMassFraction: 0.1313, oxygenMassFraction: 0.3473 }) // ≈ 9.0 (ethanol)
 */
export function stoichAfrFromComposition(c: Composition): number {
  const { carbonMassFraction: C, hydrogenMassFraction: H, oxygenMassFraction: O } = c;
  requireRange("carbonMassFraction", C, 0, 1, "Carbon mass fraction");
  requireRange("hydrogenMassFraction", H, 0, 1, "Hydrogen mass fraction");
  requireRange("oxygenMassFraction", O, 0, 1, "Oxygen mass fraction");
  const sum = C + H + O;
  if (Math.abs(sum - 1) > 0.02) {
    throw new CalcInputError(
      "composition",
      `Mass fractions must add up to 1 (they add up to ${sum.toFixed(3)})`,
    );
  }
  const oxygenNeeded =
    C * ((2 * ATOMIC_MASS.O) / ATOMIC_MASS.C) + H * (ATOMIC_MASS.O / 2 / ATOMIC_MASS.H) - O;
  if (oxygenNeeded <= 0) {
    throw new CalcInputError(
      "composition",
      "This composition carries all the oxygen it needs: it is not a fuel",
    );
  }
  return oxygenNeeded / OXYGEN_MASS_FRACTION_AIR;
}

/**
 * Ethanol (denatured-free). Density 0.794 kg/L at 15 °C (AFDC; 27 CFR §21.161 gives
 * 0.7938 at 60/60 °F); stoich from C2H5OH; LHV ≈ 26.8 MJ/kg; viscosity 1.18 mPa·s (AFDC's
 * 1.50 mm²/s at 20 °C times 0.789 kg/L).
 */
export const ETHANOL: FuelComponent = {
  densityKgPerL: 0.794,
  stoichAfr: stoichAfrFromComposition(ETHANOL_COMPOSITION),
  lowerHeatingValueMjPerKg: 26.8,
  viscosityMPaS: 1.18,
};

/** Methanol CH3OH (optional component): 0.796 kg/L, stoich from chemistry, ≈ 19.9 MJ/kg. */
export const METHANOL: FuelComponent = {
  densityKgPerL: 0.796,
  stoichAfr: stoichAfrFromComposition(METHANOL_COMPOSITION),
  lowerHeatingValueMjPerKg: 19.9,
  viscosityMPaS: 0.58,
};

export interface FuelBlend {
  ethanolVolPct: number;
  ethanolMassFraction: number;
  densityKgPerL: number;
  stoichAfr: number;
  lowerHeatingValueMjPerKg: number;
  viscosityMPaS: number;
}

/** Overrides of the component properties (a shop's settings). */
export interface FuelProperties {
  gasoline?: Partial<FuelComponent>;
  ethanol?: Partial<FuelComponent>;
}

/** The component with the overrides that are given (a key present but undefined keeps the default). */
function withDefined(base: FuelComponent, over: Partial<FuelComponent>): FuelComponent {
  const out = { ...base };
  for (const k of Object.keys(over) as (keyof FuelComponent)[]) {
    const v = over[k];
    if (v !== undefined) out[k] = v;
  }
  return out;
}

/**
 * Properties of a gasoline–ethanol blend named by its ethanol content by volume (E10 = 10).
 * Density is volume-weighted; stoich AFR and heating value are mass-weighted; viscosity uses
 * a logarithmic (Arrhenius) mixing rule by volume fraction.
 *
 * @example fuelBlend(85) // { ethanolMassFraction: ≈0.858, densityKgPerL: ≈0.787, stoichAfr: ≈9.81, ... }
 */
export function fuelBlend(ethanolVolPct: number, properties: FuelProperties = {}): FuelBlend {
  requireRange("ethanolVolPct", ethanolVolPct, 0, 100, "Ethanol content");
  const g = properties.gasoline ? withDefined(GASOLINE, properties.gasoline) : GASOLINE;
  const e = properties.ethanol ? withDefined(ETHANOL, properties.ethanol) : ETHANOL;
  const v = ethanolVolPct / 100;
  const ethanolMass = v * e.densityKgPerL;
  const gasolineMass = (1 - v) * g.densityKgPerL;
  const w = ethanolMass / (ethanolMass + gasolineMass);
  return {
    ethanolVolPct,
    ethanolMassFraction: w,
    densityKgPerL: ethanolMass + gasolineMass,
    stoichAfr: w * e.stoichAfr + (1 - w) * g.stoichAfr,
    lowerHeatingValueMjPerKg: w * e.lowerHeatingValueMjPerKg + (1 - w) * g.lowerHeatingValueMjPerKg,
    viscosityMPaS: Math.exp(v * Math.log(e.viscosityMPaS) + (1 - v) * Math.log(g.viscosityMPaS)),
  };
}

/**
 * Air–fuel ratio for a lambda on a given blend: AFR = λ · AFR_stoich.
 * @example afrFromLambda(0.8, 9.8) // 7.84
 */
export function afrFromLambda(lambda: number, stoichAfr: number): number {
  requireRange("lambda", lambda, 0.3, 3, "Lambda");
  requireRange("stoichAfr", stoichAfr, 1, 30, "Stoichiometric AFR");
  return lambda * stoichAfr;
}

/**
 * Lambda from an AFR reading. Pass `stoichAfr` 14.7 for a wideband that shows "gasoline AFR"
 * whatever the fuel (the reading is λ × 14.7).
 * @example lambdaFromAfr(11.76, 14.7) // 0.8
 */
export function lambdaFromAfr(afr: number, stoichAfr: number): number {
  requireRange("afr", afr, 1, 60, "AFR");
  requireRange("stoichAfr", stoichAfr, 1, 30, "Stoichiometric AFR");
  return afr / stoichAfr;
}

/**
 * Ethanol content ranges of flex-fuel standards, by volume. A build on pump "E85" is sized
 * across the range the customer will really buy; ASTM D5798's is the default.
 */
export const E85_STANDARD_RANGES = {
  /** ASTM D5798 (revisions from 2011): 51–83 vol % ethanol across the volatility classes. */
  astmD5798: { ethanolMinVolPct: 51, ethanolMaxVolPct: 83 },
  /** ASTM D5798 before 2011: 68–83 vol %. */
  astmD5798Pre2011: { ethanolMinVolPct: 68, ethanolMaxVolPct: 83 },
} as const;

/** Default blend range for a build that runs on pump E85. */
export const DEFAULT_E85_RANGE = E85_STANDARD_RANGES.astmD5798;
