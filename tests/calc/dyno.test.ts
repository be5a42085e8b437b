import { describe, expect, it } from "vitest";

import {
  analyzePull,
  DatalogError,
  DatalogMappingSchema,
  flowFromDuty,
  headerKey,
  mappingProblems,
  parseDatalog,
  sampleDutyPct,
  samplesFromLog,
  suggestMapping,
  type PullContext,
  type PullSample,
} from "@/lib/calc";

// A synthetic pull built in the test from known inputs (no outside source needed: the checks
// are that the analysis recovers what was put in). Injector data: 1000 cc/min at 300 kPa, 6 of them.
const ctx: PullContext = {
  injectorCount: 6,
  ratedFlowCcPerMin: 1000,
  ratedPressureKpa: 300,
  densityKgPerL: 0.787,
  targetLambda: 0.78,
  dutyDangerPct: 90,
};
function pull(opts: { leanAt?: number; diffDropKpa?: number } = {}): PullSample[] {
  const out: PullSample[] = [];
  for (let rpm = 3000; rpm <= 7000; rpm += 50) {
    const f = (rpm - 3000) / 4000;
    const boostKpa = 150 * Math.min(1, f * 1.5);
    out.push({
      rpm,
      dutyPct: 40 + 40 * f, // 80 % at 7000 rpm
      lambda:
        opts.leanAt !== undefined && Math.abs(rpm - opts.leanAt) < 1
          ? 0.86
          : 0.78 + 0.01 * Math.sin(rpm),
      boostKpa,
      fuelDiffKpa: 300 - (boostKpa > 100 ? (opts.diffDropKpa ?? 0) : 0),
      powerKw: 100 + 250 * f, // 350 kW at 7000 rpm
    });
  }
  return out;
}

describe("pull analysis", () => {
  it("recovers peak duty and where it was", () => {
    const a = analyzePull(pull(), ctx);
    expect(a.peakDuty!.pct).toBeCloseTo(80, 6);
    expect(a.peakDuty!.rpm).toBe(7000);
    expect(a.warnings).toEqual([]);
  });

  it("recovers the lambda error against the target and flags a lean spot", () => {
    const a = analyzePull(pull({ leanAt: 6000 }), ctx);
    expect(a.lambda!.worstError).toBeCloseTo(0.08, 6);
    expect(a.lambda!.worstAtRpm).toBe(6000);
    expect(a.lambda!.meanAbsError).toBeLessThan(0.012);
    expect(a.warnings.map((w) => w.code)).toContain("log-lambda-lean");
  });

  it("recovers a fuel-pressure differential that falls under boost", () => {
    const a = analyzePull(pull({ diffDropKpa: 24 }), ctx);
    expect(a.fuelPressure!.lowBoostDiffKpa).toBeCloseTo(300, 6);
    expect(a.fuelPressure!.fullBoostDiffKpa).toBeCloseTo(276, 6);
    expect(a.fuelPressure!.dropPct).toBeCloseTo(8, 6);
    expect(a.warnings.find((w) => w.code === "log-fuel-pressure-falls")?.severity).toBe("caution");
  });

  it("measured flow and BSFC follow from duty, the injectors' data and the logged power", () => {
    const a = analyzePull(pull(), ctx);
    // 6 × 1000 cc/min × 80 % at the rated 300 kPa = 4800 cc/min; × 0.787 g/cc = 3777.6 g/min (by hand).
    expect(a.measuredFlow!.ccPerMin).toBeCloseTo(4800, 6);
    expect(a.measuredFlow!.gPerMin).toBeCloseTo(3777.6, 6);
    // 3777.6 g/min × 60 / 350 kW = 647.6 g/kWh (by hand).
    expect(a.measuredBsfc!.gPerKwh).toBeCloseTo(647.59, 1);
    // Flow scales with the square root of the differential (common practice, no source): at 75 kPa, half.
    expect(flowFromDuty(50, 75, ctx).ccPerMin).toBeCloseTo(6 * 1000 * 0.5 * 0.5, 6);
  });

  it("derives duty from pulse width over the cycle time (120 000 / rpm ms for a four-stroke)", () => {
    // 10 ms at 6000 rpm: cycle 20 ms → 50 % (by hand).
    expect(sampleDutyPct({ rpm: 6000, pulseMs: 10 })).toBeCloseTo(50, 9);
    expect(sampleDutyPct({ rpm: 6000 })).toBeNull();
    const a = analyzePull(
      [
        { rpm: 6000, pulseMs: 19 },
        { rpm: 0, pulseMs: 5 },
        { rpm: Number.NaN, dutyPct: 99 },
      ],
      ctx,
    );
    expect(a.samples).toBe(1);
    expect(a.peakDuty!.pct).toBeCloseTo(95, 9);
    expect(a.warnings.map((w) => w.code)).toContain("log-duty-danger");
  });
});

