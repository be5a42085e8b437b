"use client";

import { useState, useTransition } from "react";

import { Button, LinkButton } from "@/components/ui/button";
import { FormStatus } from "@/components/ui/status";
import { UnitNumberField } from "@/components/ui/unit-number-field";
import { initialActionState } from "@/lib/actions/state";
import {
  converter,
  formatNumber,
  parseNumberText,
  unitOf,
  type Quantity,
  type TuneLimits,
  type UnitSystem,
} from "@/lib/calc";
import { saveTuneLimitsAction } from "@/lib/tune/tune-actions";

type Row = { boost: string; lambda: string };
const SINGLE: { key: Exclude<keyof TuneLimits, "lambdaTargets">; label: string; q: Quantity }[] = [
  { key: "lambdaLeanAllowance", label: "Leaner than the target allowed by", q: "ratio" },
  { key: "maxDutyPct", label: "Maximum injector duty", q: "percent" },
  { key: "maxEgtC", label: "Maximum EGT", q: "temperature" },
  { key: "maxEgtSpreadC", label: "Maximum EGT spread between cylinders", q: "temperatureDiff" },
  {
    key: "maxBackPressureRatio",
    label: "Maximum exhaust-to-boost pressure ratio",
    q: "pressureRatio",
  },
  { key: "maxTurboRpm", label: "Maximum turbo speed (blank: not checked)", q: "turboSpeed" },
  { key: "nearPct", label: "Near: within this much of a maximum", q: "percent" },
];

/**
 * The session's limits, in the reader's units: the lambda table against boost and the maxima.
 * Saved for this build, back to the shop's, or (the owner) as the shop's defaults.
 */
export function TuneLimitsEditor({
  buildId,
  units,
  limits,
  source,
  canWrite,
  canSetShopLimits,
  onSaved,
}: {
  buildId: string;
  units: UnitSystem;
  limits: TuneLimits;
  source: "build" | "shop" | "library";
  canWrite: boolean;
  canSetShopLimits: boolean;
  onSaved: () => void;
}) {
  const show = (q: Quantity, v: number | null) => (v === null ? "" : formatNumber(q, v, units));
  const initial = () => ({
    rows: limits.lambdaTargets.map((r) => ({
      boost: show("pressure", r.boostKpa),
      lambda: show("lambda", r.lambda),
    })),
    single: Object.fromEntries(SINGLE.map((f) => [f.key, show(f.q, limits[f.key])])) as Record<
      string,
      string
    >,
  });
  const [form, setForm] = useState(initial);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [status, setStatus] = useState<{ ok: boolean; message: string } | null>(null);
  const [pending, start] = useTransition();
  const num = (q: Quantity, text: string) => {
    const n = parseNumberText(text);
    return Number.isFinite(n) ? converter(q, units).from(n) : text;
  };
  const save = (scope: "build" | "shop", reset = false) =>
    start(async () => {
      const payload = reset
        ? null
        : {
            lambdaTargets: form.rows.map((r) => ({
              boostKpa: num("pressure", r.boost),
              lambda: num("lambda", r.lambda),
            })),
            ...Object.fromEntries(
              SINGLE.map((f) => [
                f.key,
                f.key === "maxTurboRpm" && !form.single[f.key]!.trim()
                  ? null
                  : num(f.q, form.single[f.key] ?? ""),
              ]),
            ),
          };
      const r = await saveTuneLimitsAction(initialActionState, {
        buildId,
        scope,
        limits: payload,
      });
      setErrors(r.fieldErrors ?? {});
      setStatus({
        ok: r.ok,
        message: r.ok
          ? reset
            ? "This build follows the shop's limits again"
            : scope === "shop"
              ? "Saved as the shop's default limits"
              : "Saved for this build"
          : (r.message ?? "The limits were not saved"),
      });
      if (r.ok) onSaved();
    });
  const err = (path: string) => errors[`limits.${path}`]?.join(" ");
  return (
    <details className="rounded-lg border border-ink-200 bg-white p-4">
      <summary className="cursor-pointer font-semibold">
        Limits (
        {source === "build"
          ? "this build's own"
          : source === "shop"
            ? "the shop's"
            : "Fuelwright's defaults"}
        )
      </summary>
      <fieldset className="mt-3" disabled={!canWrite || pending}>
        <legend className="text-sm font-medium text-ink-700">
          Lambda target against boost (straight lines between rows)
        </legend>
        <div className="mt-2 space-y-2">
          {form.rows.map((r, i) => (
            <div key={i} className="grid grid-cols-[1fr_1fr_auto] items-end gap-2">
              <UnitNumberField
                id={`lt-boost-${i}`}
                label={`Row ${i + 1} boost`}
                unit={unitOf("pressure", units)}
                value={r.boost}
                error={err(`lambdaTargets.${i}.boostKpa`)}
                onChange={(e) =>
                  setForm((f) => ({
                    ...f,
                    rows: f.rows.map((x, j) => (j === i ? { ...x, boost: e.target.value } : x)),
                  }))
                }
              />
              <UnitNumberField
                id={`lt-lambda-${i}`}
                label={`Row ${i + 1} lambda`}
                unit="λ"
                value={r.lambda}
                error={err(`lambdaTargets.${i}.lambda`)}
                onChange={(e) =>
                  setForm((f) => ({
                    ...f,
                    rows: f.rows.map((x, j) => (j === i ? { ...x, lambda: e.target.value } : x)),
                  }))
                }
              />
              <LinkButton
                disabled={form.rows.length <= 1}
                onClick={() => setForm((f) => ({ ...f, rows: f.rows.filter((_, j) => j !== i) }))}
                aria-label={`Remove row ${i + 1}`}
              >
                remove
              </LinkButton>
            </div>
          ))}
          {form.rows.length < 12 ? (
            <LinkButton
              onClick={() =>
                setForm((f) => ({ ...f, rows: [...f.rows, { boost: "", lambda: "" } as Row] }))
              }
            >
              Add a row
            </LinkButton>
          ) : null}
        </div>
        <div className="mt-4 grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {SINGLE.map((f) => (
            <UnitNumberField
              key={f.key}
              id={`limit-${f.key}`}
              label={f.label}
              unit={unitOf(f.q, units) || converter(f.q, units).prefix?.trim() || "ratio"}
              value={form.single[f.key] ?? ""}
              error={err(f.key)}
              onChange={(e) =>
                setForm((x) => ({ ...x, single: { ...x.single, [f.key]: e.target.value } }))
              }
            />
          ))}
        </div>
        {canWrite ? (
          <div className="mt-4 flex flex-wrap items-center gap-3">
            <Button type="button" onClick={() => save("build")}>
              Save for this build
            </Button>
            {source === "build" ? (
              <Button type="button" variant="secondary" onClick={() => save("build", true)}>
                Use the shop&apos;s limits
              </Button>
            ) : null}
            {canSetShopLimits ? (
              <Button type="button" variant="secondary" onClick={() => save("shop")}>
                Save as the shop&apos;s defaults
              </Button>
            ) : null}
          </div>
        ) : null}
      </fieldset>
      <div aria-live="polite" className="mt-2">
        {status ? <FormStatus ok={status.ok} message={status.message} /> : null}
        {errors.form ? <FormStatus ok={false} message={errors.form.join(" ")} /> : null}
      </div>
    </details>
  );
}
