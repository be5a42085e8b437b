"use client";

import { useState } from "react";

import { SelectField } from "@/components/ui/field";
import { Signal } from "@/components/ui/status";
import { DRIVE_TYPES } from "@/lib/calc/input-codes";
import { converter, formatValue, fromShown, shownText, type Quantity } from "@/lib/calc/quantities";
import { DRIVE_TYPE_LABELS } from "@/lib/calc/registry";
import type { UnitSystem } from "@/lib/calc/units";
import type { DriveType, SizingSettings } from "@/lib/sizing/fill-inputs";
import { quickInjectorCheck } from "@/lib/sizing/quick-check";

import { NumInput, toNum } from "./num-input";

/** Each field's quantity and canonical bounds (the sizing schema's, lib/calc/schema.ts). */
const FIELDS = {
  power: { q: "power", min: 1, max: 5000, what: "Wheel power", blank: "Enter the wheel power" },
  loss: { q: "percent", min: 0, max: 50, what: "Drivetrain loss", blank: "" },
  ethanol: { q: "percent", min: 0, max: 100, what: "Ethanol", blank: "Enter the ethanol content" },
  count: { q: "count", min: 1, max: 32, what: "Injectors", blank: "Enter the injector count" },
  flow: { q: "injectorFlow", min: 20, max: 10000, what: "Flow", blank: "Enter the injector flow" },
  rated: {
    q: "pressure",
    min: 100,
    max: 1000,
    what: "Rated pressure",
    blank: "Enter the pressure the flow is rated at",
  },
  base: {
    q: "pressure",
    min: 50,
    max: 1000,
    what: "Base pressure",
    blank: "Enter the base pressure",
  },
} satisfies Record<string, { q: Quantity; min: number; max: number; what: string; blank: string }>;
type Key = keyof typeof FIELDS;

/** The starting figures, canonical: 373 kW ≈ 500 hp at the wheels, E83, six 1000 cc/min at 3 bar. */
const START: Record<Exclude<Key, "loss">, number> = {
  power: 372.85,
  ethanol: 83,
  count: 6,
  flow: 1000,
  rated: 300,
  base: 300,
};

