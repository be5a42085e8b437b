"use client";

import { Signal } from "@/components/ui/status";
import {
  converter,
  toShown,
  type FuelSystemResult,
  type Quantity,
  type UnitSystem,
} from "@/lib/calc";

const f = (n: number, d = 0) => (Number.isFinite(n) ? n.toFixed(d) : "—");

function Figure({
  label,
  value,
  unit,
  testId,
}: {
  label: string;
  value: string;
  unit: string;
  testId?: string;
}) {
  return (
    <div>
      <dt className="text-xs text-ink-600">{label}</dt>
      <dd className="figure text-2xl font-bold" data-testid={testId}>
        {value} <span className="text-sm font-normal text-ink-600">{unit}</span>
      </dd>
    </div>
  );
}

export function ResultsPanel({
  result,
  error,
  units = "metric",
}: {
  result: FuelSystemResult | null;
  error?: string;
  units?: UnitSystem;
}) {
  /** A canonical figure in the person's units: [value, unit]. */
  const q = (quantity: Quantity, v: number, d?: number): [string, string] => {
    const c = converter(quantity, units);
    return [
      Number.isFinite(v) ? toShown(quantity, v, units).toFixed(d ?? c.decimals) : "—",
      c.unit,
    ];
  };
  if (!result) {
    return (
      <div
        aria-live="polite"
        className="rounded-lg border border-dashed border-ink-300 bg-white p-6 text-ink-700"
      >
        <p className="font-semibold">No figures yet</p>
        <p className="mt-1 text-sm">{error ?? "Fix the highlighted fields to see the sizing."}</p>
      </div>
    );
  }
  const r = result;
  const band = { ok: "ok", caution: "caution", danger: "danger", static: "danger" } as const;
  return (
    <div aria-live="polite" className="space-y-4">
      <section className="rounded-lg border border-ink-200 bg-white p-5">
        <h2 className="text-lg font-semibold">Injectors</h2>
        <dl className="mt-3 grid grid-cols-2 gap-4 sm:grid-cols-3">
          <Figure
            label={`Duty at E${f(r.blend.rich.ethanolVolPct)}`}
            value={f(r.blend.rich.dutyPct, 1)}
            unit="%"
            testId="duty-rich"
          />
          <Figure
            label={`Duty at E${f(r.blend.lean.ethanolVolPct)}`}
            value={f(r.blend.lean.dutyPct, 1)}
            unit="%"
          />
          <Figure
            label="Smallest rating"
            value={q("injectorFlow", r.injector.requiredRatedFlowCcPerMin)[0]}
            unit={q("injectorFlow", 0)[1]}
          />
          <Figure
            label="Pulse at redline"
            value={f(
              r.injector.pulseWidthRedline.commandedMs ?? r.injector.pulseWidthRedline.effectiveMs,
              2,
            )}
            unit={r.injector.pulseWidthRedline.commandedMs === null ? "ms open" : "ms"}
          />
          <Figure
            label="Pulse at idle"
            value={f(r.injector.pulseWidthIdle.effectiveMs, 2)}
            unit="ms open"
          />
          <Figure
            label="ΔP at full boost"
            value={q("pressure", r.injector.differentialPressureKpa)[0]}
            unit={q("pressure", 0)[1]}
          />
        </dl>
        <div className="mt-3">
          <Signal level={band[r.injector.dutyBand]}>
            {
              {
                ok: "Duty fine",
                caution: "Duty high",
                danger: "Duty too high",
                static: "Injectors static",
              }[r.injector.dutyBand]
            }
          </Signal>
        </div>
      </section>
      <section className="rounded-lg border border-ink-200 bg-white p-5">
        <h2 className="text-lg font-semibold">Pump and lines</h2>
        <dl className="mt-3 grid grid-cols-2 gap-4 sm:grid-cols-3">
          <Figure
            label="Demand"
            value={q("volumeFlow", r.pump.demandLPerH)[0]}
            unit={q("volumeFlow", 0)[1]}
          />
          <Figure
            label="Supply"
            value={q("volumeFlow", r.pump.supplyLPerH)[0]}
            unit={q("volumeFlow", 0)[1]}
          />
          <Figure label="Margin" value={f(r.pump.marginPct)} unit="%" testId="pump-margin" />
          <Figure
            label="Rail pressure"
            value={q("pressure", r.pump.railPressureKpa)[0]}
            unit={q("pressure", 0)[1]}
          />
          <Figure
            label="Feed line"
            value={r.lines.recommendedFeedDash ? `−${r.lines.recommendedFeedDash}` : "> −12"}
            unit="AN"
          />
          <Figure
            label="Return line"
            value={r.lines.recommendedReturnDash ? `−${r.lines.recommendedReturnDash}` : "> −12"}
            unit="AN"
          />
        </dl>
      </section>
      <section className="rounded-lg border border-ink-200 bg-white p-5">
        <h2 className="text-lg font-semibold">Power ceiling</h2>
        <p className="figure mt-2 text-3xl font-bold" data-testid="ceiling">
          {q("power", r.powerCeiling.kw)[0]}{" "}
          <span className="text-base font-normal">{q("power", 0)[1]} crank</span>
        </p>
        <p className="text-sm text-ink-700">
          Limited by the {r.powerCeiling.limitedBy};{" "}
          {r.powerCeiling.headroomPct >= 0
            ? `${f(r.powerCeiling.headroomPct)} % above`
            : `▲ ${f(-r.powerCeiling.headroomPct)} % below`}{" "}
          the {q("power", r.crankPowerKw).join(" ")} crank target.
        </p>
      </section>
      <section aria-labelledby="warn" className="rounded-lg border border-ink-200 bg-white p-5">
        <h2 id="warn" className="text-lg font-semibold">
          Warnings
        </h2>
        {r.warnings.length === 0 ? <p className="mt-2 text-sm text-ok-700">✓ None.</p> : null}
        <ul className="mt-2 space-y-3" data-testid="warnings">
          {r.warnings.map((w) => (
            <li key={w.code} className="text-sm">
              <Signal level={w.severity}>
                {w.severity === "info" ? "Note" : w.severity === "caution" ? "Caution" : "Danger"}
              </Signal>{" "}
              <span>{w.message}</span>
              {w.fix ? <p className="mt-1 pl-1 text-ink-600">→ {w.fix}</p> : null}
            </li>
          ))}
        </ul>
      </section>
      <details className="rounded-lg border border-ink-200 bg-white p-5">
        <summary className="cursor-pointer font-semibold">
          How these numbers were worked out
        </summary>
        <ol className="mt-3 space-y-3 text-sm">
          {r.trace.map((s) => (
            <li key={s.id}>
              <p className="font-medium">
                {s.label} ={" "}
                <span className="figure">
                  {f(s.value, 2)} {s.unit}
                </span>
              </p>
              <p className="text-ink-600">
                {s.formula}:{" "}
                {s.inputs.map((i) => `${i.label} ${f(i.value, 3)} ${i.unit}`).join(", ")}
              </p>
            </li>
          ))}
        </ol>
      </details>
    </div>
  );
}
