import convert from "convert-units";
import fc from "fast-check";
import { describe, expect, it } from "vitest";

import {
  afrFromLambda,
  awgDiameterMm,
  bsfcAtBlend,
  CalcInputError,
  colebrookFrictionFactor,
  crankPowerFromWheel,
  cycleTimeMs,
  deadTimeMs,
  defaultBsfc,
  demandAtBoostLPerH,
  dutyBand,
  effectivePulseWidthMs,
  flexSensorAdvice,
  frictionFactor,
  fuelBlend,
  fuelMassFlowGPerMin,
  fuelPressureAgainstBoost,
  FuelSystemInputSchema,
  fuelVolumeFlowLPerH,
  gaugeFromAbsKpa,
  idleFuelConsumptionLPerH,
  idleFuelPerCylinderMg,
  injectorDifferentialPressureKpa,
  injectorDutyPct,
  injectorFlowAtPressure,
  injectorFlowForFuel,
  injectorPowerCeilingKw,
  KPA_PER_PSI,
  lambdaFromAfr,
  laminarFrictionFactor,
  linePressureDrop,
  pressureFromKpa,
  pulseWidthForFuelMs,
  pumpFlowLPerH,
  pumpMarginPct,
  pumpPowerCeilingKw,
  railPressureKpa,
  regulatorBypassCapacityLPerH,
  requiredInjectorFlowCcPerMin,
  sizeFuelSystem,
  supplyAgainstBoost,
  swameeJainFrictionFactor,
  voltageAfterWiringV,
  volumeFlowFromLPerH,
  wheelPowerFromCrank,
  wireVoltageDropV,
} from "@/lib/calc";

import { boostedSix } from "./fixtures";

const refuses = (f: () => unknown, field?: string) => {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(CalcInputError);
    if (field) expect((e as CalcInputError).field).toBe(field);
    return;
  }
  throw new Error("expected a CalcInputError");
};

describe("exported functions refuse what they cannot work with (docs/calculations.md §8)", () => {
  it("zero injectors and 0 % design duty", () => {
    refuses(
      () =>
        injectorDutyPct({
          fuelMassFlowGPerMin: 3000,
          densityKgPerL: 0.787,
          injectorCount: 0,
          flowAtOperatingCcPerMin: 1000,
        }),
      "injectorCount",
    );
    refuses(
      () =>
        requiredInjectorFlowCcPerMin({
          fuelMassFlowGPerMin: 3000,
          densityKgPerL: 0.787,
          injectorCount: 6,
          designDutyPct: 0,
        }),
      "designDutyPct",
    );
  });

  it("a fixed regulator below the boost (no pressure across the injector)", () => {
    refuses(
      () =>
        injectorDifferentialPressureKpa({ type: "fixed", basePressureKpa: 300, manifoldKpa: 350 }),
      "basePressureKpa",
    );
    // 400 − 150 = 250 kPa (calc-spec §3, by hand).
    expect(
      injectorDifferentialPressureKpa({ type: "fixed", basePressureKpa: 400, manifoldKpa: 150 }),
    ).toBe(250);
  });

  it("a dead-time table with falling voltages, named by the column", () => {
    refuses(
      () =>
        deadTimeMs(
          {
            voltages: [14, 12],
            pressuresKpa: [300],
            deadTimeMs: [[0.9], [1.1]],
          },
          13,
          300,
        ),
      "deadTime.voltages.1",
    );
  });

  it("pump curves whose flow rises with pressure, or two points at one pressure, with the point named", () => {
    const curve = (points: { pressureKpa: number; flowLPerH: number }[]) => ({
      quantity: 1,
      curves: [{ voltage: 12, points }],
    });
    refuses(
      () =>
        pumpFlowLPerH(
          curve([
            { pressureKpa: 300, flowLPerH: 250 },
            { pressureKpa: 500, flowLPerH: 280 },
          ]),
          400,
          12,
        ),
      "pumps.0.curves.0.points.1.flowLPerH",
    );
    refuses(
      () =>
        pumpFlowLPerH(
          curve([
            { pressureKpa: 300, flowLPerH: 250 },
            { pressureKpa: 300, flowLPerH: 240 },
          ]),
          400,
          12,
        ),
      "pumps.0.curves.0.points.1.pressureKpa",
    );
    // The schema refuses the same at the point's field, so the editor highlights it.
    const bad = structuredClone(boostedSix);
    bad.pumps[0]!.curves[0]!.points[2]!.flowLPerH = 320;
    const parsed = FuelSystemInputSchema.safeParse(bad);
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues[0]!.path.join(".")).toBe("pumps.0.curves.0.points.2.flowLPerH");
    expect(() => sizeFuelSystem(bad)).toThrow(CalcInputError);
  });
});

