// Reference: docs/calculations.md §8 (defaults: §3.5, §3.7).
import { z } from "zod";

import { VOLUME_TO_ADD_FIELDS, type FieldBound } from "./blend-bounds";
import { ASPIRATIONS, DRIVE_TYPES, REGULATOR_TYPES } from "./input-codes";

/**
 * The one set of input schemas for the sizing: forms, server actions and the JSON API all use
 * these. Units are canonical: kW, kPa gauge, cc/min, L/h, g/kWh, V, mm, m.
 */

const num = (label: string, min: number, max: number, unit = "", whole = false) => {
  const u = unit ? ` ${unit}` : "";
  const n = z.number({
    // A number too large to hold (Infinity: "1e400", or 1e308 psi once in kPa) is past the
    // limits, and says them; text that is no number says so.
    error: (iss) =>
      iss.input === undefined
        ? `${label} is required`
        : typeof iss.input === "number" && !Number.isNaN(iss.input)
          ? `${label} must be between ${min} and ${max}${u}`
          : `${label} must be a number`,
  });
  // A whole-number field says so first: 0.5 injectors is no count, whatever the bounds.
  return (whole ? n.int(`${label} must be a whole number`) : n)
    .min(min, `${label} must be between ${min} and ${max}${u}`)
    .max(max, `${label} must be between ${min} and ${max}${u}`);
};
const int = (label: string, min: number, max: number) => num(label, min, max, "", true);

export { ASPIRATIONS, DRIVE_TYPES, REGULATOR_TYPES };

export const EngineSchema = z
  .object(
    {
      cylinders: int("Cylinders", 1, 16),
      displacementL: num("Displacement", 0.1, 20, "L"),
      aspiration: z.enum(ASPIRATIONS, { error: "Aspiration must be na, turbo or supercharged" }),
      redlineRpm: num("Redline", 1000, 20000, "rpm"),
      idleRpm: num("Idle speed", 300, 3000, "rpm").default(850),
      maxBoostKpa: num("Boost", 0, 500, "kPa").default(0),
      idleManifoldKpaAbs: num("Idle manifold pressure", 15, 101, "kPa absolute").default(35),
      idleVolumetricEfficiency: num("Idle volumetric efficiency", 0.2, 1.2).default(0.8),
      intakeTempC: num("Intake air temperature", -30, 90, "°C").default(30),
      /** Barometric pressure: gauge pressures and a fixed regulator work against it (calc-spec §3). */
      ambientKpaAbs: num("Ambient pressure", 50, 110, "kPa absolute").default(101.325),
    },
    { error: "Give the engine: cylinders, displacement, aspiration and redline" },
  )
  .superRefine((e, ctx) => {
    if (e.idleRpm >= e.redlineRpm)
      ctx.addIssue({
        code: "custom",
        path: ["idleRpm"],
        message: "Idle speed must be below the redline",
      });
    if (e.idleManifoldKpaAbs >= e.ambientKpaAbs)
      ctx.addIssue({
        code: "custom",
        path: ["idleManifoldKpaAbs"],
        message: "Idle manifold pressure must be below the ambient pressure",
      });
    if (e.aspiration === "na" && e.maxBoostKpa > 0)
      ctx.addIssue({
        code: "custom",
        path: ["maxBoostKpa"],
        message:
          "A naturally aspirated engine has no boost: set boost to 0 or choose turbo or supercharged",
      });
  });

export const TargetSchema = z.object(
  {
    powerKw: num("Target power", 1, 5000, "kW"),
    measuredAt: z.enum(["wheel", "crank"], {
      error: "Say whether the power is at the wheels or the crank",
    }),
    /** Left out: the shop's loss for the drive type (lib/sizing/effective-inputs), else the library's 15 %. */
    drivetrainLossPct: num("Drivetrain loss", 0, 50, "%").optional(),
    driveType: z
      .enum(DRIVE_TYPES, { error: "Drive type must be manual, automatic or awd" })
      .optional(),
  },
  { error: "Give the power goal: power and where it is measured" },
);

