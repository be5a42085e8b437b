"use client";

import { useActionState, useEffect, useRef } from "react";

import { Button } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import type { UnitSystem } from "@/lib/calc";
import { GASOLINE } from "@/lib/calc/constants";
import { ETHANOL } from "@/lib/calc/fuel";
import { formatNumber, unitOf } from "@/lib/calc/quantities";
import { PAPER_SIZE_LABELS, PAPER_SIZES } from "@/lib/domain/documents";
import { SETTING_LABELS, SETTING_SECTIONS, type SettingName } from "@/lib/domain/shop-settings";
import { TIME_ZONES } from "@/lib/domain/time-zones";

import { updateSettingsAction } from "./actions";

export function SettingsForm({
  initial,
  readOnly,
  countries,
  units,
}: {
  initial: Record<string, string>;
  readOnly: boolean;
  countries: { code: string; name: string }[];
  /** The viewer's units: BSFC, line drop and densities are shown and typed in them. */
  units: UnitSystem;
}) {
  const [state, action, pending] = useActionState(updateSettingsAction, initialActionState);
  const formRef = useRef<HTMLFormElement>(null);
  // A refused save goes to the first highlighted field, once its message is drawn.
  useEffect(() => {
    if (state.ok || !state.fieldErrors || Object.keys(state.fieldErrors).length === 0) return;
    formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus();
  }, [state]);
  const v = { ...initial, ...state.values };
  const e = state.fieldErrors ?? {};
  /** A number field, labelled from the settings' labels (lib/domain/shop-settings.ts). */
  const num = (name: SettingName, unit: string) => (
    <Field
      key={name}
      label={`${SETTING_LABELS[name].label} (${unit})`}
      name={name}
      inputMode="decimal"
      defaultValue={v[name]}
      error={e[name]}
    />
  );
  /** A fuel property the library knows: its value (in the viewer's units) as the hint. */
  const lib = (name: SettingName, unit: string, library: string) => (
    <Field
      key={name}
      label={`${SETTING_LABELS[name].label} (${unit})`}
      name={name}
      inputMode="decimal"
      defaultValue={v[name]}
      error={e[name]}
      placeholder={library}
      hint={`Library: ${library}`}
    />
  );
  const bsfc = unitOf("bsfc", units);
  const density = unitOf("density", units);
  const libDensity = (kgPerL: number) => formatNumber("density", kgPerL, units);
  return (
    <form ref={formRef} action={action} noValidate className="mt-4" aria-label="Shop defaults">
      {/* The units the figures below are typed in (the page's, not the "Units" being chosen). */}
      <input type="hidden" name="shownUnits" value={units} />
      {/* The duty levels as loaded: a refusal of their order marks the one the person changed. */}
      <input type="hidden" name="loadedDutyCautionPct" value={initial.dutyCautionPct ?? ""} />
      <input type="hidden" name="loadedDutyDangerPct" value={initial.dutyDangerPct ?? ""} />
      <fieldset disabled={readOnly} className="space-y-6">
        <div className="grid gap-4 sm:grid-cols-2">
          <Field
            label={SETTING_LABELS.shopName.label}
            name="shopName"
            defaultValue={v.shopName}
            error={e.shopName}
          />
          <Field
            label={SETTING_LABELS.phone.label}
            name="phone"
            defaultValue={v.phone}
            error={e.phone}
          />
          <Field
            label={SETTING_LABELS.address.label}
            name="address"
            defaultValue={v.address}
            error={e.address}
          />
          <SelectField
            label={SETTING_LABELS.country.label}
            name="country"
            defaultValue={v.country}
            error={e.country}
            hint="Customers' phone numbers without + are read as from here."
          >
            {countries.map((c) => (
              <option key={c.code} value={c.code}>
                {c.name}
              </option>
            ))}
          </SelectField>
          <Field
            label={SETTING_LABELS.currency.label}
            name="currency"
            defaultValue={v.currency}
            error={e.currency}
            hint="Three letters, e.g. USD or EUR."
          />
          {num("taxRatePct", "%")}
          <SelectField
            label={SETTING_LABELS.units.label}
            name="units"
            defaultValue={v.units}
            error={e.units}
          >
            <option value="imperial">Imperial (hp, psi, lb/h, gal)</option>
            <option value="metric">Metric (kW, kPa, cc/min, L)</option>
          </SelectField>
          <SelectField
            label={SETTING_LABELS.paperSize.label}
            name="paperSize"
            defaultValue={v.paperSize}
            error={e.paperSize}
          >
            {PAPER_SIZES.map((p) => (
              <option key={p} value={p}>
                {PAPER_SIZE_LABELS[p]}
              </option>
            ))}
          </SelectField>
          <Field
            label={SETTING_LABELS.timeZone.label}
            name="timeZone"
            defaultValue={v.timeZone}
            error={e.timeZone}
            hint="For dates on quotes, spec sheets and e-mails: a place's zone from the list, e.g. America/Chicago or Europe/Berlin, or UTC."
            list="time-zones"
            autoComplete="off"
          />
          <datalist id="time-zones">
            {TIME_ZONES.map((z) => (
              <option key={z} value={z} />
            ))}
          </datalist>
        </div>
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 font-semibold">{SETTING_SECTIONS.bsfc}</legend>
          {num("bsfcGasolineNa", bsfc)}
          {num("bsfcGasolineBoosted", bsfc)}
          {num("bsfcE85Na", bsfc)}
          {num("bsfcE85Boosted", bsfc)}
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-3">
          <legend className="mb-2 font-semibold">{SETTING_SECTIONS.duty}</legend>
          {num("designDutyPct", "%")}
          {num("dutyCautionPct", "%")}
          {num("dutyDangerPct", "%")}
          {num("minPumpMarginPct", "%")}
          {num("maxLineDropKpa", unitOf("pressureDrop", units))}
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-3">
          <legend className="mb-2 font-semibold">{SETTING_SECTIONS.loss}</legend>
          {num("lossManualPct", "%")}
          {num("lossAutomaticPct", "%")}
          {num("lossAwdPct", "%")}
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 font-semibold">{SETTING_SECTIONS.fuel}</legend>
          <p className="text-sm text-ink-600 sm:col-span-2">
            Blank: the calculation library&apos;s value. A build may state its own.
          </p>
          {lib("gasolineDensityKgPerL", density, libDensity(GASOLINE.densityKgPerL))}
          {lib("gasolineStoichAfr", "AFR", GASOLINE.stoichAfr.toFixed(2))}
          {lib("ethanolDensityKgPerL", density, libDensity(ETHANOL.densityKgPerL))}
          {lib("ethanolStoichAfr", "AFR", ETHANOL.stoichAfr.toFixed(2))}
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-3">
          <legend className="mb-2 font-semibold">{SETTING_SECTIONS.quotes}</legend>
          {num("labourRate", `${v.currency || "money"} per hour`)}
          {num("depositPct", "%")}
          {num("quoteValidDays", "days")}
        </fieldset>
        {!readOnly ? (
          <div className="flex items-center gap-4">
            <Button type="submit" disabled={pending}>
              {pending ? "Saving…" : "Save settings"}
            </Button>
            <FormStatus ok={state.ok} message={state.message} />
          </div>
        ) : null}
      </fieldset>
    </form>
  );
}
