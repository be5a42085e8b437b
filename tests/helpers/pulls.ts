/**
 * Dyno pulls as a logger would export them, generated for the tests (invented figures): a
 * six-cylinder from 3000 to 7000 rpm, boost rising to `boostKpa` by 5000 rpm, duty and wheel
 * power rising to their peaks at 7000 rpm, lambda on the shop's default table, six EGT columns.
 */
export interface PullSpec {
  boostKpa: number;
  peakDutyPct: number;
  peakWheelKw: number;
  /** Lambda at full boost (default: the default table's target there). */
  lambda?: number;
  /** Extra °C on one cylinder (1-based) from 6000 rpm up. */
  hotCylinder?: { cylinder: number; extraC: number };
}

export const PULL_HEADERS =
  "RPM,Injector Duty,Lambda,Boost,Fuel Pressure Diff,Wheel Power,EGT 1,EGT 2,EGT 3,EGT 4,EGT 5,EGT 6,Exhaust Press,Turbo Speed,IAT,Ign Timing";
export const PULL_UNITS = "rpm,%,λ,kPa,kPa,kW,°C,°C,°C,°C,°C,°C,kPa,rpm,°C,deg";

/** λ target of the default table (0 → 0.90, 60 → 0.86, 150 → 0.80, 250 → 0.78 kPa). */
function tableLambda(b: number) {
  const rows = [
    [0, 0.9],
    [60, 0.86],
    [150, 0.8],
    [250, 0.78],
  ] as const;
  for (let i = 1; i < rows.length; i++) {
    const [b0, l0] = rows[i - 1]!;
    const [b1, l1] = rows[i]!;
    if (b <= b1) return l0 + ((l1 - l0) * (b - b0)) / (b1 - b0);
  }
  return 0.78;
}

export function pullCsv(spec: PullSpec): string {
  const lines = [PULL_HEADERS, PULL_UNITS];
  for (let rpm = 3000; rpm <= 7000; rpm += 100) {
    const f = (rpm - 3000) / 4000;
    const boost = spec.boostKpa * Math.min(1, (rpm - 3000) / 2000);
    const duty = spec.peakDutyPct * (0.5 + 0.5 * f);
    const lambda = boost >= spec.boostKpa - 0.01 && spec.lambda ? spec.lambda : tableLambda(boost);
    const power = spec.peakWheelKw * (0.4 + 0.6 * f);
    const egt = Array.from({ length: 6 }, (_, i) =>
      Math.round(
        700 +
          150 * f +
          (spec.hotCylinder && spec.hotCylinder.cylinder === i + 1 && rpm >= 6000
            ? spec.hotCylinder.extraC
            : 0),
      ),
    );
    lines.push(
      [
        rpm,
        duty.toFixed(2),
        lambda.toFixed(3),
        boost.toFixed(1),
        "400.0",
        power.toFixed(1),
        ...egt,
        (boost * 1.3).toFixed(1),
        Math.round(50000 + 70000 * f),
        "38",
        "18.5",
      ].join(","),
    );
  }
  return lines.join("\n") + "\n";
}

/** The three pulls of a session: pump gasoline at low boost, E85 at the same, E85 high boost with cylinder 3 hot. */
export const THREE_PULLS = [
  {
    name: "pull 1 pump gas.csv",
    ethanolPct: 10,
    boostTargetKpa: 60,
    csv: pullCsv({ boostKpa: 60, peakDutyPct: 30, peakWheelKw: 200, lambda: 0.86 }),
  },
  {
    name: "pull 2 E85.csv",
    ethanolPct: 85,
    boostTargetKpa: 60,
    csv: pullCsv({ boostKpa: 60, peakDutyPct: 42, peakWheelKw: 215 }),
  },
  {
    name: "pull 3 E85 high boost.csv",
    ethanolPct: 85,
    boostTargetKpa: 150,
    csv: pullCsv({
      boostKpa: 150,
      peakDutyPct: 60,
      peakWheelKw: 360,
      hotCylinder: { cylinder: 3, extraC: 100 },
    }),
  },
] as const;
