"use client";

import { startTransition, useActionState, useState } from "react";

import { Button } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import { L_PER_CU_IN } from "@/lib/calc/constants";
import { ASPIRATION_LABELS, MEASURED_AT_LABELS } from "@/lib/calc/registry";
import type { UnitSystem } from "@/lib/calc/units";
import { FUEL_CHOICE_LABELS, FUEL_CHOICES } from "@/lib/domain/builds";
import { engineFromText } from "@/lib/domain/engine-text";

import { createDraftBuildAction } from "./actions";

export interface DraftCustomer {
  id: string;
  name: string;
  /** `engine`: the vehicle's engine as the caller named it, read for the engine fields. */
  vehicles: { id: string; label: string; engine?: string | null }[];
}

/**
 * The counter's form for a caller: their vehicle (picked or added), the engine, the power goal
 * and the fuel. The build goes to the tuners' sizing queue; the sizing fields are theirs.
 */
export function DraftBuildForm({
  customers,
  customerId,
  units,
  powerUnit,
  displacementUnit,
}: {
  customers: DraftCustomer[];
  customerId?: string;
  units: UnitSystem;
  powerUnit: string;
  /** "L" or "cu in": the displacement is typed in the person's units, like the power. */
  displacementUnit: string;
}) {
  const [state, action, pending] = useActionState(createDraftBuildAction, initialActionState);
  const v = state.values ?? {};
  const e = state.fieldErrors ?? {};
  const [customer, setCustomer] = useState(v.customerId ?? customerId ?? "");
  const vehicles = customers.find((c) => c.id === customer)?.vehicles ?? [];
  const [vehicle, setVehicle] = useState<string | null>(v.vehicleId ?? null);
  // A customer without vehicles starts with the new vehicle's fields open.
  const chosen = vehicle ?? (vehicles[0]?.id || "new");
  // The engine fields start from what the vehicle's engine text says (editable).
  const [newEngine, setNewEngine] = useState<string>(v["vehicle.engine"] ?? "");
  const engineText =
    chosen === "new" ? newEngine : (vehicles.find((x) => x.id === chosen)?.engine ?? "");
  const guess = engineFromText(engineText);
  const guessKey = `${chosen}:${JSON.stringify(guess)}`;
  const guessed = Object.keys(guess).length > 0;
  // The guess is in litres; the field is in the person's units (whole cubic inches).
  const guessedDisplacement =
    guess.displacementL === undefined
      ? undefined
      : units === "imperial"
        ? String(Math.round(guess.displacementL / L_PER_CU_IN))
        : String(guess.displacementL);
  return (
    <form
      // Sent by hand, not as the form's `action`: React resets a form after its action, and the
      // selects would lose what was chosen when the server refuses a field.
      onSubmit={(ev) => {
        ev.preventDefault();
        const data = new FormData(ev.currentTarget);
        startTransition(() => action(data));
      }}
      noValidate
      className="space-y-5"
      aria-label="New build from a goal"
    >
      <input type="hidden" name="units" value={units} />
      <SelectField
        label="Customer"
        name="customerId"
        value={customer}
        onChange={(ev) => {
          setCustomer(ev.target.value);
          setVehicle(null);
        }}
        error={e.customerId}
      >
        <option value="">Choose…</option>
        {customers.map((c) => (
          <option key={c.id} value={c.id}>
            {c.name}
          </option>
        ))}
      </SelectField>
      <fieldset className="space-y-3 rounded-lg border border-ink-200 p-4">
        <legend className="px-1 font-semibold">Vehicle</legend>
        <SelectField
          label="Vehicle"
          name="vehicleId"
          value={chosen}
          onChange={(ev) => setVehicle(ev.target.value)}
          error={e.vehicleId}
        >
          {vehicles.map((x) => (
            <option key={x.id} value={x.id}>
              {x.label}
            </option>
          ))}
          <option value="new">Add a new vehicle…</option>
        </SelectField>
        {chosen === "new" ? (
          <div className="grid gap-3 sm:grid-cols-3">
            <Field
              label="Year"
              name="vehicle.year"
              inputMode="numeric"
              autoComplete="off"
              defaultValue={v["vehicle.year"]}
              error={e["vehicle.year"]}
            />
            <Field
              label="Make"
              name="vehicle.make"
              autoComplete="off"
              defaultValue={v["vehicle.make"]}
              error={e["vehicle.make"]}
            />
            <Field
              label="Model"
              name="vehicle.model"
              autoComplete="off"
              defaultValue={v["vehicle.model"]}
              error={e["vehicle.model"]}
            />
            <div className="sm:col-span-2">
              <Field
                label="Engine (as the caller names it)"
                name="vehicle.engine"
                autoComplete="off"
                defaultValue={v["vehicle.engine"]}
                onChange={(ev) => setNewEngine(ev.target.value)}
                error={e["vehicle.engine"]}
              />
            </div>
            <Field
              label="VIN (optional)"
              name="vehicle.vin"
              autoComplete="off"
              defaultValue={v["vehicle.vin"]}
              error={e["vehicle.vin"]}
            />
          </div>
        ) : null}
      </fieldset>
      <fieldset className="grid gap-3 rounded-lg border border-ink-200 p-4 sm:grid-cols-3">
        <legend className="px-1 font-semibold">Engine</legend>
        {guessed ? (
          <p className="text-sm text-ink-700 sm:col-span-3" data-testid="engine-prefill">
            Filled in from the engine “{engineText}”: check them with the caller.
          </p>
        ) : null}
        <Field
          key={`d-${guessKey}`}
          label={`Displacement (${displacementUnit})`}
          name="displacement"
          inputMode="decimal"
          autoComplete="off"
          defaultValue={v.displacement ?? guessedDisplacement}
          error={e.displacement}
        />
        <Field
          key={`c-${guessKey}`}
          label="Cylinders"
          name="cylinders"
          inputMode="numeric"
          autoComplete="off"
          defaultValue={v.cylinders ?? guess.cylinders?.toString()}
          error={e.cylinders}
        />
        <SelectField
          key={`a-${guessKey}`}
          label="Aspiration"
          name="aspiration"
          defaultValue={v.aspiration ?? guess.aspiration ?? ""}
          error={e.aspiration}
        >
          <option value="">Choose…</option>
          {Object.entries(ASPIRATION_LABELS).map(([k, label]) => (
            <option key={k} value={k}>
              {label}
            </option>
          ))}
        </SelectField>
      </fieldset>
      <fieldset className="grid gap-3 rounded-lg border border-ink-200 p-4 sm:grid-cols-3">
        <legend className="px-1 font-semibold">Goal and fuel</legend>
        <Field
          label={`Power goal (${powerUnit})`}
          name="power"
          inputMode="decimal"
          autoComplete="off"
          defaultValue={v.power}
          error={e.power}
        />
        <SelectField
          label="Measured"
          name="measuredAt"
          defaultValue={v.measuredAt ?? "wheel"}
          error={e.measuredAt}
        >
          {Object.entries(MEASURED_AT_LABELS).map(([k, label]) => (
            <option key={k} value={k}>
              {label}
            </option>
          ))}
        </SelectField>
        <SelectField label="Fuel" name="fuel" defaultValue={v.fuel ?? ""} error={e.fuel}>
          <option value="">Choose…</option>
          {FUEL_CHOICES.map((f) => (
            <option key={f} value={f}>
              {FUEL_CHOICE_LABELS[f]}
            </option>
          ))}
        </SelectField>
      </fieldset>
      <Field
        label="Title (optional)"
        name="title"
        placeholder="Made from the vehicle and the goal"
        defaultValue={v.title}
        error={e.title}
      />
      <p className="text-sm text-ink-600">
        The build opens as <strong>Needs sizing</strong> in the tuners&apos; queue. Injectors, pump,
        regulator, lines and wiring are the tuner&apos;s to choose.
      </p>
      <FormStatus ok={state.ok} message={state.message} />
      <Button type="submit" disabled={pending}>
        {pending ? "Starting…" : "Start the build"}
      </Button>
    </form>
  );
}
