"use client";

import { memo } from "react";

import { Signal } from "@/components/ui/status";
import type { FuelSystemResult, UnitSystem } from "@/lib/calc";
import {
  CEILING_SEVERITY_LABELS,
  DUTY_BAND_LABELS,
  LIMITED_BY_LABELS,
} from "@/lib/calc/code-labels";
import { AN_SIZES } from "@/lib/calc/lines";
import { formatTraceStep, formatWarning, SEVERITY_LABELS } from "@/lib/calc/messages";
import { formatNumber, formatValue, ownDecimals, unitOf } from "@/lib/calc/quantities";
import { formatResult, resultField } from "@/lib/calc/registry";

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

/** The number and the unit of a result figure apart, in the person's units (registry). */
function split(path: string, value: number, units: UnitSystem, decimals?: number) {
  const f = resultField(path);
  const q = f?.quantity ?? "ratio";
  return {
    value: formatNumber(q, value, units, decimals ?? ownDecimals(q, units, f?.decimals)),
    unit: unitOf(q, units),
  };
}

/** The working steps, folded away; re-rendered only when the result they list changes. */
const Working = memo(function Working({
  result,
  units,
}: {
  result: FuelSystemResult;
  units: UnitSystem;
}) {
  return (
    <details className="rounded-lg border border-ink-200 bg-white p-5">
      <summary className="cursor-pointer font-semibold">How these numbers were worked out</summary>
      <ol className="mt-3 space-y-3 text-sm" data-testid="working">
        {result.trace.map((raw) => {
          const s = formatTraceStep(raw, units);
          return (
            <li key={s.id}>
              <p className="font-medium">
                {s.label} = <span className="figure">{s.value}</span>
              </p>
              <p className="text-ink-600">
                {s.formula}: {s.inputs.join(", ")}
              </p>
            </li>
          );
        })}
      </ol>
    </details>
  );
});

export function ResultsPanel({
  result,
  error,
  units = "metric",
  workingFrom,
}: {
  result: FuelSystemResult | null;
  error?: string;
  units?: UnitSystem;
  /**
   * The result whose working steps to list (folded away under "How these numbers were worked
   * out"): the editor passes one caught up after the paint, so a keystroke does not format every
   * step again.
   * Left out: `result`'s.
   */
  workingFrom?: FuelSystemResult | null;
}) {
  if (!result) {
    return (
      <div className="rounded-lg border border-dashed border-ink-300 bg-white p-6 text-ink-700">
        <p className="font-semibold">No figures yet</p>
        <p className="mt-1 text-sm">{error ?? "Fix the highlighted fields to see the sizing."}</p>
      </div>
    );
  }
  return (
    // Not a live region: the editor's FiguresAnnouncer says what changed, not the whole panel.
    <div className="space-y-4">
      <Figures result={result} units={units} />
      <Working
        result={workingFrom === undefined ? result : (workingFrom ?? result)}
        units={units}
      />
    </div>
  );
}

/**
 * The figures of a result: re-rendered only when the result or the units change (the editor's
 * render after the paint, which brings the working steps up to date, leaves them as they are).
 */
