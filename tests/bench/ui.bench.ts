/**
 * UI benchmark (npm run bench:ui): Chromium types 200 keystrokes into the build sheet's target
 * power and prints p50 / p95 / max, from each keystroke's event (its timeStamp: when the browser
 * made the event, before the page sees it), of
 *   - key figures updated: the key figures (duty, pump margin) changed in the page — the
 *     keystroke's whole work, browser included. Goal (issue: speed you can feel): p95 under
 *     16 ms, one frame at 60 Hz;
 *   - key figures on screen: the frame that paints them (its requestAnimationFrame callbacks,
 *     which run just before its paint). That frame comes with the display's clock, 0–16.7 ms after the key whatever the
 *     page does, so this cannot fall below the frame's own wait (p95 ≈ 15.9 ms at 60 Hz); what
 *     the page controls is that the figures are in the first frame after their work, never a
 *     later one — printed as "missed their frame";
 *   - charts settled: the last change to the charts' SVG before the next keystroke, to the frame
 *     after it. Goal: p95 under 100 ms.
 * Keys are GAP_MS apart plus a random part of a frame, so that they fall anywhere in the
 * display's frame, as a person's do (a fixed 250 ms is exactly 15 frames: every key would fall
 * at the same point of its frame). Figures only, no pass/fail, on the 2-core machine.
 * Also prints the page's main-thread CPU per keystroke (CDP Performance.getMetrics, thread time:
 * TaskDuration, of which ScriptDuration), which does not depend on how busy the machine is.
 * BENCH_SAMPLES_OUT=file.json keeps every keystroke's times.
 */
import { launchBrowser } from "../helpers/browser";

const BASE = process.env.BENCH_BASE_URL ?? "http://127.0.0.1:3300";
const BUILD = process.env.BENCH_BUILD_ID ?? "10000000-0000-4000-8000-000000000002";
const KEYSTROKES = Number(process.env.BENCH_KEYSTROKES ?? 200);
/** Time between keystrokes: long enough for the charts to settle, as a person typing slowly. */
const GAP_MS = Number(process.env.BENCH_GAP_MS ?? 250);
/** One frame at 60 Hz: each gap gets a random part of it. */
const FRAME_MS = 1000 / 60;

const browser = await launchBrowser();
const page = await browser.newPage({ viewport: { width: 1440, height: 2400 } });
await page.goto(`${BASE}/sign-in`);
await page.getByLabel("E-mail").fill("tuner@demo.fuelwright.test");
await page.getByLabel("Password").fill("fuelwright-demo");
await page.getByRole("button", { name: "Sign in" }).click();
await page.waitForURL("**/builds");
await page.goto(`${BASE}/builds/${BUILD}`);
const field = page.locator("#b-target-powerKw");
await field.waitFor();
// The charts in view (they may load as they scroll in), then the field focused.
await page.evaluate("window.scrollTo(0, document.body.scrollHeight)");
await page.locator('[data-testid="sizing-charts"] figure svg').first().waitFor();
await page.waitForTimeout(500);

// In-page probes, as text: the bundler that runs this file would name the functions it passes.
await page.evaluate(`(() => {
  const w = window;
  w.__bench = [];
  const figures = document.querySelector('[data-testid="duty-rich"]').closest("section");
  const charts = document.querySelector('[data-testid="sizing-charts"]');
  document.addEventListener(
    "keydown",
    (e) => w.__bench.push({ key: e.timeStamp, input: null, dom: null, figures: null, frame: null, charts: null }),
    { capture: true },
  );
  document.addEventListener(
    "input",
    (e) => {
      const c = w.__bench[w.__bench.length - 1];
      if (c && c.input === null) c.input = e.timeStamp - c.key;
    },
    { capture: true },
  );
  // "On screen": the frame after the change (its requestAnimationFrame callbacks run just before
  // its paint; their argument is the time the frame began).
  new MutationObserver(() => {
    const c = w.__bench[w.__bench.length - 1];
    if (c && c.figures === null) {
      c.figures = -1;
      c.dom = performance.now() - c.key;
      requestAnimationFrame((t) => {
        c.figures = performance.now() - c.key;
        c.frame = t - c.key;
      });
    }
  }).observe(figures, { subtree: true, childList: true, characterData: true });
  new MutationObserver(() => {
    const c = w.__bench[w.__bench.length - 1];
    if (c) requestAnimationFrame(() => (c.charts = performance.now() - c.key));
  }).observe(charts, { subtree: true, childList: true, characterData: true, attributes: true });
})()`);