export function InjectorCheck({
  settings,
  units,
}: {
  settings: SizingSettings;
  units: UnitSystem;
}) {
  const [driveType, setDriveType] = useState<DriveType>("manual");
  const [f, setF] = useState<Record<Key, string>>(() => ({
    loss: "",
    ...(Object.fromEntries(
      Object.entries(START).map(([k, v]) => [k, shownText(FIELDS[k as Key].q, v, units)]),
    ) as Record<Exclude<Key, "loss">, string>),
  }));
  const set = (k: Key) => (v: string) => setF((s) => ({ ...s, [k]: v }));
  const unit = (k: Key) => {
    const q = FIELDS[k].q;
    return q === "count" ? "count" : converter(q, units).unit;
  };
  const range = (k: Key) =>
    `${FIELDS[k].what} must be between ${formatValue(FIELDS[k].q, FIELDS[k].min, units)} and ${formatValue(FIELDS[k].q, FIELDS[k].max, units)}`;

  const errors: Partial<Record<Key, string>> = {};
  const canonical: Partial<Record<Key, number>> = {};
  for (const k of Object.keys(FIELDS) as Key[]) {
    const typed = toNum(f[k]);
    if (typed === undefined) {
      if (k === "loss" && f.loss.trim() === "") continue; // blank: the shop's setting
      errors[k] = f[k].trim() === "" ? FIELDS[k].blank : `${FIELDS[k].what} must be a number`;
      continue;
    }
    const start = k === "loss" ? undefined : START[k];
    const v = fromShown(FIELDS[k].q, typed, units, start);
    if (k === "count" && !Number.isInteger(v))
      errors[k] = `${FIELDS[k].what} must be a whole number`;
    else if (v < FIELDS[k].min || v > FIELDS[k].max) errors[k] = range(k);
    else canonical[k] = v;
  }
  const c = canonical;
  const ok = Object.keys(errors).length === 0;
  const out =
    ok && c.power && c.ethanol !== undefined && c.count && c.flow && c.rated && c.base
      ? quickInjectorCheck(settings, {
          wheelPowerKw: c.power,
          driveType,
          drivetrainLossPct: c.loss,
          ethanolVolPct: c.ethanol,
          injectorCount: c.count,
          ratedFlowCcPerMin: c.flow,
          ratedPressureKpa: c.rated,
          basePressureKpa: c.base,
        })
      : null;
  const shopLoss = settings.drivetrainLossPct[driveType];
  const pct = (x: number) => formatValue("percent", x, units, 0);
  const word = { ok: "Fine", caution: "Little headroom", danger: "Too small" };
  return (
    <section aria-labelledby="quick" className="rounded-lg border border-ink-200 bg-white p-5">
      <h2 id="quick" className="text-xl font-semibold">
        Quick injector check
      </h2>
      <p className="text-sm text-ink-600" data-testid="quick-basis">
        Boosted engine, boost-referenced regulator; the shop&apos;s{" "}
        {pct(settings.limits.designDutyPct)} design duty, drivetrain loss by drive type and BSFC
        rules of thumb.
      </p>
      <div className="mt-4 grid gap-4 sm:grid-cols-2">
        <NumInput
          id="qc-p"
          label="Wheel power"
          unit={unit("power")}
          value={f.power}
          onChange={set("power")}
          error={errors.power}
        />
        <SelectField
          label="Drive type"
          name="driveType"
          value={driveType}
          onChange={(e) => setDriveType(e.target.value as DriveType)}
        >
          {DRIVE_TYPES.map((d) => (
            <option key={d} value={d}>
              {DRIVE_TYPE_LABELS[d]}
            </option>
          ))}
        </SelectField>
        <div>
          <NumInput
            id="qc-l"
            label="Drivetrain loss"
            unit="%"
            value={f.loss}
            placeholder={String(shopLoss)}
            onChange={set("loss")}
            error={errors.loss}
          />
          <p className="mt-1 text-xs text-ink-600" data-testid="quick-loss-hint">
            Blank: the shop&apos;s {pct(shopLoss)} for {DRIVE_TYPE_LABELS[driveType].toLowerCase()}.
          </p>
        </div>
        <NumInput
          id="qc-e"
          label="Ethanol content (richest)"
          unit="%"
          value={f.ethanol}
          onChange={set("ethanol")}
          error={errors.ethanol}
        />
        <NumInput
          id="qc-n"
          label="Injectors"
          unit={unit("count")}
          value={f.count}
          onChange={set("count")}
          error={errors.count}
        />
        <NumInput
          id="qc-q"
          label="Injector rated flow"
          unit={unit("flow")}
          value={f.flow}
          onChange={set("flow")}
          error={errors.flow}
        />
        <NumInput
          id="qc-r"
          label="Flow rated at"
          unit={unit("rated")}
          value={f.rated}
          onChange={set("rated")}
          error={errors.rated}
        />
        <NumInput
          id="qc-b"
          label="Base fuel pressure"
          unit={unit("base")}
          value={f.base}
          onChange={set("base")}
          error={errors.base}
        />
      </div>
      <dl
        aria-live="polite"
        className="mt-4 grid grid-cols-1 gap-4 rounded-md bg-ink-50 p-4 sm:grid-cols-3"
      >
        <div>
          <dt className="text-xs text-ink-600">Duty at target</dt>
          <dd className="figure text-2xl font-bold" data-testid="quick-duty">
            {out ? formatValue("percent", out.dutyPct, units) : "—"}
          </dd>
          {out ? (
            <dd>
              <Signal level={out.level}>{word[out.level]}</Signal>
            </dd>
          ) : null}
        </div>
        <div>
          <dt className="text-xs text-ink-600">
            Smallest rating at {out ? pct(out.designDutyPct) : "design"} duty
          </dt>
          <dd className="figure text-2xl font-bold" data-testid="quick-need">
            {out ? formatValue("injectorFlow", out.smallestRatingCcPerMin, units) : "—"}
          </dd>
        </div>
        <div>
          <dt className="text-xs text-ink-600">Ceiling (wheel)</dt>
          <dd className="figure text-2xl font-bold" data-testid="quick-ceiling">
            {out ? formatValue("power", out.ceilingWheelKw, units) : "—"}
          </dd>
        </div>
      </dl>
      {out ? (
        <p className="mt-2 text-xs text-ink-600" data-testid="quick-used">
          Drivetrain loss {pct(out.drivetrainLossPct)}, BSFC{" "}
          {formatValue("bsfc", out.bsfcGPerKwh, units)}, design duty {pct(out.designDutyPct)}.
        </p>
      ) : null}
    </section>
  );
}
