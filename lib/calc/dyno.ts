// Reference: docs/calculations.md §6.
import { cycleTimeMs, injectorFlowAtPressure } from "./injectors";
import type { Warning } from "./types";

/** One logged sample, already mapped and converted to canonical units (kPa gauge, lambda). */
export interface PullSample {
  rpm: number;
  /** Injector duty in % (or derive it from pulseMs). */
  dutyPct?: number | null;
  pulseMs?: number | null;
  lambda?: number | null;
  /** Manifold pressure above atmosphere, kPa. */
  boostKpa?: number | null;
  /** Fuel pressure across the injector (rail minus manifold), kPa. */
  fuelDiffKpa?: number | null;
  powerKw?: number | null;
  /** Exhaust gas temperature per cylinder, °C, in cylinder order (null: that cell was blank). */
  egtC?: (number | null)[] | null;
  /** Exhaust manifold pressure above atmosphere, kPa. */
  exhaustKpa?: number | null;
  turboRpm?: number | null;
  intakeTempC?: number | null;
  /** Ignition timing, degrees before top dead centre. */
  timingDeg?: number | null;
}

export interface PullContext {
  injectorCount: number;
  ratedFlowCcPerMin: number;
  ratedPressureKpa: number;
  densityKgPerL: number;
  targetLambda: number;
  /**
   * The target at a sample's boost (a lambda table, lib/calc/tune lambdaTargetAt): when given,
   * each loaded sample is judged against its own boost's target instead of `targetLambda`.
   */
  lambdaTargetAt?: (boostKpa: number) => number;
  /** Duty above which the sizing calls it danger (the shop's setting). */
  dutyDangerPct: number;
  /** The differential the regulator should hold, kPa. */
  expectedDiffKpa?: number;
}

export interface PullAnalysis {
  samples: number;
  peakDuty: { pct: number; rpm: number } | null;
  lambda: { meanAbsError: number; worstError: number; worstAtRpm: number } | null;
  fuelPressure: {
    lowBoostDiffKpa: number;
    fullBoostDiffKpa: number;
    dropKpa: number;
    dropPct: number;
  } | null;
  /** At the sample of highest duty: fuel flow from duty and the injectors' data. */
  measuredFlow: { ccPerMin: number; gPerMin: number } | null;
  /** g/kWh at the sample of highest logged power. */
  measuredBsfc: { gPerKwh: number; atRpm: number; powerKw: number } | null;
  warnings: Warning[];
}

const finite = (v: number | null | undefined): v is number =>
  typeof v === "number" && Number.isFinite(v);

/** Duty of a sample: logged, or pulse width over the four-stroke cycle time. */
export function sampleDutyPct(s: PullSample): number | null {
  if (finite(s.dutyPct)) return s.dutyPct;
  if (finite(s.pulseMs) && s.rpm > 0) return (100 * s.pulseMs) / cycleTimeMs(s.rpm);
  return null;
}

/** Fuel flow of all injectors at a duty and differential (flow scales with √ΔP), cc/min and g/min. */
export function flowFromDuty(dutyPct: number, diffKpa: number, c: PullContext) {
  const perInjector = injectorFlowAtPressure({
    ratedFlowCcPerMin: c.ratedFlowCcPerMin,
    ratedPressureKpa: c.ratedPressureKpa,
    differentialPressureKpa: diffKpa,
  });
  const ccPerMin = c.injectorCount * perInjector * (dutyPct / 100);
  return { ccPerMin, gPerMin: ccPerMin * c.densityKgPerL };
}

/**
 * The figures of calc-spec §6 from one pull: peak duty and where, lambda error against the
 * target (only under load: duty above 20 %), the fuel-pressure differential at low and at full
 * boost, fuel flow from duty, and BSFC where power was logged. Flags use the sizing's warning form.
 */