export const BsfcDefaultsSchema = z.object({
  gasolineNaGPerKwh: num("BSFC gasoline NA", 150, 1200, "g/kWh"),
  gasolineBoostedGPerKwh: num("BSFC gasoline boosted", 150, 1200, "g/kWh"),
  e85NaGPerKwh: num("BSFC E85 NA", 150, 1200, "g/kWh"),
  e85BoostedGPerKwh: num("BSFC E85 boosted", 150, 1200, "g/kWh"),
  referenceLambdaNa: num("Reference lambda NA", 0.6, 1.3),
  referenceLambdaBoosted: num("Reference lambda boosted", 0.6, 1.3),
});

/** One fuel component's properties where the library's defaults (lib/calc/constants, fuel.ts) do not fit. */
const ComponentPropertiesSchema = (
  name: string,
  density: [number, number],
  afr: [number, number],
) =>
  z.object({
    densityKgPerL: num(`${name} density`, density[0], density[1], "kg/L").optional(),
    stoichAfr: num(`${name} stoichiometric AFR`, afr[0], afr[1]).optional(),
  });

export const FuelPropertiesSchema = z.object({
  gasoline: ComponentPropertiesSchema("Gasoline", [0.68, 0.8], [13, 15.5]).optional(),
  ethanol: ComponentPropertiesSchema("Ethanol", [0.75, 0.83], [8, 10]).optional(),
});

export const FuelSchema = z
  .object(
    {
      ethanolMinVolPct: num("Lowest ethanol content", 0, 100, "%"),
      ethanolMaxVolPct: num("Highest ethanol content", 0, 100, "%"),
      bsfcGPerKwh: num("BSFC", 150, 1200, "g/kWh").optional(),
      /** Ethanol content the given BSFC was taken at; left out: the lowest of the range. */
      bsfcEthanolVolPct: num("Ethanol content of the given BSFC", 0, 100, "%").optional(),
      targetLambda: num("Target lambda", 0.6, 1.3).optional(),
      bsfcDefaults: BsfcDefaultsSchema.optional(),
      properties: FuelPropertiesSchema.optional(),
    },
    { error: "Give the fuel: the lowest and highest ethanol content" },
  )
  .refine((f) => f.ethanolMinVolPct <= f.ethanolMaxVolPct, {
    path: ["ethanolMaxVolPct"],
    message: "The highest ethanol content must not be below the lowest",
  });

export const DeadTimeTableSchema = z
  .object({
    voltages: z
      .array(num("Dead-time voltage", 5, 20, "V"))
      .min(1, "Give at least one voltage")
      .max(20),
    pressuresKpa: z
      .array(num("Dead-time pressure", 50, 1500, "kPa"))
      .min(1, "Give at least one pressure")
      .max(20),
    deadTimeMs: z.array(z.array(num("Dead time", 0, 10, "ms")).max(20)).max(20),
  })
  .superRefine((t, ctx) => {
    const ascending = (xs: number[]) => xs.every((x, i) => i === 0 || x > xs[i - 1]!);
    if (!ascending(t.voltages))
      ctx.addIssue({
        code: "custom",
        path: ["voltages"],
        message: "Voltages must rise from left to right, each once",
      });
    if (!ascending(t.pressuresKpa))
      ctx.addIssue({
        code: "custom",
        path: ["pressuresKpa"],
        message: "Pressures must rise, each once",
      });
    if (
      t.deadTimeMs.length !== t.voltages.length ||
      t.deadTimeMs.some((r) => r.length !== t.pressuresKpa.length)
    )
      ctx.addIssue({
        code: "custom",
        path: ["deadTimeMs"],
        message: "The table needs one row per voltage and one value per pressure",
      });
  });

