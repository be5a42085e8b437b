// Reference: docs/calculations.md §4.3.
import { requirePositive, requireRange } from "./_lib/input-error";
import { COPPER_RESISTIVITY_OHM_M } from "./constants";

/**
 * Diameter of an AWG size: d = 0.127 mm × 92^((36 − n)/39) (ASTM B258). 0 is "1/0", −1 "2/0"…
 * @example awgDiameterMm(10) // 2.588
 */
export function awgDiameterMm(gauge: number): number {
  requireRange("gaugeAwg", gauge, -3, 40, "Wire gauge (AWG)");
  return 0.127 * Math.pow(92, (36 - gauge) / 39);
}

/**
 * Resistance of annealed copper wire at 20 °C per metre (IEC 60028 resistivity).
 * @example copperResistanceOhmPerM(10) // 0.003277
 */
export function copperResistanceOhmPerM(gauge: number): number {
  const dM = awgDiameterMm(gauge) / 1000;
  return COPPER_RESISTIVITY_OHM_M / ((Math.PI * dM * dM) / 4);
}

/**
 * Voltage lost in the pump's feed and ground wires: V = I · R, R over the round-trip length.
 * @example wireVoltageDropV({ gaugeAwg: 12, roundTripLengthM: 10, currentA: 15 }) // 0.78
 */
export function wireVoltageDropV(q: {
  gaugeAwg: number;
  roundTripLengthM: number;
  currentA: number;
}): number {
  requirePositive("roundTripLengthM", q.roundTripLengthM, 100, "Wire length");
  requireRange("currentA", q.currentA, 0, 200, "Pump current");
  return q.currentA * copperResistanceOhmPerM(q.gaugeAwg) * q.roundTripLengthM;
}

/**
 * Voltage left at the pump after its wiring: supply − I · R (never below 0).
 * @example voltageAfterWiringV({ sourceVoltage: 14, gaugeAwg: 12, roundTripLengthM: 10, currentA: 15 }) // 13.22
 */
export function voltageAfterWiringV(q: {
  sourceVoltage: number;
  gaugeAwg: number;
  roundTripLengthM: number;
  currentA: number;
}): { voltage: number; dropV: number } {
  requireRange("sourceVoltage", q.sourceVoltage, 0, 60, "Supply voltage");
  const dropV = wireVoltageDropV(q);
  return { voltage: Math.max(0, q.sourceVoltage - dropV), dropV };
}
