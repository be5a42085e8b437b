/**
 * Calculation benchmark: one full sizing (with schema validation and the trace) and a sweep of
 * 100 rpm points × 20 candidate injectors × 2 blend ends. Prints medians; no pass/fail.
 * Run: npm run bench
 */
import { Bench } from "tinybench";

import {
  cycleTimeMs,
  defaultBsfc,
  fuelBlend,
  FuelSystemInputSchema,
  injectorDutyPct,
  injectorFlowAtPressure,
  sizeFuelSystem,
  sizeParsedFuelSystem,
} from "../../lib/calc";
import { boostedSix } from "../calc/fixtures";

const parsed = FuelSystemInputSchema.parse(boostedSix);
const candidates = Array.from({ length: 20 }, (_, i) => 400 + i * 100);
const rpms = Array.from({ length: 100 }, (_, i) => 1000 + i * 60);

/** Duty and pulse width for every candidate injector at every rpm at both blend ends. */
function sweep(): number {
  let acc = 0;
  const crankKw = 450 / 0.85;
  for (const e of [parsed.fuel.ethanolMinVolPct, parsed.fuel.ethanolMaxVolPct]) {
    const b = fuelBlend(e);
    const bsfc = defaultBsfc({
      ethanolVolPct: e,
      aspiration: parsed.engine.aspiration,
    }).bsfcGPerKwh;
    const mdot = (crankKw * bsfc) / 60;
    for (const flow of candidates) {
      const q = injectorFlowAtPressure({
        ratedFlowCcPerMin: flow,
        ratedPressureKpa: 300,
        differentialPressureKpa: 400,
      });
      const dutyAtRedline = injectorDutyPct({
        fuelMassFlowGPerMin: mdot,
        densityKgPerL: b.densityKgPerL,
        injectorCount: 6,
        flowAtOperatingCcPerMin: q,
      });
      for (const rpm of rpms) {
        const duty = (dutyAtRedline * rpm) / parsed.engine.redlineRpm;
        acc += (duty / 100) * cycleTimeMs(rpm);
      }
    }
  }
  return acc;
}

const bench = new Bench({ time: 1500, warmupTime: 300 });
let sink = 0;
bench
  .add("sizeFuelSystem (validate + size + trace)", () => {
    sink += sizeFuelSystem(boostedSix).injector.dutyPct;
  })
  .add("sizeParsedFuelSystem (already validated)", () => {
    sink += sizeParsedFuelSystem(parsed).injector.dutyPct;
  })
  .add("sweep 100 rpm × 20 injectors × 2 blends", () => {
    sink += sweep();
  });

await bench.run();
const rows = bench.tasks.map((t) => {
  const samples = [...(t.result?.samples ?? [])].sort((a, b) => a - b);
  const medianMs = samples.length ? samples[Math.floor(samples.length / 2)]! : Number.NaN;
  return {
    task: t.name,
    "median µs": Number((medianMs * 1000).toFixed(2)),
    samples: samples.length,
  };
});
console.table(rows);
console.log(`goal: one sizing < 20 µs, sweep < 5 ms (sink ${sink > 0 ? "ok" : "?"})`);
