// Reference: docs/calculations.md §2 (stage "power and fuel" of §7).
import { crankPowerFromWheel, wheelPowerFromCrank } from "../power";
import { DEFAULT_DRIVETRAIN_LOSS_PCT, type SizingContext } from "./context";

/** Stage "power": wheel and crank power at the target, with the drivetrain loss in force. */
export function powerStage({ input, t }: SizingContext): {
  wheelPowerKw: number;
  crankPowerKw: number;
} {
  const { target } = input;
  const lossPct = target.drivetrainLossPct ?? DEFAULT_DRIVETRAIN_LOSS_PCT;
  if (target.measuredAt !== "wheel") {
    return {
      wheelPowerKw: wheelPowerFromCrank({
        crankPowerKw: target.powerKw,
        drivetrainLossPct: lossPct,
      }),
      crankPowerKw: target.powerKw,
    };
  }
  const crankPowerKw = t.add({
    id: "crank-power",
    label: "Crank power",
    formula: "wheel power ÷ (1 − drivetrain loss)",
    inputs: [
      { label: "wheel power", value: target.powerKw, quantity: "power" },
      { label: "drivetrain loss", value: lossPct, quantity: "percent" },
    ],
    value: crankPowerFromWheel({ wheelPowerKw: target.powerKw, drivetrainLossPct: lossPct }),
    quantity: "power",
  });
  return { wheelPowerKw: target.powerKw, crankPowerKw };
}