describe("datalog parser", () => {
  it("reads semicolons with decimal commas, a units row, blank lines and a BOM", () => {
    const text =
      "\uFEFFTime;RPM;Inj Duty;Lambda 1\r\ns;rpm;%;λ\r\n\r\n0,00;3000;41,5;0,79\r\n0,05;3050;42,0;0,78\r\n\r\n";
    const log = parseDatalog(text);
    expect(log.headers).toEqual(["Time", "RPM", "Inj Duty", "Lambda 1"]);
    expect(log.units).toEqual(["s", "rpm", "%", "λ"]);
    expect(log.delimiter).toBe(";");
    expect(log.decimalComma).toBe(true);
    expect(log.rows).toEqual([
      [0, 3000, 41.5, 0.79],
      [0.05, 3050, 42, 0.78],
    ]);
  });

  it("reads commas and tabs, and keeps blank cells as null", () => {
    expect(parseDatalog("rpm,duty\n3000,40.5\n3100,\n").rows).toEqual([
      [3000, 40.5],
      [3100, null],
    ]);
    expect(parseDatalog("rpm\tduty\n3000\t1e1\n").rows).toEqual([[3000, 10]]);
  });

  it("refuses what is not a datalog with a plain message", () => {
    expect(() => parseDatalog("")).toThrow(DatalogError);
    expect(() => parseDatalog("rpm,duty\n")).toThrow("no data rows");
    expect(() => parseDatalog("a\u0000b")).toThrow("not text");
    expect(() =>
      parseDatalog(`${Array.from({ length: 600 }, (_, i) => `c${i}`).join(",")}\n1,2\n`),
    ).toThrow("more than 500 columns");
    expect(() => parseDatalog("rpm,duty\nx,y\nz,w\n")).toThrow("No numbers");
  });

  it("a file cut off mid-row loses only that partial row, and says so (common practice, no source)", () => {
    const cut = parseDatalog("rpm,duty,lambda\n3000,40,0.80\n3100,41,0.79\n3200,4");
    expect(cut.rows).toEqual([
      [3000, 40, 0.8],
      [3100, 41, 0.79],
    ]);
    expect(cut.cutShort).toBe(true);
    // A last row without a newline but complete is kept.
    expect(parseDatalog("rpm,duty\n3000,40\n3100,41").rows).toHaveLength(2);
    expect(parseDatalog("rpm,duty\n3000,40\n3100,41").cutShort).toBe(false);
    expect(() => parseDatalog("rpm,duty\n3000")).toThrow("cut short");
  });
});

describe("column mapping", () => {
  const log = parseDatalog(
    "Engine RPM,Inj Duty,AFR,MAP,Fuel Pressure,Ethanol,Power\nrpm,%,afr,psi,psi,%,hp\n6000,80,11.76,29.4,72.5,85,400\n",
  );

  it("guesses the columns from headers and units", () => {
    expect(suggestMapping(log)).toEqual({
      rpm: "Engine RPM",
      duty: { column: "Inj Duty", kind: "duty_pct" },
      mixture: { column: "AFR", kind: "afr", afrStoich: 14.7 },
      boost: { column: "MAP", kind: "absolute", unit: "psi" },
      fuelPressure: { column: "Fuel Pressure", kind: "rail", unit: "psi" },
      ethanol: { column: "Ethanol" },
      power: { column: "Power", unit: "hp" },
    });
  });

  it("converts to canonical units: psi absolute → kPa gauge, rail → differential, AFR → lambda, hp → kW", () => {
    const m = DatalogMappingSchema.parse(suggestMapping(log));
    const [s] = samplesFromLog(log, m);
    // NIST SP 811 B.8: 29.4 psi = 202.70 kPa abs; − 101.325 (ISO 2533) = 101.38 kPa boost.
    expect(s!.boostKpa).toBeCloseTo(29.4 * 6.894757293168361 - 101.325, 6);
    // 72.5 psi rail = 499.87 kPa; differential = rail − boost = 398.5 kPa (by hand).
    expect(s!.fuelDiffKpa).toBeCloseTo(
      72.5 * 6.894757293168361 - (29.4 * 6.894757293168361 - 101.325),
      6,
    );
    // AFR 11.76 on the gasoline 14.7 scale = lambda 0.80 (common practice, no source).
    expect(s!.lambda).toBeCloseTo(0.8, 9);
    // NIST SP 811 B.8: 1 hp (550 ft·lbf/s) = 745.699 871 582 270 22 W.
    expect(s!.powerKw).toBeCloseTo(400 * 0.74569987158227022, 6);
  });

  it("the same header set in another order is the same logger; unknown columns are named", () => {
    expect(headerKey(["RPM", "Duty"])).toBe(headerKey(["duty ", "rpm"]));
    expect(
      mappingProblems(
        DatalogMappingSchema.parse({ rpm: "RPM", duty: { column: "Nope", kind: "duty_pct" } }),
        log.headers,
      ),
    ).toEqual([
      { path: "rpm", message: 'The log has no column "RPM"' },
      { path: "duty.column", message: 'The log has no column "Nope"' },
    ]);
  });
});
