import { describe, expect, it } from "vitest";

import {
  analyzePull,
  checkLimits,
  crankPowerKw,
  DatalogMappingSchema,
  DEFAULT_TUNE_LIMITS,
  fillTemplate,
  formatWarning,
  FuelSystemInputSchema,
  lambdaTargetAt,
  mappingProblems,
  parseDatalog,
  powerAtBoostKw,
  predictNextStep,
  preparePull,
  pressureReadingNotes,
  samplesFromLog,
  suggestMapping,
  summarizePull,
  TuneLimitsSchema,
  type LimitCheck,
  type PullSample,
  type TuneLimits,
} from "@/lib/calc";

import { boostedSix } from "./fixtures";

// Pulls are generated here from known inputs; the checks are worked by hand from those inputs
// with the formulas named beside them (no outside figures unless a source is named).

const injectors = { injectorCount: 6, ratedFlowCcPerMin: 1000, ratedPressureKpa: 300 };
const e85 = { ...injectors, densityKgPerL: 0.787 };

/** 3000…7000 rpm every 50: duty 40 → 80 %, boost to 150 kPa by 5667 rpm, crank power 100 → 450 kW. */
function pull(
  over: (rpm: number, s: PullSample) => Partial<PullSample> = () => ({}),
  powerAt: (crankKw: number) => number = (kw) => kw,
): PullSample[] {
  const out: PullSample[] = [];
  for (let rpm = 3000; rpm <= 7000; rpm += 50) {
    const f = (rpm - 3000) / 4000;
    const boostKpa = 150 * Math.min(1, f * 1.5);
    const s: PullSample = {
      rpm,
      dutyPct: 40 + 40 * f,
      lambda: lambdaTargetAt(DEFAULT_TUNE_LIMITS.lambdaTargets, boostKpa),
      boostKpa,
      fuelDiffKpa: 300,
      powerKw: powerAt(100 + 350 * f),
      egtC: [850, 850, 850, 850, 850, 850],
      exhaustKpa: boostKpa * 1.2,
      turboRpm: 60000 + 60000 * f,
      intakeTempC: 35,
      timingDeg: 18,
    };
    out.push({ ...s, ...over(rpm, s) });
  }
  return out;
}
const crank = { measuredAt: "crank" as const, drivetrainLossPct: 0 };
const check = (checks: LimitCheck[], key: LimitCheck["key"]) => checks.find((c) => c.key === key)!;
const limits = (more: Partial<TuneLimits> = {}) => ({ ...DEFAULT_TUNE_LIMITS, ...more });

describe("power carried to the crank", () => {
  it("carries hub power to the crank with the stated loss", () => {
    // Worked by hand: 880 kW at the hubs with a 12 % loss → 880 / 0.88 = 1000 kW.
    // The 10–12 % transmission loss for hub power: common practice, no source.
    expect(crankPowerKw({ powerKw: 880, measuredAt: "hub", drivetrainLossPct: 12 })).toBeCloseTo(
      1000,
      9,
    );
    // Worked by hand: 340 kW at the wheels with 15 % → 400 kW.
    expect(crankPowerKw({ powerKw: 340, measuredAt: "wheel", drivetrainLossPct: 15 })).toBeCloseTo(
      400,
      9,
    );
    expect(crankPowerKw({ powerKw: 400, measuredAt: "crank", drivetrainLossPct: 15 })).toBe(400);
  });

  it("refuses a loss that is no percentage", () => {
    expect(() =>
      crankPowerKw({ powerKw: 300, measuredAt: "wheel", drivetrainLossPct: 80 }),
    ).toThrow(/Drivetrain loss/);
  });

  it("gives a wheel-power log the same measured BSFC as its crank-power twin", () => {
    const atCrank = preparePull(pull(), crank);
    const atWheel = preparePull(
      pull(undefined, (kw) => kw * 0.85),
      { measuredAt: "wheel", drivetrainLossPct: 15 },
    );
    const a = summarizePull(atCrank.points, e85, "crank", 0);
    const b = summarizePull(atWheel.points, e85, "wheel", 15);
    // Worked by hand at 7000 rpm: 6 × 1000 cc/min × 80 % = 4800 cc/min × 0.787 kg/L = 3777.6 g/min
    // → 226 656 g/h ÷ 450 kW = 503.68 g/kWh.
    expect(a.measuredBsfc!.gPerKwh).toBeCloseTo(503.68, 2);
    expect(b.measuredBsfc!.gPerKwh).toBeCloseTo(a.measuredBsfc!.gPerKwh, 9);
    expect(b.peakPower!.crankKw).toBeCloseTo(450, 9);
    // Worked by hand: 450 × 0.85 = 382.5 kW as logged at the wheels.
    expect(b.peakPower!.loggedKw).toBeCloseTo(382.5, 9);
    // Worked by hand: torque = 450 000 W ÷ (2π × 7000 / 60 rad/s) = 613.9 N·m.
    expect(a.peakTorque!.nm).toBeGreaterThanOrEqual(613.8);
  });
});

