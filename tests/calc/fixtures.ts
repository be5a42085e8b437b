import type { FuelSystemInput } from "@/lib/calc";

/**
 * A boosted six-cylinder on a flex blend. The engine and the pump curve are made up for the
 * tests (inputs, not check values); expected figures are worked from published formulas.
 */
export const boostedSix: FuelSystemInput = {
  engine: {
    cylinders: 6,
    displacementL: 3.0,
    aspiration: "turbo",
    redlineRpm: 7000,
    idleRpm: 900,
    maxBoostKpa: 150,
  },
  target: { powerKw: 450, measuredAt: "wheel", drivetrainLossPct: 15 },
  fuel: { ethanolMinVolPct: 70, ethanolMaxVolPct: 85 },
  injectors: {
    count: 6,
    ratedFlowCcPerMin: 1300,
    ratedPressureKpa: 300,
    minPulseWidthMs: 0.8,
    deadTime: {
      voltages: [12, 14],
      pressuresKpa: [300, 500],
      deadTimeMs: [
        [1.1, 1.3],
        [0.9, 1.05],
      ],
    },
  },
  regulator: { type: "boost-referenced", basePressureKpa: 400 },
  pumps: [
    {
      quantity: 2,
      curves: [
        {
          voltage: 12,
          points: [
            { pressureKpa: 300, flowLPerH: 300 },
            { pressureKpa: 500, flowLPerH: 250 },
            { pressureKpa: 700, flowLPerH: 190 },
          ],
        },
        {
          voltage: 13.5,
          points: [
            { pressureKpa: 300, flowLPerH: 340 },
            { pressureKpa: 500, flowLPerH: 290 },
            { pressureKpa: 700, flowLPerH: 230 },
          ],
        },
      ],
    },
  ],
  electrical: { voltageAtPump: 13.0 },
  lines: {
    feed: { insideDiameterMm: 11.1, lengthM: 5, fittingsK: 2 },
    return: { insideDiameterMm: 8.7, lengthM: 5 },
  },
  filters: { postPumpDropKpa: 10 },
};

/** A small naturally aspirated four-cylinder on pump gasoline. */
export const naFour: FuelSystemInput = {
  engine: {
    cylinders: 4,
    displacementL: 2.0,
    aspiration: "na",
    redlineRpm: 7500,
    idleRpm: 850,
    maxBoostKpa: 0,
  },
  target: { powerKw: 150, measuredAt: "crank", drivetrainLossPct: 12 },
  fuel: { ethanolMinVolPct: 0, ethanolMaxVolPct: 10 },
  injectors: { count: 4, ratedFlowCcPerMin: 440, ratedPressureKpa: 300 },
  regulator: { type: "fixed", basePressureKpa: 350 },
  pumps: [
    {
      quantity: 1,
      curves: [
        {
          voltage: 13.5,
          points: [
            { pressureKpa: 200, flowLPerH: 190 },
            { pressureKpa: 600, flowLPerH: 120 },
          ],
        },
      ],
    },
  ],
  electrical: { voltageAtPump: 13.5 },
};
