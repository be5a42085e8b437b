/**
 * Physical constants and default fuel-component properties: the one module of conversion
 * factors, every conversion in the library uses these. Exact factors are from NIST SP 811
 * (2008), appendix B.8; fuel properties are the defaults of the calculation spec, which a shop
 * may override. docs/calculations.md §0.
 */

/** 1 lb = 0.45359237 kg exactly (NIST SP 811). */
export const KG_PER_LB = 0.45359237;
/**
 * 1 grain = 1/7000 lb = 64.79891 mg exactly (the international yard and pound agreement of 1959,
 * which made 1 lb = 0.45359237 kg; NIST SP 811 B.8: grain = 6.479 891 E−05 kg, exact).
 */
export const GRAINS_PER_LB = 7000;
export const MG_PER_GRAIN = 64.79891;
/** 1 US gallon = 3.785411784 L exactly (NIST SP 811). */
export const L_PER_US_GAL = 3.785411784;
/** 1 in = 25.4 mm exactly (NIST SP 811). */
export const MM_PER_IN = 25.4;
/** 1 cubic inch = 16.387064 cm³ = 0.016387064 L exactly (NIST SP 811 B.8: (2.54 cm)³). */
export const L_PER_CU_IN = (MM_PER_IN / 100) ** 3;
/** 1 ft = 0.3048 m exactly (NIST SP 811). */
export const M_PER_FT = 0.3048;
/** Standard acceleration of gravity, 9.80665 m/s² exactly (NIST SP 811; CGPM 1901). */
export const STANDARD_GRAVITY_M_PER_S2 = 9.80665;
/** 1 psi = 1 lbf/in² = 0.45359237 × 9.80665 N / (0.0254 m)² = 6.894 757 293 168 kPa (NIST SP 811, exact). */
export const KPA_PER_PSI =
  (KG_PER_LB * STANDARD_GRAVITY_M_PER_S2) / ((MM_PER_IN / 1000) * (MM_PER_IN / 1000)) / 1000;
/** 1 bar = 100 kPa exactly (NIST SP 811). */
export const KPA_PER_BAR = 100;
/** °F ↔ °C: t/°C = (t/°F − 32) / 1.8 exactly (NIST SP 811 B.8). */
export const celsiusFromFahrenheit = (f: number): number => (f - 32) / 1.8;
export const fahrenheitFromCelsius = (c: number): number => c * 1.8 + 32;
/** A temperature difference: 1 K = 1.8 °F·difference exactly (NIST SP 811 B.8, no offset). */
export const FAHRENHEIT_DEGREES_PER_KELVIN = 1.8;
/** 1 lbf·ft = 0.45359237 × 9.80665 N × 0.3048 m = 1.355 817 948 N·m (NIST SP 811, exact factors). */
export const NM_PER_LBF_FT = KG_PER_LB * STANDARD_GRAVITY_M_PER_S2 * M_PER_FT;
/** 1 hp (550 ft·lbf/s) = 0.74569987158227 kW (NIST SP 811). */
export const KW_PER_HP = 0.74569987158227022;
/** 1 metric horsepower (PS) = 0.73549875 kW (NIST SP 811). */
export const KW_PER_PS = 0.73549875;
/** Standard atmosphere, kPa absolute. */
export const ATMOSPHERE_KPA = 101.325;
/** Specific gas constant of dry air, J/(kg·K). */
export const R_AIR_J_PER_KG_K = 287.05;
/** Mass fraction of oxygen in dry air (CRC Handbook, 23.14 %). */
export const OXYGEN_MASS_FRACTION_AIR = 0.2314;
/** Standard atomic masses, g/mol. */
export const ATOMIC_MASS = { C: 12.011, H: 1.008, O: 15.999 } as const;
/** Electrical resistivity of annealed copper at 20 °C, Ω·m (IEC 60028, 100 % IACS). */
export const COPPER_RESISTIVITY_OHM_M = 1.7241e-8;

/** Elemental mass fractions of a compound CxHyOz. */
export function compositionOf(c: number, h: number, o: number) {
  const m = c * ATOMIC_MASS.C + h * ATOMIC_MASS.H + o * ATOMIC_MASS.O;
  return {
    carbonMassFraction: (c * ATOMIC_MASS.C) / m,
    hydrogenMassFraction: (h * ATOMIC_MASS.H) / m,
    oxygenMassFraction: (o * ATOMIC_MASS.O) / m,
  };
}

export interface FuelComponent {
  densityKgPerL: number;
  stoichAfr: number;
  lowerHeatingValueMjPerKg: number;
  /** Dynamic viscosity at about 20 °C. */
  viscosityMPaS: number;
}

/**
 * Ethanol-free gasoline base. Density 0.745 kg/L at 15 °C (mid EN 228 range 0.720–0.775);
 * stoich 14.7; LHV ≈ 43 MJ/kg. Viscosity 0.41 mPa·s: AFDC's kinematic 0.5–0.6 mm²/s at 20 °C
 * times the density.
 */
export const GASOLINE: FuelComponent = {
  densityKgPerL: 0.745,
  stoichAfr: 14.7,
  lowerHeatingValueMjPerKg: 43.0,
  viscosityMPaS: 0.41,
};

/** Ethanol C2H5OH, composition for the stoichiometric ratio computed from chemistry. */
export const ETHANOL_COMPOSITION = compositionOf(2, 6, 1);
/** Methanol CH3OH. */
export const METHANOL_COMPOSITION = compositionOf(1, 4, 1);
