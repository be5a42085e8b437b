/**
 * Spec-sheet rendering benchmark: p50/p95 of one render of a full build, then throughput with
 * 4 renders at a time. Prints figures; no pass/fail. Run: npm run bench:pdf
 */
import { FuelSystemInputSchema, sizeParsedFuelSystem } from "../../lib/calc";
import { renderSpecSheet, type SpecSheetData } from "../../lib/pdf/spec-sheet";
import { boostedSix } from "../calc/fixtures";

const input = FuelSystemInputSchema.parse(boostedSix);
const data: SpecSheetData = {
  shop: { name: "Bench Shop", address: "1 Bench Road", phone: "555-0000" },
  build: {
    title: "Bench build",
    vehicle: "Bench vehicle",
    customerName: "Bench Customer",
    version: 4,
    savedAt: new Date(),
    tunerName: "Bench Tuner",
  },
  input,
  result: sizeParsedFuelSystem(input),
  parts: [{ role: "injector", partId: "p", sku: "B-1", name: "Bench injector", quantity: 6 }],
  units: "imperial",
  paper: "letter",
  timeZone: "America/Chicago",
};
const q = (xs: number[], p: number) =>
  [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(p * xs.length))]!;

for (let i = 0; i < 3; i++) await renderSpecSheet(data); // warm-up (fonts, layout caches)
const ms: number[] = [];
for (let i = 0; i < 30; i++) {
  const t = performance.now();
  await renderSpecSheet(data);
  ms.push(performance.now() - t);
}
const N = 24;
const t0 = performance.now();
let next = 0;
await Promise.all(
  Array.from({ length: 4 }, async () => {
    while (next < N) {
      next++;
      await renderSpecSheet(data);
    }
  }),
);
const secs = (performance.now() - t0) / 1000;
console.table([
  {
    case: "one render, sequential",
    runs: ms.length,
    "p50 ms": +q(ms, 0.5).toFixed(1),
    "p95 ms": +q(ms, 0.95).toFixed(1),
  },
  {
    case: "4 at a time",
    runs: N,
    "renders/s": +(N / secs).toFixed(1),
    "mean ms": +((secs * 1000) / N).toFixed(1),
  },
]);