export function analyzePull(samples: PullSample[], c: PullContext): PullAnalysis {
  const rows = samples.filter((s) => finite(s.rpm) && s.rpm > 0 && s.rpm <= 30000);
  const warnings: Warning[] = [];
  let peak: { pct: number; rpm: number; s: PullSample } | null = null;
  for (const s of rows) {
    const d = sampleDutyPct(s);
    if (d !== null && (!peak || d > peak.pct)) peak = { pct: d, rpm: s.rpm, s };
  }
  const loaded = rows.filter((s) => (sampleDutyPct(s) ?? 0) > 20 && finite(s.lambda));
  let lambda: PullAnalysis["lambda"] = null;
  if (loaded.length) {
    const target = (s: PullSample) =>
      c.lambdaTargetAt ? c.lambdaTargetAt(finite(s.boostKpa) ? s.boostKpa : 0) : c.targetLambda;
    const errs = loaded.map((s) => ({ e: s.lambda! - target(s), rpm: s.rpm }));
    const worst = errs.reduce((a, b) => (Math.abs(b.e) > Math.abs(a.e) ? b : a));
    lambda = {
      meanAbsError: errs.reduce((t, x) => t + Math.abs(x.e), 0) / errs.length,
      worstError: worst.e,
      worstAtRpm: worst.rpm,
    };
  }
  let fuelPressure: PullAnalysis["fuelPressure"] = null;
  const withP = rows.filter((s) => finite(s.fuelDiffKpa) && finite(s.boostKpa));
  if (withP.length >= 4) {
    const maxBoost = Math.max(...withP.map((s) => s.boostKpa!));
    const low = withP.filter((s) => s.boostKpa! <= maxBoost * 0.25);
    const high = withP.filter((s) => s.boostKpa! >= maxBoost * 0.9);
    const mean = (xs: PullSample[]) => xs.reduce((t, s) => t + s.fuelDiffKpa!, 0) / xs.length;
    if (low.length && high.length) {
      const lo = c.expectedDiffKpa ?? mean(low);
      const hi = mean(high);
      fuelPressure = {
        lowBoostDiffKpa: lo,
        fullBoostDiffKpa: hi,
        dropKpa: lo - hi,
        dropPct: (100 * (lo - hi)) / lo,
      };
    }
  }
  const diffAt = (s: PullSample) =>
    finite(s.fuelDiffKpa)
      ? s.fuelDiffKpa
      : (fuelPressure?.fullBoostDiffKpa ?? c.expectedDiffKpa ?? c.ratedPressureKpa);
  const measuredFlow = peak
    ? (({ ccPerMin, gPerMin }) => ({ ccPerMin, gPerMin }))(
        flowFromDuty(peak.pct, diffAt(peak.s), c),
      )
    : null;
  let measuredBsfc: PullAnalysis["measuredBsfc"] = null;
  const powered = rows.filter(
    (s) => finite(s.powerKw) && s.powerKw > 0 && sampleDutyPct(s) !== null,
  );
  if (powered.length) {
    const top = powered.reduce((a, b) => (b.powerKw! > a.powerKw! ? b : a));
    const flow = flowFromDuty(sampleDutyPct(top)!, diffAt(top), c);
    measuredBsfc = {
      gPerKwh: (flow.gPerMin * 60) / top.powerKw!,
      atRpm: top.rpm,
      powerKw: top.powerKw!,
    };
  }
  if (peak && peak.pct > c.dutyDangerPct) {
    warnings.push({
      code: "log-duty-danger",
      severity: "danger",
      message: "Measured duty reached {duty} at {rpm}, above the {limit} limit.",
      fix: "Fit larger injectors or raise the fuel pressure.",
      params: {
        duty: { value: peak.pct, quantity: "percent" },
        rpm: { value: peak.rpm, quantity: "speed" },
        limit: { value: c.dutyDangerPct, quantity: "percent", decimals: 0 },
      },
    });
  }
  if (lambda && lambda.worstError > 0.05) {
    warnings.push({
      code: "log-lambda-lean",
      severity: "danger",
      message: "Lambda ran {error} leaner than the target at {rpm}.",
      fix: "Stop pulls until the fuelling is corrected; check duty, pressure and the fuel's ethanol content.",
      params: {
        error: { value: lambda.worstError, quantity: "ratio" },
        rpm: { value: lambda.worstAtRpm, quantity: "speed" },
      },
    });
  }
  if (fuelPressure && fuelPressure.dropPct > 5) {
    warnings.push({
      code: "log-fuel-pressure-falls",
      severity: fuelPressure.dropPct > 10 ? "danger" : "caution",
      message: "The fuel-pressure differential fell {drop} ({dropPct}) under boost.",
      fix: "The pump or regulator is not keeping up: check voltage at the pump, the filter, and the pump's margin.",
      params: {
        drop: { value: fuelPressure.dropKpa, quantity: "pressure" },
        dropPct: { value: fuelPressure.dropPct, quantity: "percent", decimals: 0 },
      },
    });
  }
  return {
    samples: rows.length,
    peakDuty: peak ? { pct: peak.pct, rpm: peak.rpm } : null,
    lambda,
    fuelPressure,
    measuredFlow,
    measuredBsfc,
    warnings,
  };
}
