"use client";

import { useState, useTransition } from "react";

import { Button, LinkButton } from "@/components/ui/button";
import { FormStatus } from "@/components/ui/status";
import { UnitNumberField } from "@/components/ui/unit-number-field";
import { initialActionState } from "@/lib/actions/state";
import { formatValue } from "@/lib/calc/quantities";
import type { TuneLimitKey, TuneLimits } from "@/lib/calc/tune";
import type { UnitSystem } from "@/lib/calc/units";
import {
  LIMIT_FIELDS,
  limitsFromText,
  limitsText,
  limitsTextChanged,
  limitsTextErrors,
  limitUnit,
  type LimitsText,
} from "@/lib/tune/limits-form";
import { saveTuneLimitsAction } from "@/lib/tune/tune-actions";

export type LimitSource = "build" | "shop" | "library";

const SOURCE_TEXT: Record<LimitSource, string> = {
  build: "this build",
  shop: "shop default",
  library: "Fuelwright default",
};

/** A limit's value as the base (the shop's or the library's) states it, for "shop: 90 %". */
function baseText(key: TuneLimitKey, base: TuneLimits, units: UnitSystem): string {
  if (key === "lambdaTargets")
    return base.lambdaTargets
      .map(
        (r) =>
          `${formatValue("pressure", r.boostKpa, units)} → ${formatValue("lambda", r.lambda, units)}`,
      )
      .join(", ");
  const f = LIMIT_FIELDS.find((x) => x.key === key)!;
  const v = base[key];
  return v === null ? "not checked" : formatValue(f.q, v as number, units);
}

/**
 * Tune limits in the reader's units: the lambda table against boost and the maxima, each saying
 * where it comes from. `scope: "build"` (the session's editor) starts from the shop's defaults
 * and keeps as the build's own only what differs; `scope: "shop"` (Settings, the owner) edits
 * the shop's defaults. A figure left as shown is saved exactly as loaded, and a save with nothing
 * changed sends nothing.
 */