export const InjectorsSchema = z.object(
  {
    count: int("Injector count", 1, 32),
    ratedFlowCcPerMin: num("Injector rated flow", 20, 10000, "cc/min"),
    ratedPressureKpa: num("Injector rated pressure", 100, 1000, "kPa").default(300),
    deadTime: DeadTimeTableSchema.optional(),
    minPulseWidthMs: num("Minimum pulse width", 0.1, 10, "ms").optional(),
    /**
     * Density of the fluid the rating was measured with (n-heptane ≈ 0.684, calibration fluids
     * ≈ 0.76–0.78 kg/L). Left out: the rating is taken as the fuel's own. §3.10.
     */
    ratingFluidDensityKgPerL: num("Rating fluid density", 0.6, 1.1, "kg/L").optional(),
  },
  { error: "Give the injectors: count and rated flow" },
);

export const RegulatorSchema = z.object(
  {
    type: z.enum(REGULATOR_TYPES, { error: "Regulator must be boost-referenced or fixed" }),
    basePressureKpa: num("Base pressure", 50, 1000, "kPa"),
    /**
     * Fuel-pressure rise per unit of boost of a boost-referenced regulator: 1 (1:1) unless a
     * rising-rate unit (up to 1:12). Ignored by a fixed regulator. docs/calculations.md §3.8.
     */
    risingRateRatio: num("Rising-rate ratio", 1, 12).default(1),
    /** Optional: the bypass (return) flow the regulator is rated to pass at a pressure (§3.9). */
    bypass: z
      .object({
        flowLPerH: num("Regulator bypass flow", 10, 5000, "L/h"),
        atPressureKpa: num("Pressure of the bypass rating", 50, 1000, "kPa"),
      })
      .optional(),
  },
  { error: "Give the regulator: type and base pressure" },
);

export const PumpCurveSchema = z
  .object({
    voltage: num("Curve voltage", 6, 20, "V"),
    points: z
      .array(
        z.object({
          pressureKpa: num("Curve pressure", 0, 1500, "kPa"),
          flowLPerH: num("Curve flow", 0, 3000, "L/h"),
        }),
      )
      .min(2, "A pump curve needs at least two points")
      .max(40, "A pump curve takes at most 40 points"),
  })
  .superRefine((c, ctx) => {
    // Each pressure once, at least 1 kPa from the next: the second point of a pair is marked,
    // naming the curve (its voltage) and the point it repeats.
    const order = c.points
      .map((_, i) => i)
      .sort((a, b) => c.points[a]!.pressureKpa - c.points[b]!.pressureKpa || a - b);
    for (let k = 1; k < order.length; k++) {
      const [i, j] = [order[k - 1]!, order[k]!];
      if (c.points[j]!.pressureKpa - c.points[i]!.pressureKpa < 1) {
        const [first, second] = i < j ? [i, j] : [j, i];
        ctx.addIssue({
          code: "custom",
          path: ["points", second, "pressureKpa"],
          message: `On the ${c.voltage} V curve, point ${second + 1} has the pressure of point ${first + 1}: each pressure may appear once on a curve, at least 1 kPa from the next`,
          params: {
            template: `On the {voltage} curve, point ${second + 1} has the pressure of point ${first + 1}: each pressure may appear once on a curve, at least {gap} from the next`,
            figures: {
              voltage: { value: c.voltage, quantity: "voltage" },
              gap: { value: 1, quantity: "pressureDrop" },
            },
          },
        });
        return;
      }
    }
    // A pump's flow falls as its pressure rises: a point that flows more than one at a lower
    // pressure is a typing mistake, refused at that point.
    for (let k = 1; k < order.length; k++) {
      const a = c.points[order[k - 1]!]!;
      const b = c.points[order[k]!]!;
      if (b.pressureKpa > a.pressureKpa && b.flowLPerH > a.flowLPerH) {
        ctx.addIssue({
          code: "custom",
          path: ["points", order[k]!, "flowLPerH"],
          message: `On the ${c.voltage} V curve, point ${order[k]! + 1} flows more than point ${order[k - 1]! + 1} at a lower pressure: a pump's flow falls as pressure rises`,
          params: {
            template: `On the {voltage} curve, point ${order[k]! + 1} flows more than point ${order[k - 1]! + 1} at a lower pressure: a pump's flow falls as pressure rises`,
            figures: { voltage: { value: c.voltage, quantity: "voltage" } },
          },
        });
        return;
      }
    }
  });