describe("lambda target following boost", () => {
  it("joins the table's rows with straight lines and holds the ends", () => {
    // Worked by hand: 105 kPa lies half way from 60 (λ 0.86) to 150 (λ 0.80) → 0.83.
    expect(lambdaTargetAt(DEFAULT_TUNE_LIMITS.lambdaTargets, 105)).toBeCloseTo(0.83, 9);
    expect(lambdaTargetAt(DEFAULT_TUNE_LIMITS.lambdaTargets, 400)).toBe(0.78);
    expect(lambdaTargetAt(DEFAULT_TUNE_LIMITS.lambdaTargets, -20)).toBe(0.9);
  });

  it("does not call λ 0.86 at 0.6 bar anything but within", () => {
    // λ 0.86 at 60 kPa is the table's own target (common practice, no source): not "danger".
    const p = preparePull(
      pull((rpm) => (rpm === 5000 ? { boostKpa: 60, lambda: 0.86 } : {})),
      crank,
    );
    expect(check(checkLimits(p.points, limits()), "lambda").status).toBe("within");
  });

  it("lets the single-log analysis judge lambda against the table too", () => {
    // λ 0.86 held at 60 kPa under load: against one boosted target of 0.78 it read 0.08 lean
    // ("danger … stop pulls"); against the table's 0.86 at 60 kPa it is on target.
    const samples = pull(() => ({ boostKpa: 60, lambda: 0.86 }));
    const ctx = { ...e85, targetLambda: 0.78, dutyDangerPct: 90 };
    expect(analyzePull(samples, ctx).warnings.map((w) => w.code)).toContain("log-lambda-lean");
    const table = analyzePull(samples, {
      ...ctx,
      lambdaTargetAt: (b) => lambdaTargetAt(DEFAULT_TUNE_LIMITS.lambdaTargets, b),
    });
    expect(table.warnings.map((w) => w.code)).not.toContain("log-lambda-lean");
    expect(table.lambda!.worstError).toBeCloseTo(0, 9);
  });

  it("marks a pull over where it runs leaner than the target at that boost, with where and by how much", () => {
    // λ 0.86 at 150 kPa: the target there is 0.80, 0.03 allowed → 0.83; worked by hand: 0.03 over.
    const p = preparePull(
      pull((rpm) => (rpm === 6500 ? { lambda: 0.86 } : {})),
      crank,
    );
    const c = check(checkLimits(p.points, limits()), "lambda");
    expect(c.status).toBe("over");
    expect(c.atRpm).toBe(6500);
    expect(c.by!.value).toBeCloseTo(0.03, 9);
    expect(c.allowed!.value).toBeCloseTo(0.83, 9);
    expect(fillTemplate(c.message, c.params, "metric")).toBe(
      "Ran λ 0.86 at 6500 rpm where the table asks λ 0.80 at 150 kPa: 0.03 leaner than the allowed λ 0.83. Stop and richen before the next pull.",
    );
  });

  it("calls a pull leaner than the target by more than half the allowance near", () => {
    // λ 0.82 at 150 kPa: 0.02 leaner than 0.80, over half of the 0.03 allowance → near.
    const p = preparePull(
      pull((rpm) => (rpm === 6500 ? { lambda: 0.82 } : {})),
      crank,
    );
    expect(check(checkLimits(p.points, limits()), "lambda").status).toBe("near");
  });
});