export function TuneLimitsEditor({
  scope,
  buildId,
  units,
  limits,
  sources,
  base,
  baseSource,
  canWrite,
  canSetShopLimits,
  onSaved,
  open,
}: {
  scope: "build" | "shop";
  buildId?: string;
  units: UnitSystem;
  limits: TuneLimits;
  /** Where each field comes from. */
  sources: Record<TuneLimitKey, LimitSource>;
  /** What the build's own fields stand apart from (the shop's defaults, else the library's). */
  base: TuneLimits;
  baseSource: "shop" | "library";
  canWrite: boolean;
  canSetShopLimits: boolean;
  onSaved: () => void;
  /** Shown open (Settings) rather than folded (the session). */
  open?: boolean;
}) {
  const [loaded, setLoaded] = useState(() => ({ limits, text: limitsText(limits, units) }));
  // New limits from the server (after a save, or another tab's): the editor starts from them.
  if (loaded.limits !== limits) setLoaded({ limits, text: limitsText(limits, units) });
  const [form, setForm] = useState<LimitsText>(loaded.text);
  const [formFor, setFormFor] = useState(loaded.text);
  if (formFor !== loaded.text) {
    setFormFor(loaded.text);
    setForm(loaded.text);
  }
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [status, setStatus] = useState<{ ok: boolean; message: string } | null>(null);
  const [pending, start] = useTransition();
  const anyOwn = Object.values(sources).some((s) => s === "build");

  const save = (to: "build" | "shop", reset = false) => {
    if (
      reset &&
      !window.confirm(
        scope === "shop"
          ? "Drop the shop's limits and judge pulls by Fuelwright's defaults?"
          : "Drop this build's own limits and follow the shop's?",
      )
    )
      return;
    if (!reset) {
      const local = limitsTextErrors(form, units);
      setErrors(local);
      if (Object.keys(local).length) {
        setStatus({ ok: false, message: "Some limits are not valid: see the fields marked" });
        return;
      }
      // The same scope and nothing typed: nothing to send (a shop default saved for the build as
      // it is stays the shop's anyway).
      if (!limitsTextChanged(form, loaded.text) && (to === scope || to === "build")) {
        setStatus({ ok: true, message: "Nothing to save" });
        return;
      }
    }
    start(async () => {
      const r = await saveTuneLimitsAction(initialActionState, {
        ...(buildId ? { buildId } : {}),
        scope: to,
        limits: reset ? null : limitsFromText(form, units, loaded.limits),
      });
      setErrors(
        Object.fromEntries(Object.entries(r.fieldErrors ?? {}).map(([k, v]) => [k, v.join(" ")])),
      );
      setStatus({
        ok: r.ok,
        message: r.ok
          ? reset
            ? scope === "shop"
              ? "The shop follows Fuelwright's default limits again"
              : "This build follows the shop's limits again"
            : to === "shop"
              ? "Saved as the shop's default limits"
              : "Saved for this build"
          : (r.message ?? "The limits were not saved"),
      });
      if (r.ok) onSaved();
    });
  };
  const setRow = (i: number, key: "boost" | "lambda", v: string) =>
    setForm((f) => ({ ...f, rows: f.rows.map((x, j) => (j === i ? { ...x, [key]: v } : x)) }));
  const err = (path: string) => errors[`limits.${path}`];
  const sourceNote = (key: TuneLimitKey) => {
    const s = sources[key];
    return (
      <span className="text-xs text-ink-600" data-testid={`limit-source-${key}`}>
        From: {SOURCE_TEXT[s]}
        {s === "build" && scope === "build"
          ? ` (${baseSource === "shop" ? "shop" : "Fuelwright"}: ${baseText(key, base, units)})`
          : ""}
      </span>
    );
  };
  const title =
    scope === "shop"
      ? "Default tune limits"
      : `Limits (${anyOwn ? "this build's own where marked, the rest the " : "the "}${
          baseSource === "shop" ? "shop's defaults" : "Fuelwright defaults"
        })`;
  const body = (
    <>
      <fieldset className="mt-3" disabled={!canWrite || pending}>
        <legend className="text-sm font-medium text-ink-700">
          Lambda target against boost (straight lines between rows)
        </legend>
        <p className="mt-1">{sourceNote("lambdaTargets")}</p>
        <div className="mt-2 space-y-2">
          {form.rows.map((r, i) => (
            <div key={i} className="grid grid-cols-[1fr_1fr_auto] items-end gap-2">
              <UnitNumberField
                id={`${scope}-lt-boost-${i}`}
                label={`Row ${i + 1} boost`}
                unit={limitUnit("pressure", units)}
                value={r.boost}
                error={err(`lambdaTargets.${i}.boostKpa`)}
                onChange={(e) => setRow(i, "boost", e.target.value)}
              />
              <UnitNumberField
                id={`${scope}-lt-lambda-${i}`}
                label={`Row ${i + 1} lambda`}
                unit="λ"
                value={r.lambda}
                error={err(`lambdaTargets.${i}.lambda`)}
                onChange={(e) => setRow(i, "lambda", e.target.value)}
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
                setForm((f) => ({ ...f, rows: [...f.rows, { boost: "", lambda: "" }] }))
              }
            >
              Add a row
            </LinkButton>
          ) : null}
        </div>
        <div className="mt-4 grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
          {LIMIT_FIELDS.map((f) => (
            <div key={f.key}>
              <UnitNumberField
                id={`${scope}-limit-${f.key}`}
                label={f.label}
                unit={limitUnit(f.q, units)}
                value={form.single[f.key] ?? ""}
                error={err(f.key)}
                onChange={(e) =>
                  setForm((x) => ({ ...x, single: { ...x.single, [f.key]: e.target.value } }))
                }
              />
              {sourceNote(f.key)}
            </div>
          ))}
        </div>
        {canWrite ? (
          <div className="mt-4 flex flex-wrap items-center gap-3">
            {scope === "build" ? (
              <Button type="button" onClick={() => save("build")}>
                Save for this build
              </Button>
            ) : (
              <Button type="button" onClick={() => save("shop")}>
                Save the shop&apos;s limits
              </Button>
            )}
            {scope === "build" && anyOwn ? (
              <Button type="button" variant="secondary" onClick={() => save("build", true)}>
                Use the shop&apos;s limits
              </Button>
            ) : null}
            {scope === "shop" && baseSource === "shop" ? (
              <Button type="button" variant="secondary" onClick={() => save("shop", true)}>
                Back to Fuelwright&apos;s defaults
              </Button>
            ) : null}
            {scope === "build" && canSetShopLimits ? (
              <Button type="button" variant="secondary" onClick={() => save("shop")}>
                Save as the shop&apos;s defaults
              </Button>
            ) : null}
          </div>
        ) : null}
      </fieldset>
      <div aria-live="polite" className="mt-2">
        {status ? <FormStatus ok={status.ok} message={status.message} /> : null}
        {errors.form ? <FormStatus ok={false} message={errors.form} /> : null}
      </div>
    </>
  );
  if (open) return <div data-testid={`tune-limits-${scope}`}>{body}</div>;
  return (
    <details
      className="rounded-lg border border-ink-200 bg-white p-4"
      data-testid={`tune-limits-${scope}`}
    >
      <summary className="cursor-pointer font-semibold">{title}</summary>
      {body}
    </details>
  );
}