const Figures = memo(function Figures({
  result: r,
  units,
}: {
  result: FuelSystemResult;
  units: UnitSystem;
}) {
  const band = { ok: "ok", caution: "caution", danger: "danger", static: "danger" } as const;
  const fig = (
    label: string,
    path: string,
    value: number,
    testId?: string,
    decimals?: number,
    unitNote = "",
  ) => {
    const s = split(path, value, units, decimals);
    return (
      <Figure
        key={path}
        label={label}
        value={s.value}
        unit={`${s.unit}${unitNote}`}
        testId={testId}
      />
    );
  };
  const redline = r.injector.pulseWidthRedline;
  const idle = r.injector.pulseWidthIdle;
  const beyondLargest = `larger than ${formatValue("anDash", AN_SIZES[AN_SIZES.length - 1]!.dash, units)}`;
  const ceiling = split("powerCeiling.kw", r.powerCeiling.kw, units);
  const headroom = r.powerCeiling.headroomPct;
  return (
    <>
      <section className="rounded-lg border border-ink-200 bg-white p-5">
        <h2 className="text-lg font-semibold">Injectors</h2>
        <dl className="mt-3 grid grid-cols-2 gap-4 sm:grid-cols-3">
          {fig(
            `Duty at ${formatValue("ethanol", r.blend.rich.ethanolVolPct, units)}`,
            "blend.rich.dutyPct",
            r.blend.rich.dutyPct,
            "duty-rich",
          )}
          {fig(
            `Duty at ${formatValue("ethanol", r.blend.lean.ethanolVolPct, units)}`,
            "blend.lean.dutyPct",
            r.blend.lean.dutyPct,
          )}
          {fig(
            "Smallest rating",
            "injector.requiredRatedFlowCcPerMin",
            r.injector.requiredRatedFlowCcPerMin,
            "smallest-rating",
          )}
          {redline.commandedMs === null
            ? fig(
                "Pulse at redline",
                "injector.pulseWidthRedline.effectiveMs",
                redline.effectiveMs,
                undefined,
                undefined,
                " open",
              )
            : fig(
                "Pulse at redline",
                "injector.pulseWidthRedline.commandedMs",
                redline.commandedMs,
              )}
          {idle.commandedMs === null
            ? fig(
                "Pulse at idle",
                "injector.pulseWidthIdle.effectiveMs",
                idle.effectiveMs,
                "pulse-idle",
                undefined,
                " open",
              )
            : fig(
                "Pulse at idle",
                "injector.pulseWidthIdle.commandedMs",
                idle.commandedMs,
                "pulse-idle",
              )}
          {fig(
            "ΔP at full boost",
            "injector.differentialPressureKpa",
            r.injector.differentialPressureKpa,
          )}
        </dl>
        <p className="mt-3 text-sm text-ink-700" data-testid="pulse-note">
          {redline.commandedMs === null || redline.deadTimeMs === null
            ? "Pulses are opening times: no dead-time table, so the commanded pulses are a little longer."
            : `Commanded pulses = opening + dead time at ${formatValue("voltage", r.injector.voltage, units)} at the injectors: redline ${formatResult("injector.pulseWidthRedline.effectiveMs", redline.effectiveMs, units)} + ${formatResult("injector.pulseWidthRedline.deadTimeMs", redline.deadTimeMs, units)}; idle ${formatResult("injector.pulseWidthIdle.effectiveMs", idle.effectiveMs, units)} + ${formatResult("injector.pulseWidthIdle.deadTimeMs", idle.deadTimeMs ?? 0, units)}.`}
        </p>
        <div className="mt-3">
          <Signal level={band[r.injector.dutyBand]}>{DUTY_BAND_LABELS[r.injector.dutyBand]}</Signal>
        </div>
      </section>
      <section className="rounded-lg border border-ink-200 bg-white p-5">
        <h2 className="text-lg font-semibold">Pump and lines</h2>
        <dl className="mt-3 grid grid-cols-2 gap-4 sm:grid-cols-3">
          {fig("Demand", "pump.demandLPerH", r.pump.demandLPerH)}
          {fig("Supply", "pump.supplyLPerH", r.pump.supplyLPerH)}
          {fig("Margin", "pump.marginPct", r.pump.marginPct, "pump-margin")}
          {fig("Rail pressure", "pump.railPressureKpa", r.pump.railPressureKpa)}
          <Figure
            label="Feed line"
            value={
              r.lines.recommendedFeedDash
                ? formatResult("lines.recommendedFeedDash", r.lines.recommendedFeedDash, units)
                : beyondLargest
            }
            unit=""
          />
          <Figure
            label="Return line"
            value={
              r.lines.recommendedReturnDash
                ? formatResult("lines.recommendedReturnDash", r.lines.recommendedReturnDash, units)
                : beyondLargest
            }
            unit=""
          />
        </dl>
      </section>
      <section className="rounded-lg border border-ink-200 bg-white p-5">
        <h2 className="text-lg font-semibold">Power ceiling</h2>
        <p className="figure mt-2 text-3xl font-bold" data-testid="ceiling">
          {ceiling.value} <span className="text-base font-normal">{ceiling.unit} crank</span>
        </p>
        <p className="text-sm text-ink-700">
          Limited by {LIMITED_BY_LABELS[r.powerCeiling.limitedBy]};{" "}
          {headroom >= 0
            ? `${formatValue("percent", headroom, units, 0)} above`
            : `▲ ${formatValue("percent", -headroom, units, 0)} below`}{" "}
          the {formatResult("crankPowerKw", r.crankPowerKw, units)} crank target.
        </p>
        {r.powerCeiling.severity ? (
          <div className="mt-2" data-testid="ceiling-severity">
            <Signal level={r.powerCeiling.severity}>
              {CEILING_SEVERITY_LABELS[r.powerCeiling.severity]}
            </Signal>
          </div>
        ) : null}
      </section>
      <section aria-labelledby="warn" className="rounded-lg border border-ink-200 bg-white p-5">
        <h2 id="warn" className="text-lg font-semibold">
          Warnings
        </h2>
        {r.warnings.length === 0 ? <p className="mt-2 text-sm text-ok-700">✓ None.</p> : null}
        <ul className="mt-2 space-y-3" data-testid="warnings">
          {r.warnings.map((raw) => {
            const w = formatWarning(raw, units);
            return (
              <li key={w.code} className="text-sm">
                <Signal level={w.severity}>{SEVERITY_LABELS[w.severity]}</Signal>{" "}
                <span>{w.message}</span>
                {w.fix ? <p className="mt-1 pl-1 text-ink-600">→ {w.fix}</p> : null}
              </li>
            );
          })}
        </ul>
      </section>
    </>
  );
});