/** A pump's curves: one per voltage, up to eight. */
export const PumpCurvesSchema = z
  .array(PumpCurveSchema)
  .min(1, "A pump needs at least one flow curve")
  .max(8)
  .superRefine((curves, ctx) => {
    // One curve per voltage: between two curves the flow is interpolated by voltage.
    const seen = new Map<number, number>();
    curves.forEach((c, j) => {
      const first = seen.get(c.voltage);
      if (first === undefined) return void seen.set(c.voltage, j);
      ctx.addIssue({
        code: "custom",
        path: [j, "voltage"],
        message: `Curve ${j + 1} is at the voltage of curve ${first + 1} (${c.voltage} V): give each curve its own voltage`,
        params: {
          template: `Curve ${j + 1} is at the voltage of curve ${first + 1} ({voltage}): give each curve its own voltage`,
          figures: { voltage: { value: c.voltage, quantity: "voltage" } },
        },
      });
    });
  });

export const PumpSchema = z.object({
  label: z.string().max(120).optional(),
  quantity: int("Pump quantity", 1, 4).default(1),
  curves: PumpCurvesSchema,
  /** A boost-switched stage runs from this boost up; left out, the pump runs all the time. */
  switchOnBoostKpa: num("Switch-on boost", 0, 500, "kPa").optional(),
});

export const WiringSchema = z.object({
  sourceVoltage: num("Supply voltage", 6, 20, "V"),
  gaugeAwg: int("Wire gauge", -3, 30),
  roundTripLengthM: num("Wire length", 0.1, 50, "m"),
  currentA: num("Pump current", 0, 80, "A"),
});

export const ElectricalSchema = z.object(
  {
    voltageAtPump: num("Voltage at the pump", 6, 20, "V"),
    /**
     * Battery/charging voltage the ECU and the injectors see (running engine): the injectors'
     * dead time is looked up at it, not at the voltage left at the pump after its wiring.
     */
    injectorVoltage: num("Voltage at the injectors", 6, 20, "V").default(14),
    wiring: WiringSchema.optional(),
  },
  { error: "Give the voltage at the pump" },
);

export const LineSchema = z.object({
  insideDiameterMm: num("Inside diameter", 2, 40, "mm"),
  lengthM: num("Line length", 0.1, 30, "m"),
  roughnessMm: num("Roughness", 0, 1, "mm").optional(),
  fittingsK: num("Fittings K", 0, 50).default(0),
});

/**
 * Filters as two items (docs/calculations.md §4.5): the pre-pump one (sock, strainer) on the
 * suction side; the post-pump one between the pump and the rail, in the pump's outlet pressure.
 * Inputs format 2 kept one filter drop on the feed line; it reads as the post-pump filter.
 */
export const FiltersSchema = z.object({
  prePumpDropKpa: num("Pre-pump filter drop", 0, 50, "kPa").default(0),
  postPumpDropKpa: num("Post-pump filter drop", 0, 200, "kPa").default(0),
});

export const LinesSchema = z.object({ feed: LineSchema.optional(), return: LineSchema.optional() });

/** Each limit left out is the shop's (lib/sizing/effective-inputs), else the library's DEFAULT_LIMITS. */
export const LimitsSchema = z
  .object({
    designDutyPct: num("Design duty", 50, 95, "%").optional(),
    dutyCautionPct: num("Duty caution level", 50, 100, "%").optional(),
    dutyDangerPct: num("Duty danger level", 50, 100, "%").optional(),
    minPumpMarginPct: num("Minimum pump margin", 0, 200, "%").optional(),
    maxLineDropKpa: num("Line drop limit", 1, 100, "kPa").optional(),
  })
  .refine(
    (l) =>
      l.dutyCautionPct === undefined ||
      l.dutyDangerPct === undefined ||
      l.dutyCautionPct <= l.dutyDangerPct,
    {
      path: ["dutyDangerPct"],
      message: "The danger level must not be below the caution level",
    },
  );