describe("EGT, spread, back-pressure and turbo speed", () => {
  it("finds the EGT spread between cylinders and names them", () => {
    // Cylinder 4 runs 90 °C hotter than the rest at 6500 rpm; 80 °C allowed → 10 °C over (worked by hand).
    const p = preparePull(
      pull((rpm) => (rpm === 6500 ? { egtC: [850, 850, 850, 940, 850, 850] } : {})),
      crank,
    );
    const checks = checkLimits(p.points, limits());
    const s = check(checks, "egtSpread");
    expect(s.status).toBe("over");
    expect(s.atRpm).toBe(6500);
    expect(s.measured!.value).toBe(90);
    expect(s.by!.value).toBe(10);
    expect(s.params.hot!.value).toBe(4);
    expect(s.params.cold!.value).toBe(1);
    // The spread is a difference: 90 °C is 162 °F (× 1.8, no offset), 10 °C is 18 °F.
    expect(fillTemplate(s.message, s.params, "imperial")).toContain("ran 162 °F hotter");
    expect(fillTemplate(s.message, s.params, "imperial")).toContain("18 °F past");
    // 940 °C against 950: within 5 % of the limit (902.5 °C and up) → near, 10 °C short.
    const e = check(checks, "egt");
    expect(e.status).toBe("near");
    expect(e.by!.value).toBe(-10);
    expect(e.params.cylinder!.value).toBe(4);
  });

  it("handles any number of cylinders, blank cells included", () => {
    const p = preparePull(
      pull(() => ({ egtC: [800, null, 820, 810, 790, 800, 805, 830, 815, 800] })),
      crank,
    );
    // Worked by hand: 830 − 790 = 40 °C.
    expect(check(checkLimits(p.points, limits()), "egtSpread").measured!.value).toBe(40);
    expect(p.points[0]!.egtC).toHaveLength(10);
  });

  it("computes the exhaust-to-boost ratio on gauge pressures from half the peak boost", () => {
    // Worked by hand: exhaust 1.2 × 150 = 180 kPa gauge against 150 kPa gauge → 180 / 150 = 1.20.
    const p = preparePull(pull(), crank);
    const within = check(checkLimits(p.points, limits()), "backPressure");
    expect(within.status).toBe("within");
    expect(within.measured!.value).toBeCloseTo(1.2, 9);
    // A choking turbine: 450 kPa against 150 → 3.00, 1.00 past 2.0.
    const choke = preparePull(
      pull((rpm) => (rpm === 6800 ? { exhaustKpa: 450 } : {})),
      crank,
    );
    const over = check(checkLimits(choke.points, limits()), "backPressure");
    expect(over.status).toBe("over");
    expect(over.atRpm).toBe(6800);
    expect(over.by!.value).toBeCloseTo(1, 9);
    // While the turbo spools (boost under half the peak, 75 kPa) the exhaust leads: not judged.
    // Worked by hand: at 3500 rpm boost is 150 × 0.1875 = 28.1 kPa, exhaust 80 kPa → 2.84:1.
    const spool = preparePull(
      pull((rpm) => (rpm === 3500 ? { exhaustKpa: 80 } : {})),
      crank,
    );
    expect(check(checkLimits(spool.points, limits()), "backPressure").status).toBe("within");
  });

  it("reads EMAP on the boost's reference and says which reading it used", () => {
    // The tester's log: "Boost (kPa)" and "EMAP (kPa)", both gauge; EMAP starts below the
    // atmosphere (so it cannot be absolute). Worked by hand: 219 / 166 = 1.319; 410 / 293 = 1.399.
    const csv = [
      "RPM,Injector Duty,Boost (kPa),EMAP (kPa)",
      "3000,40,10,18",
      "5000,60,166,219",
      "7000,80,293,410",
    ].join("\n");
    const log = parseDatalog(csv);
    const guess = suggestMapping(log);
    expect(guess.boost).toMatchObject({ column: "Boost (kPa)", kind: "gauge" });
    expect(guess.exhaustPressure).toMatchObject({ column: "EMAP (kPa)", kind: "gauge" });
    const m = DatalogMappingSchema.parse(guess);
    const p = preparePull(samplesFromLog(log, m), crank);
    const ratio = check(checkLimits(p.points, limits()), "backPressure");
    expect(ratio.measured!.value).toBeCloseTo(410 / 293, 9);
    expect(ratio.atRpm).toBe(7000);
    expect(fillTemplate(ratio.message, ratio.params, "metric")).toBe(
      "Highest exhaust-to-boost ratio 1.40:1 (exhaust 410 kPa against 293 kPa boost, both gauge) at 7000 rpm; the limit is 2.00:1.",
    );
    const notes = pressureReadingNotes(m, p.points);
    expect(notes.map((n) => n.code)).toEqual(["pull-pressure-reference"]);
    expect(formatWarning(notes[0]!, "metric").message).toBe(
      'Exhaust manifold pressure "EMAP (kPa)" was read as gauge and boost "Boost (kPa)" as gauge: the exhaust-to-boost ratio compares both as gauge pressures.',
    );
    // With no reading under the atmosphere, EMAP follows the boost's reference (gauge here)…
    const high = parseDatalog("RPM,Duty,Boost (kPa),EMAP (kPa)\n5000,60,166,219\n");
    expect(suggestMapping(high).exhaustPressure!.kind).toBe("gauge");
    // …and an absolute MAP's (absolute); a column that says psia or psig says so itself.
    const map = parseDatalog("RPM,Duty,MAP (kPa),EMAP (kPa)\n5000,60,267,320\n");
    expect(suggestMapping(map).exhaustPressure!.kind).toBe("absolute");
    const said = parseDatalog("RPM,Duty,Boost,EMAP\nrpm,%,psi,psia\n5000,60,24,46\n");
    expect(suggestMapping(said).exhaustPressure!.kind).toBe("absolute");
    const gauge = parseDatalog("RPM,Duty,MAP,Drive Pressure\nrpm,%,psia,psig\n5000,60,38,31\n");
    expect(suggestMapping(gauge).exhaustPressure!.kind).toBe("gauge");
    // A MAP column reading below zero is gauge (vacuum on a gauge), whatever its name says.
    const vac = parseDatalog("RPM,Duty,MAP\n1000,5,-60\n5000,60,150\n");
    expect(suggestMapping(vac).boost!.kind).toBe("gauge");
  });

  it("notes an exhaust reading below the boost at boost as implausible", () => {
    // EMAP mapped as absolute though it logs gauge: 219 kPa read as absolute is 219 − 101.325 =
    // 117.675 kPa gauge against 166 kPa boost → 0.709:1 (worked by hand).
    const log = parseDatalog("RPM,Duty,Boost (kPa),EMAP (kPa)\n3000,40,40,120\n5000,60,166,219\n");
    const m = DatalogMappingSchema.parse({
      ...suggestMapping(log),
      exhaustPressure: { column: "EMAP (kPa)", kind: "absolute", unit: "kPa" },
    });
    const p = preparePull(samplesFromLog(log, m), crank);
    const notes = pressureReadingNotes(m, p.points).map((n) => formatWarning(n, "metric"));
    expect(notes[0]!.message).toMatch(
      /"EMAP \(kPa\)" was read as absolute .* and boost "Boost \(kPa\)" as gauge/,
    );
    expect(notes[1]!.severity).toBe("caution");
    expect(notes[1]!.message).toBe(
      "At 5000 rpm the exhaust manifold read 118 kPa against 166 kPa boost, 0.71:1: below 1:1 at boost is not plausible on a turbo engine (the turbine needs more pressure before it than the compressor makes).",
    );
  });

  it("checks turbo speed only against a limit the shop named", () => {
    const p = preparePull(pull(), crank);
    expect(check(checkLimits(p.points, limits()), "turboSpeed").status).toBe("not-set");
    // Top speed 120 000 rpm against 125 000: within 5 % (118 750 and up) → near, 5 000 short.
    const t = check(checkLimits(p.points, limits({ maxTurboRpm: 125000 })), "turboSpeed");
    expect(t.status).toBe("near");
    expect(t.by!.value).toBe(-5000);
    expect(t.atRpm).toBe(7000);
  });

  it("says a limit was not judged when its channel was not logged", () => {
    const p = preparePull(
      pull(() => ({ egtC: null, exhaustKpa: null, turboRpm: null })),
      crank,
    );
    const checks = checkLimits(p.points, limits({ maxTurboRpm: 150000 }));
    expect(check(checks, "egt").status).toBe("no-data");
    expect(check(checks, "backPressure").status).toBe("no-data");
    expect(check(checks, "turboSpeed").status).toBe("no-data");
  });

  it("marks duty within, near and over", () => {
    // Peak duty 80 % at 7000 rpm (generated); 90 % limit → within; 84 % limit → 80 ≥ 79.8 → near.
    const p = preparePull(pull(), crank);
    expect(check(checkLimits(p.points, limits()), "duty").status).toBe("within");
    expect(check(checkLimits(p.points, limits({ maxDutyPct: 84 })), "duty").status).toBe("near");
    const over = check(checkLimits(p.points, limits({ maxDutyPct: 75 })), "duty");
    expect(over.status).toBe("over");
    expect(over.by!.value).toBeCloseTo(5, 9);
  });
});

