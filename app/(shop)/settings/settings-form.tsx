"use client";

import { useActionState } from "react";

import { Button } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";

import { updateSettingsAction } from "./actions";

export function SettingsForm({
  initial,
  readOnly,
}: {
  initial: Record<string, string>;
  readOnly: boolean;
}) {
  const [state, action, pending] = useActionState(updateSettingsAction, initialActionState);
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
  return (
    <form action={action} noValidate className="mt-4" aria-label="Shop defaults">
      <fieldset disabled={readOnly} className="space-y-6">
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Shop name" name="shopName" defaultValue={v.shopName} error={e.shopName} />
          <Field label="Phone" name="phone" defaultValue={v.phone} error={e.phone} />
          <Field label="Address" name="address" defaultValue={v.address} error={e.address} />
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
        </div>
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 font-semibold">BSFC rules of thumb</legend>
          {num("bsfcGasolineNa", "Gasoline, NA", "g/kWh")}
          {num("bsfcGasolineBoosted", "Gasoline, boosted", "g/kWh")}
          {num("bsfcE85Na", "E85, NA", "g/kWh")}
          {num("bsfcE85Boosted", "E85, boosted", "g/kWh")}
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-3">
          <legend className="mb-2 font-semibold">Duty and margins</legend>
          {num("designDutyPct", "Design duty", "%")}
          {num("dutyCautionPct", "Caution above", "%")}
          {num("dutyDangerPct", "Danger above", "%")}
          {num("minPumpMarginPct", "Minimum pump margin", "%")}
          {num("maxLineDropKpa", "Line drop limit", "kPa")}
        </fieldset>
        <fieldset className="grid gap-4 sm:grid-cols-3">
          <legend className="mb-2 font-semibold">Drivetrain loss</legend>
          {num("lossManualPct", "Manual", "%")}
          {num("lossAutomaticPct", "Automatic", "%")}
          {num("lossAwdPct", "AWD", "%")}
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
