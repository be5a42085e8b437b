import { DEFAULT_E85_RANGE, type FuelSystemInput } from "@/lib/calc";
import { FUEL_CHOICE_RANGES } from "@/lib/domain/builds";
import type { BuildGoal } from "@/lib/validations/builds";

/**
 * Starting inputs of a new build sheet: a boosted six on pump E85 (ASTM D5798 range), with an
 * invented pump curve as a placeholder until parts are chosen from the catalog. Limits, BSFC
 * rules of thumb, drivetrain loss and fuel properties are left to the shop's settings.
 */
export function newBuildInputs(): FuelSystemInput {
  return {
    engine: {
      cylinders: 6,
      displacementL: 3.0,
      aspiration: "turbo",
      redlineRpm: 7000,
      idleRpm: 850,
      maxBoostKpa: 150,
    },
    // No drivetrain loss of its own: the shop's loss for a manual gearbox applies.
    target: { powerKw: 375, measuredAt: "wheel", driveType: "manual" },
    fuel: {
      ethanolMinVolPct: DEFAULT_E85_RANGE.ethanolMinVolPct,
      ethanolMaxVolPct: DEFAULT_E85_RANGE.ethanolMaxVolPct,
    },
    injectors: { count: 6, ratedFlowCcPerMin: 1000, ratedPressureKpa: 300 },
    regulator: { type: "boost-referenced", basePressureKpa: 300 },
    pumps: [
      {
        label: "Pump (enter its curve)",
        quantity: 1,
        curves: [
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
  };
}

/**
 * The starting inputs of a draft build from a caller's goal (BuildGoalSchema): the engine, the
 * power goal and the fuel's ethanol range set; one injector per cylinder and no boost for a
 * naturally aspirated engine; everything else the new-build defaults, for the tuner to size.
 */
export function draftInputs(goal: BuildGoal): FuelSystemInput {
  const base = newBuildInputs();
  return {
    ...base,
    engine: {
      ...base.engine,
      cylinders: goal.cylinders,
      displacementL: goal.displacementL,
      aspiration: goal.aspiration,
      maxBoostKpa: goal.aspiration === "na" ? 0 : base.engine.maxBoostKpa,
    },
    target: { ...base.target, powerKw: goal.powerKw, measuredAt: goal.measuredAt },
    fuel: { ...FUEL_CHOICE_RANGES[goal.fuel] },
    injectors: { ...base.injectors, count: goal.cylinders },
  };
}