describe("bad input in a pull", () => {
  it("averages repeated rpm, leaves out rows without rpm, and says so", () => {
    const samples: PullSample[] = [
      { rpm: 3000, dutyPct: 40, powerKw: 88 },
      { rpm: 3000, dutyPct: 42, powerKw: 92 },
      { rpm: Number.NaN, dutyPct: 50 },
      { rpm: 0, dutyPct: 50 },
      { rpm: 3100, dutyPct: 44, powerKw: null },
      { rpm: 3200, dutyPct: 46, powerKw: 100 },
    ];
    const p = preparePull(samples, crank);
    expect(p.points.map((x) => x.rpm)).toEqual([3000, 3100, 3200]);
    // Worked by hand: (88 + 92) / 2 = 90 kW, (40 + 42) / 2 = 41 %.
    expect(p.points[0]!.powerKw).toBe(90);
    expect(p.points[0]!.dutyPct).toBe(41);
    const codes = p.notes.map((n) => n.code);
    expect(codes).toEqual(
      expect.arrayContaining(["pull-rows-without-rpm", "pull-repeated-rpm", "pull-blank-powerKw"]),
    );
    const rowsLeft = p.notes.find((n) => n.code === "pull-rows-without-rpm")!;
    expect(fillTemplate(rowsLeft.message, rowsLeft.params, "metric")).toBe(
      "2 rows had no engine speed and were left out.",
    );
  });

  it("names a gap in engine speed", () => {
    const p = preparePull(
      pull().filter((s) => s.rpm < 4200 || s.rpm > 5000),
      crank,
    );
    const gap = p.notes.find((n) => n.code === "pull-rpm-gap")!;
    expect(fillTemplate(gap.message, gap.params, "metric")).toBe(
      "Nothing was logged between 4150 rpm and 5050 rpm.",
    );
  });

  it("does not mutate its input", () => {
    const samples = pull();
    const copy = structuredClone(samples);
    preparePull(samples, crank);
    expect(samples).toEqual(copy);
  });

  it("reads °F, psi absolute, krpm and AFR on a gasoline scale from a log", () => {
    const csv = [
      "RPM,Duty,AFR,MAP,EMAP,EGT 1,EGT 2,Turbo Speed,IAT,Ign Timing",
      "rpm,%,afr,psia,psia,°F,°F,krpm,°F,deg",
      "6000,80,12.642,36.4,44.1,1700,1610,118,104,16.5",
    ].join("\n");
    const log = parseDatalog(csv);
    const guess = suggestMapping(log);
    expect(guess.egt).toEqual({ columns: ["EGT 1", "EGT 2"], unit: "F" });
    expect(guess.exhaustPressure).toMatchObject({ column: "EMAP", kind: "absolute", unit: "psi" });
    expect(guess.boost).toMatchObject({ column: "MAP", kind: "absolute", unit: "psi" });
    expect(guess.turboSpeed).toEqual({ column: "Turbo Speed", unit: "krpm" });
    expect(guess.intakeTemp).toEqual({ column: "IAT", unit: "F" });
    expect(guess.timing).toEqual({ column: "Ign Timing" });
    const m = DatalogMappingSchema.parse(guess);
    const [s] = samplesFromLog(log, m);
    // Worked by hand: (1700 − 32) / 1.8 = 926.67 °C; (104 − 32) / 1.8 = 40 °C.
    expect(s!.egtC![0]).toBeCloseTo(926.667, 3);
    expect(s!.intakeTempC).toBeCloseTo(40, 9);
    // 36.4 psia × 6.894757 = 250.97 kPa abs − 101.325 = 149.65 kPa gauge (NIST SP 811 psi factor).
    expect(s!.boostKpa).toBeCloseTo(36.4 * 6.894757293168 - 101.325, 6);
    expect(s!.exhaustKpa).toBeCloseTo(44.1 * 6.894757293168 - 101.325, 6);
    expect(s!.turboRpm).toBe(118000);
    // AFR 12.642 on the gasoline scale (14.7:1 stoichiometric, common practice) → λ 0.86.
    expect(s!.lambda).toBeCloseTo(0.86, 9);
    expect(s!.timingDeg).toBe(16.5);
  });

  it("names an EGT column the log does not have", () => {
    const m = DatalogMappingSchema.parse({
      rpm: "RPM",
      duty: { column: "Duty", kind: "duty_pct" },
      egt: { columns: ["EGT 1", "EGT 9"], unit: "C" },
    });
    expect(mappingProblems(m, ["RPM", "Duty", "EGT 1"])).toEqual([
      { path: "egt.columns.1", message: 'The log has no column "EGT 9"' },
    ]);
  });
});