describe("one set of NIST SP 811 factors (docs/calculations.md §0)", () => {
  it("psi is lbf/in² from the exact pound, gravity and inch; convert-units agrees", () => {
    // NIST SP 811 (2008) B.8: 1 psi = 6.894 757 E+03 Pa; exact from 0.45359237 kg × 9.80665
    // m/s² ÷ (0.0254 m)².
    expect(KPA_PER_PSI).toBeCloseTo(6.894757293168361, 12);
    expect(pressureFromKpa(100, "psi")).toBeCloseTo(convert(100).from("kPa").to("psi"), 3);
    // 1 US gal = 3.785411784 L exactly (NIST SP 811 B.8); convert-units cross-check.
    expect(volumeFlowFromLPerH(100, "gal/h")).toBeCloseTo(convert(100).from("l/h").to("gal/h"), 4);
  });

  it("ambient pressure is an input: idle vacuum against 95 kPa, not the standard atmosphere", () => {
    // 35 kPa abs at 95 kPa ambient = −60 kPa gauge (by hand; calc-spec §3).
    expect(gaugeFromAbsKpa(35, 95)).toBe(-60);
    const high = sizeFuelSystem({
      ...boostedSix,
      engine: { ...boostedSix.engine, ambientKpaAbs: 95 },
    });
    // Boost-referenced rail at idle = 400 + (35 − 95) = 340 kPa (by hand).
    expect(high.pump.idleRailPressureKpa).toBeCloseTo(340, 9);
  });
});