export const FuelSystemInputSchema = z
  .object(
    {
      engine: EngineSchema,
      target: TargetSchema,
      fuel: FuelSchema,
      injectors: InjectorsSchema,
      regulator: RegulatorSchema,
      pumps: z
        .array(PumpSchema, { error: "Add at least one fuel pump" })
        .min(1, "Add at least one fuel pump")
        .max(6, "At most six pump entries"),
      electrical: ElectricalSchema,
      lines: LinesSchema.optional(),
      filters: FiltersSchema.prefault({}),
      limits: LimitsSchema.optional(),
    },
    { error: "Send the build as a JSON object" },
  )
  .superRefine((s, ctx) => {
    // Staged pumps: the first stage must run all the time (idle and light load need fuel).
    if (s.pumps.every((p) => p.switchOnBoostKpa !== undefined))
      ctx.addIssue({
        code: "custom",
        path: ["pumps", 0, "switchOnBoostKpa"],
        message: "One pump must run all the time: leave its switch-on boost blank",
      });
    // A fixed regulator loses the boost from ΔP; keep some pressure across the injector.
    if (s.regulator.type === "fixed" && s.regulator.basePressureKpa - s.engine.maxBoostKpa < 50) {
      ctx.addIssue({
        code: "custom",
        path: ["regulator", "basePressureKpa"],
        message: `With a fixed regulator the base pressure must exceed the boost by at least 50 kPa (boost is ${s.engine.maxBoostKpa} kPa)`,
        params: {
          template:
            "With a fixed regulator the base pressure must exceed the boost by at least {gap} (boost is {boost})",
          figures: {
            gap: { value: 50, quantity: "pressure" },
            boost: { value: s.engine.maxBoostKpa, quantity: "pressure" },
          },
        },
      });
    }
  });

/** What callers pass (defaults may be left out). */
export type FuelSystemInput = z.input<typeof FuelSystemInputSchema>;
/** What the library works on, defaults filled in. */
export type ParsedFuelSystemInput = z.output<typeof FuelSystemInputSchema>;

export const BlendMixSchema = z.object({
  parts: z
    .array(
      z.object({
        volumeL: num("Volume", 0, 100000, "L"),
        ethanolVolPct: num("Ethanol content", 0, 100, "%"),
      }),
    )
    .min(1, "Add at least one fuel")
    .max(50, "At most 50 fills"),
});

/** Built from `blend-bounds.ts`, which the tools page checks with in the browser. */
const bound = (f: FieldBound) => num(f.label, f.min, f.max, f.unit);
const V = VOLUME_TO_ADD_FIELDS;
export const VolumeToAddSchema = z.object({
  tankVolumeL: bound(V.tankVolumeL),
  tankEthanolVolPct: bound(V.tankEthanolVolPct),
  addedEthanolVolPct: bound(V.addedEthanolVolPct),
  targetEthanolVolPct: bound(V.targetEthanolVolPct),
  tankCapacityL: bound(V.tankCapacityL).optional(),
});

export const FillSplitSchema = z.object({
  fillVolumeL: num("Fill volume", 0.1, 100000, "L"),
  fuelAEthanolVolPct: num("Ethanol content of fuel A", 0, 100, "%"),
  fuelBEthanolVolPct: num("Ethanol content of fuel B", 0, 100, "%"),
  targetEthanolVolPct: num("Target ethanol content", 0, 100, "%"),
  tankVolumeL: num("Fuel in the tank", 0, 100000, "L").optional(),
  tankEthanolVolPct: num("Ethanol content in the tank", 0, 100, "%").optional(),
});

export const FlexSensorSchema = z.object({ frequencyHz: num("Sensor frequency", 50, 150, "Hz") });