describe("limits as settings", () => {
  it("refuses a lambda table with the same boost twice, naming the row", () => {
    const r = TuneLimitsSchema.safeParse(
      limits({
        lambdaTargets: [
          { boostKpa: 0, lambda: 0.9 },
          { boostKpa: 0, lambda: 0.85 },
        ],
      }),
    );
    expect(r.success).toBe(false);
    expect(r.error!.issues[0]!.path).toEqual(["lambdaTargets", 1, "boostKpa"]);
  });
});

describe("the next step", () => {
  // Eight 1500 cc/min injectors rated at 300 kPa, held at 300 kPa across them, on E85.
  const v8 = FuelSystemInputSchema.parse({
    ...boostedSix,
    engine: { ...boostedSix.engine, cylinders: 8, displacementL: 5, maxBoostKpa: 150 },
    injectors: { count: 8, ratedFlowCcPerMin: 1500, ratedPressureKpa: 300 },
    regulator: { type: "boost-referenced", basePressureKpa: 300 },
    fuel: { ethanolMinVolPct: 85, ethanolMaxVolPct: 85 },
  });

  it("predicts the duty at a power target from the measured BSFC", () => {
    // Common practice, no source: 1500 cc/min injectors run out near 90 % duty at about 1 MW
    // crank on E85. Worked by hand: 505 g/kWh × 1000 kW = 8416.7 g/min ÷ 0.78665 kg/L (E85 blend
    // density of the library) = 10 699 cc/min ÷ (8 × 1500) = 89.2 %.
    const next = predictNextStep(
      v8,
      { crankKw: 700, boostKpa: 150, bsfcGPerKwh: 505, ethanolPct: 85 },
      { crankKw: 1000 },
    );
    expect(next.dutyPct).toBeCloseTo(((505 * 1000) / 60 / 0.78665 / 12000) * 100, 1);
    // Boost for 1000 kW in proportion to manifold absolute pressure (common practice, no source):
    // (101.325 + 150) × 1000 / 700 − 101.325 = 257.71 kPa (worked by hand).
    expect(next.boostKpa).toBeCloseTo(257.71, 2);
    // The test pumps (2 × ≈ 290 L/h) cannot feed 816 L/h: the pump runs out first.
    expect(next.runsOutFirst.part).toBe("pump");
    expect(next.pumpMarginPct).toBeLessThan(0);
    expect(next.feedDropKpa).toBeGreaterThan(0);
  });

  it("predicts the power at a boost step", () => {
    // Worked by hand: 700 kW × (101.325 + 240) / (101.325 + 150) = 950.67 kW.
    expect(powerAtBoostKw({ crankKw: 700, fromBoostKpa: 150, toBoostKpa: 240 })).toBeCloseTo(
      950.67,
      2,
    );
    const next = predictNextStep(
      v8,
      { crankKw: 700, boostKpa: 150, bsfcGPerKwh: 505, ethanolPct: 85 },
      { boostKpa: 240 },
    );
    expect(next.crankKw).toBeCloseTo(950.67, 2);
    expect(next.dutyPct).toBeCloseTo(((505 * 950.67) / 60 / 0.78665 / 12000) * 100, 1);
  });

  it("refuses a boost step on an engine without boost and a BSFC out of range", () => {
    const na = { ...v8, engine: { ...v8.engine, aspiration: "na" as const, maxBoostKpa: 0 } };
    expect(() =>
      predictNextStep(
        na,
        { crankKw: 200, boostKpa: 0, bsfcGPerKwh: 300, ethanolPct: 0 },
        { boostKpa: 50 },
      ),
    ).toThrow(/naturally aspirated/);
    expect(() =>
      predictNextStep(
        v8,
        { crankKw: 700, boostKpa: 150, bsfcGPerKwh: 50, ethanolPct: 85 },
        { crankKw: 800 },
      ),
    ).toThrow(/BSFC/);
  });
});