/** Every numeric formula the library exports, called with whatever the generator gives. */
const n = fc.oneof(
  fc.double({ min: -1e4, max: 1e4 }),
  fc.constantFrom(0, -0, NaN, Infinity, -Infinity, 1e-300),
);
const finiteResult = (x: unknown): void => {
  if (typeof x === "number") {
    expect(Number.isFinite(x)).toBe(true);
    return;
  }
  if (x && typeof x === "object")
    for (const [k, v] of Object.entries(x)) {
      finiteResult(v);
      if (typeof v === "number" && /pressure|Kpa/i.test(k) && !/drop|gauge/i.test(k))
        expect(v).toBeGreaterThanOrEqual(0);
    }
};
const calls: [string, (a: number, b: number, c: number, d: number) => unknown][] = [
  ["fuelBlend", (a) => fuelBlend(a)],
  ["afrFromLambda", (a, b) => afrFromLambda(a, b)],
  ["lambdaFromAfr", (a, b) => lambdaFromAfr(a, b)],
  ["crankPowerFromWheel", (a, b) => crankPowerFromWheel({ wheelPowerKw: a, drivetrainLossPct: b })],
  ["fuelMassFlowGPerMin", (a, b) => fuelMassFlowGPerMin({ powerKw: a, bsfcGPerKwh: b })],
  ["wheelPowerFromCrank", (a, b) => wheelPowerFromCrank({ crankPowerKw: a, drivetrainLossPct: b })],
  [
    "fuelVolumeFlowLPerH",
    (a, b) => fuelVolumeFlowLPerH({ fuelMassFlowGPerMin: a, densityKgPerL: b }),
  ],
  [
    "injectorPowerCeilingKw",
    (a, b, c, d) =>
      injectorPowerCeilingKw({
        dutyPct: a,
        injectorCount: Math.round(b),
        flowAtOperatingCcPerMin: c,
        densityKgPerL: 0.75,
        bsfcGPerKwh: d,
      }),
  ],
  ["dutyBand", (a, b, c) => dutyBand(a, { dutyCautionPct: b, dutyDangerPct: c })],
  ["effectivePulseWidthMs", (a, b) => effectivePulseWidthMs({ dutyPct: a, cycleMs: b })],
  [
    "pulseWidthForFuelMs",
    (a, b, c) => pulseWidthForFuelMs({ fuelMg: a, densityKgPerL: b, flowCcPerMin: c }),
  ],
  [
    "idleFuelConsumptionLPerH",
    (a, b, c, d) =>
      idleFuelConsumptionLPerH({
        fuelPerCylinderMg: a,
        cylinders: Math.round(b),
        rpm: c,
        densityKgPerL: d,
      }),
  ],
  [
    "pumpPowerCeilingKw",
    (a, b, c, d) =>
      pumpPowerCeilingKw({ supplyLPerH: a, minMarginPct: b, densityKgPerL: c, bsfcGPerKwh: d }),
  ],
  [
    "voltageAfterWiringV",
    (a, b, c, d) =>
      voltageAfterWiringV({
        sourceVoltage: a,
        gaugeAwg: Math.round(b),
        roundTripLengthM: c,
        currentA: d,
      }),
  ],
  [
    "defaultBsfc",
    (a, b) => defaultBsfc({ ethanolVolPct: a, aspiration: "turbo", targetLambda: b }),
  ],
  [
    "bsfcAtBlend",
    (a, b, c) =>
      bsfcAtBlend({ bsfcGPerKwh: a, fromEthanolVolPct: b, toEthanolVolPct: c, aspiration: "na" }),
  ],
  [
    "injectorFlowAtPressure",
    (a, b, c) =>
      injectorFlowAtPressure({
        ratedFlowCcPerMin: a,
        ratedPressureKpa: b,
        differentialPressureKpa: c,
      }),
  ],
  [
    "injectorDifferentialPressureKpa",
    (a, b, c) =>
      injectorDifferentialPressureKpa({
        type: c > 0 ? "fixed" : "boost-referenced",
        basePressureKpa: a,
        manifoldKpa: b,
      }),
  ],
  [
    "railPressureKpa",
    (a, b, c) =>
      railPressureKpa({
        type: c > 0 ? "fixed" : "boost-referenced",
        basePressureKpa: a,
        manifoldKpa: b,
      }),
  ],
  [
    "railPressureKpa, rising rate",
    (a, b, c) =>
      railPressureKpa({
        type: "boost-referenced",
        basePressureKpa: a,
        manifoldKpa: b,
        risingRateRatio: c,
      }),
  ],
  [
    "fuelPressureAgainstBoost",
    (a, b, c, d) =>
      fuelPressureAgainstBoost({
        type: d > 0 ? "fixed" : "boost-referenced",
        basePressureKpa: a,
        maxBoostKpa: b,
        risingRateRatio: c,
        points: 5,
      }),
  ],
  ["flexSensorAdvice", (a, b) => flexSensorAdvice({ ethanolMinVolPct: a, ethanolMaxVolPct: b })],
  [
    "injectorFlowForFuel",
    (a, b, c) =>
      injectorFlowForFuel({ flowCcPerMin: a, ratingFluidDensityKgPerL: b, fuelDensityKgPerL: c }),
  ],
  [
    "regulatorBypassCapacityLPerH",
    (a, b, c) =>
      regulatorBypassCapacityLPerH({ ratedFlowLPerH: a, ratedPressureKpa: b, railPressureKpa: c }),
  ],
  [
    "demandAtBoostLPerH",
    (a, b, c, d) =>
      demandAtBoostLPerH({
        demandAtFullBoostLPerH: a,
        boostKpa: b,
        maxBoostKpa: c,
        ambientKpaAbs: d,
      }),
  ],
  [
    "supplyAgainstBoost",
    (a, b, c, d) =>
      supplyAgainstBoost({
        pumps: [
          {
            quantity: 1,
            curves: [
              {
                voltage: 12,
                points: [
                  { pressureKpa: 0, flowLPerH: 300 },
                  { pressureKpa: 600, flowLPerH: 200 },
                ],
              },
            ],
          },
          {
            quantity: 1,
            switchOnBoostKpa: d,
            curves: [
              {
                voltage: 12,
                points: [
                  { pressureKpa: 0, flowLPerH: 300 },
                  { pressureKpa: 600, flowLPerH: 200 },
                ],
              },
            ],
          },
        ],
        voltage: 12,
        regulator: { type: "boost-referenced", basePressureKpa: 300 },
        maxBoostKpa: a,
        demandAtFullBoostLPerH: b,
        lossesKpa: c,
        points: 5,
      }),
  ],
  [
    "injectorDutyPct",
    (a, b, c, d) =>
      injectorDutyPct({
        fuelMassFlowGPerMin: a,
        densityKgPerL: b,
        injectorCount: Math.round(c),
        flowAtOperatingCcPerMin: d,
      }),
  ],
  [
    "requiredInjectorFlowCcPerMin",
    (a, b, c, d) =>
      requiredInjectorFlowCcPerMin({
        fuelMassFlowGPerMin: a,
        densityKgPerL: b,
        injectorCount: Math.round(c),
        designDutyPct: d,
      }),
  ],
  ["cycleTimeMs", (a) => cycleTimeMs(a)],
  [
    "deadTimeMs",
    (a, b, c, d) =>
      deadTimeMs({ voltages: [12, c], pressuresKpa: [300], deadTimeMs: [[1], [d]] }, a, b),
  ],
  [
    "idleFuelPerCylinderMg",
    (a, b, c, d) =>
      idleFuelPerCylinderMg({
        displacementL: a,
        cylinders: Math.round(b),
        volumetricEfficiency: c,
        manifoldKpaAbs: d,
        intakeTempC: 30,
        stoichAfr: 14.7,
      }),
  ],
  [
    "pumpFlowLPerH",
    (a, b, c, d) =>
      pumpFlowLPerH(
        {
          quantity: 1,
          curves: [
            {
              voltage: 12,
              points: [
                { pressureKpa: 300, flowLPerH: c },
                { pressureKpa: 600, flowLPerH: d },
              ],
            },
          ],
        },
        a,
        b,
      ),
  ],
  ["pumpMarginPct", (a, b) => pumpMarginPct(a, b)],
  ["laminarFrictionFactor", (a) => laminarFrictionFactor(a)],
  ["swameeJainFrictionFactor", (a, b) => swameeJainFrictionFactor(a, b)],
  ["colebrookFrictionFactor", (a, b) => colebrookFrictionFactor(a, b)],
  ["frictionFactor", (a, b) => frictionFactor(a, b)],
  [
    "linePressureDrop",
    (a, b, c, d) =>
      linePressureDrop(
        { insideDiameterMm: a, lengthM: b },
        { flowLPerH: c, densityKgPerL: 0.75, viscosityMPaS: d },
      ),
  ],
  ["awgDiameterMm", (a) => awgDiameterMm(a)],
  [
    "wireVoltageDropV",
    (a, b, c) => wireVoltageDropV({ gaugeAwg: Math.round(a), roundTripLengthM: b, currentA: c }),
  ],
];

describe("property: every exported formula gives a finite, non-negative-pressure result or the library's error", () => {
  for (const [name, call] of calls) {
    it(name, () => {
      fc.assert(
        fc.property(n, n, n, n, (a, b, c, d) => {
          let out: unknown;
          try {
            out = call(a, b, c, d);
          } catch (e) {
            expect(e).toBeInstanceOf(CalcInputError);
            return;
          }
          finiteResult(out);
        }),
        { numRuns: Number(process.env.FC_RUNS ?? 300) },
      );
    });
  }
});
