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

import { updateSettingsAction } from "./actions";

/** Suggestions for the time-zone field (any IANA name is taken). */
const TIME_ZONES = [
  "UTC",
  "America/New_York",
  "America/Chicago",
  "America/Denver",
  "America/Phoenix",
  "America/Los_Angeles",
  "America/Anchorage",
  "Pacific/Honolulu",
  "America/Toronto",
  "America/Vancouver",
  "America/Mexico_City",
  "America/Sao_Paulo",
  "Europe/London",
  "Europe/Dublin",
  "Europe/Lisbon",
  "Europe/Paris",
  "Europe/Berlin",
  "Europe/Madrid",
  "Europe/Rome",
  "Europe/Stockholm",
  "Europe/Warsaw",
  "Europe/Helsinki",
  "Africa/Johannesburg",
  "Asia/Dubai",
  "Asia/Kolkata",
  "Asia/Singapore",
  "Asia/Tokyo",
  "Australia/Perth",
  "Australia/Sydney",
  "Pacific/Auckland",
];

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
  const num = (name: string, label: string, unit: string) => (
    <Field
      key={name}
      label={`${label} (${unit})`}
      name={name}
      inputMode="decimal"
      defaultValue={v[name]}
      error={e[name]}
    />
  );
  /** A fuel property the library knows: its value (in the viewer's units) as the hint. */
  const lib = (name: string, label: string, unit: string, library: string) => (
    <Field
      key={name}
      label={`${label} (${unit})`}
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
      <fieldset disabled={readOnly} className="space-y-6">
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Shop name" name="shopName" defaultValue={v.shopName} error={e.shopName} />
          <Field label="Phone" name="phone" defaultValue={v.phone} error={e.phone} />
          <Field label="Address" name="address" defaultValue={v.address} error={e.address} />
          <SelectField
            label="Country"
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
            label="Currency"
            name="currency"
            defaultValue={v.currency}
            error={e.currency}
            hint="Three letters, e.g. USD or EUR."
          />
          {num("taxRatePct", "Tax rate", "%")}
          <SelectField label="Units" name="units" defaultValue={v.units} error={e.units}>
            <option value="imperial">Imperial (hp, psi, lb/h, gal)</option>
            <option value="metric">Metric (kW, kPa, cc/min, L)</option>
          </SelectField>
          <SelectField
            label="Paper for PDFs"
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
            label="Time zone"
            name="timeZone"
            defaultValue={v.timeZone}
            error={e.timeZone}
            hint="For dates on quotes, spec sheets and e-mails, e.g. America/Chicago or Europe/Berlin."
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
          <legend className="mb-2 font-semibold">BSFC rules of thumb</legend>
          {num("bsfcGasolineNa", "Gasoline, NA", bsfc)}
          {num("bsfcGasolineBoosted", "Gasoline, boosted", bsfc)}
          {num("bsfcE85Na", "E85, NA", bsfc)}
          {num("bsfcE85Boosted", "E85, boosted", bsfc)}
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-3">
          <legend className="mb-2 font-semibold">Duty and margins</legend>
          {num("designDutyPct", "Design duty", "%")}
          {num("dutyCautionPct", "Caution above", "%")}
          {num("dutyDangerPct", "Danger above", "%")}
          {num("minPumpMarginPct", "Minimum pump margin", "%")}
          {num("maxLineDropKpa", "Line drop limit", unitOf("pressureDrop", units))}
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-3">
          <legend className="mb-2 font-semibold">Drivetrain loss</legend>
          {num("lossManualPct", "Manual", "%")}
          {num("lossAutomaticPct", "Automatic", "%")}
          {num("lossAwdPct", "AWD", "%")}
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 font-semibold">Fuel properties</legend>
          <p className="text-sm text-ink-600 sm:col-span-2">
            Blank: the calculation library&apos;s value. A build may state its own.
          </p>
          {lib(
            "gasolineDensityKgPerL",
            "Gasoline density",
            density,
            libDensity(GASOLINE.densityKgPerL),
          )}
          {lib(
            "gasolineStoichAfr",
            "Gasoline stoichiometric AFR",
            "AFR",
            GASOLINE.stoichAfr.toFixed(2),
          )}
          {lib(
            "ethanolDensityKgPerL",
            "Ethanol density",
            density,
            libDensity(ETHANOL.densityKgPerL),
          )}
          {lib(
            "ethanolStoichAfr",
            "Ethanol stoichiometric AFR",
            "AFR",
            ETHANOL.stoichAfr.toFixed(2),
          )}
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-3">
          <legend className="mb-2 font-semibold">Quotes</legend>
          {num("labourRate", "Labour rate", `${v.currency || "money"} per hour`)}
          {num("depositPct", "Deposit asked on acceptance", "%")}
          {num("quoteValidDays", "Quotes valid for", "days")}
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