await field.click();
await field.press("End");
// Backspace then a digit, over and over: 400 → 40 → 401 → 40 → 402 … every keystroke changes
// the target power, so every keystroke must change the duty.
const start = (await field.inputValue()).replace(/\D/g, "") || "400";
await field.fill(start);
await page.waitForTimeout(GAP_MS);
await page.evaluate("window.__bench.length = 0");
const cdp = await page.context().newCDPSession(page);
await cdp.send("Performance.enable", { timeDomain: "threadTicks" });
const metrics = async () => {
  const { metrics: m } = (await cdp.send("Performance.getMetrics")) as {
    metrics: { name: string; value: number }[];
  };
  return Object.fromEntries(m.map((x) => [x.name, x.value])) as Record<string, number>;
};
const before = await metrics();
for (let i = 0; i < KEYSTROKES; i++) {
  await page.keyboard.press(i % 2 === 0 ? "Backspace" : String((i >> 1) % 10));
  await page.waitForTimeout(GAP_MS + Math.random() * FRAME_MS);
}
const after = await metrics();
const perKey = (name: string) => (((after[name] ?? 0) - (before[name] ?? 0)) * 1000) / KEYSTROKES;
const samples = (await page.evaluate("window.__bench")) as {
  input: number | null;
  dom: number | null;
  figures: number | null;
  frame: number | null;
  charts: number | null;
}[];
if (process.env.BENCH_SAMPLES_OUT) {
  const { writeFileSync } = await import("node:fs");
  writeFileSync(process.env.BENCH_SAMPLES_OUT, JSON.stringify(samples));
}
await browser.close();

const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)]!;
};
const done = samples.filter(
  (
    s,
  ): s is {
    input: number | null;
    dom: number;
    figures: number;
    frame: number;
    charts: number | null;
  } => s.dom !== null && s.figures !== null && s.figures >= 0 && s.frame !== null,
);
const dom = done.map((s) => s.dom);
// The frame that paints the figures: when its callbacks ran, just before its paint.
const onScreen = done.map((s) => s.figures);
// A frame that began more than one frame after the figures changed means one in between went by
// without them (1 ms of slack for the clock's own jitter).
const late = done.filter((s) => s.frame - s.dom > FRAME_MS + 1).length;
const charts = samples.map((s) => s.charts).filter((x): x is number => x !== null && x >= 0);
const missed = samples.length - done.length;
const line = (name: string, xs: number[], goal?: number) =>
  `${name.padEnd(34)} p50 ${pct(xs, 50).toFixed(1).padStart(6)} ms  p95 ${pct(xs, 95).toFixed(1).padStart(6)} ms  max ${Math.max(
    ...xs,
  )
    .toFixed(1)
    .padStart(6)} ms${goal === undefined ? "" : `  (goal p95 < ${goal} ms)`}`;
console.log(
  `build sheet, ${samples.length} keystrokes, ${GAP_MS}–${Math.round(GAP_MS + FRAME_MS)} ms apart (${BASE})`,
);
console.log(line("keystroke → key figures updated", dom, 16));
console.log(line("keystroke → key figures on screen", onScreen));
console.log(
  `  missed their frame (painted a frame or more after the one that followed their work): ${late} of ${done.length}`,
);
console.log(line("keystroke → charts settled", charts, 100));
console.log(
  `main-thread CPU per keystroke: task ${perKey("TaskDuration").toFixed(1)} ms, of which script ${perKey("ScriptDuration").toFixed(1)} ms, layout ${perKey("LayoutDuration").toFixed(1)} ms, style ${perKey("RecalcStyleDuration").toFixed(1)} ms`,
);
if (missed) console.log(`${missed} keystroke(s) changed no key figure`);
