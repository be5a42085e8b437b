"use client";

import { useActionState, useEffect, useRef, useState } from "react";

import { Button } from "@/components/ui/button";
import { Field, TextAreaField } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState, type ActionState } from "@/lib/actions/state";

import { addVehicleAction, deleteVehicleAction, updateVehicleAction } from "../actions";

export interface VehicleView {
  id: string;
  year: number;
  make: string;
  model: string;
  engine: string | null;
  vin: string | null;
  notes: string | null;
}

const name = (v: Pick<VehicleView, "year" | "make" | "model">) => `${v.year} ${v.make} ${v.model}`;

/** The vehicle's fields, filled from what was typed (after a refusal) or what is stored. */
function VehicleFields({
  prefix,
  state,
  vehicle,
}: {
  prefix: string;
  state: ActionState;
  vehicle?: VehicleView;
}) {
  const e = state.fieldErrors ?? {};
  const value = (k: keyof VehicleView) =>
    state.values?.[k] ??
    (vehicle?.[k] === null || vehicle?.[k] === undefined ? "" : String(vehicle[k]));
  return (
    <>
      <div className="grid gap-3 sm:grid-cols-3">
        <Field
          id={`${prefix}-year`}
          label="Year"
          name="year"
          inputMode="numeric"
          autoComplete="off"
          defaultValue={value("year")}
          error={e.year}
        />
        <Field
          id={`${prefix}-make`}
          label="Make"
          name="make"
          autoComplete="off"
          defaultValue={value("make")}
          error={e.make}
        />
        <Field
          id={`${prefix}-model`}
          label="Model"
          name="model"
          autoComplete="off"
          defaultValue={value("model")}
          error={e.model}
        />
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field
          id={`${prefix}-engine`}
          label="Engine"
          name="engine"
          autoComplete="off"
          placeholder="e.g. 2.0 L turbo four"
          defaultValue={value("engine")}
          error={e.engine}
        />
        <Field
          id={`${prefix}-vin`}
          label="VIN (optional)"
          name="vin"
          autoComplete="off"
          hint="17 characters from 1981 on; checked when given."
          defaultValue={value("vin")}
          error={e.vin}
        />
      </div>
      <TextAreaField
        id={`${prefix}-notes`}
        label="Notes"
        name="notes"
        rows={2}
        defaultValue={value("notes")}
        error={e.notes}
      />
    </>
  );
}

function EditVehicle({ vehicle, onDone }: { vehicle: VehicleView; onDone: () => void }) {
  const [state, action, pending] = useActionState(updateVehicleAction, initialActionState);
  useEffect(() => {
    if (state.ok) onDone();
  }, [state, onDone]);
  return (
    <form action={action} noValidate className="space-y-3" aria-label={`Edit ${name(vehicle)}`}>
      <input type="hidden" name="id" value={vehicle.id} />
      <VehicleFields prefix={`v-${vehicle.id}`} state={state} vehicle={vehicle} />
      <FormStatus ok={state.ok} message={state.message} />
      <div className="flex gap-2">
        <Button type="submit" disabled={pending}>
          {pending ? "Saving…" : "Save vehicle"}
        </Button>
        <Button type="button" variant="ghost" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/** Remove with a confirmation dialog (native <dialog>: focus trap and Escape for free). */
function RemoveVehicle({ vehicle }: { vehicle: VehicleView }) {
  const dialog = useRef<HTMLDialogElement>(null);
  const [state, action, pending] = useActionState(deleteVehicleAction, initialActionState);
  const titleId = `rm-${vehicle.id}`;
  return (
    <>
      <Button variant="ghost" onClick={() => dialog.current?.showModal()}>
        Remove<span className="sr-only"> {name(vehicle)}</span>
      </Button>
      <dialog
        ref={dialog}
        className="m-auto max-w-sm rounded-lg p-6 shadow-xl backdrop:bg-ink-900/50"
        aria-labelledby={titleId}
      >
        <h3 id={titleId} className="text-lg font-semibold">
          Remove the {name(vehicle)}?
        </h3>
        <p className="mt-2 text-sm text-ink-600">
          The vehicle leaves this customer&apos;s record. Builds made for it keep its name.
        </p>
        <form action={action} className="mt-4 flex justify-end gap-2">
          <input type="hidden" name="id" value={vehicle.id} />
          <Button type="button" variant="ghost" onClick={() => dialog.current?.close()}>
            Keep
          </Button>
          <Button type="submit" variant="danger" disabled={pending}>
            Remove
          </Button>
        </form>
        <FormStatus ok={state.ok} message={state.message} />
      </dialog>
    </>
  );
}

function AddVehicle({ customerId }: { customerId: string }) {
  const [state, action, pending] = useActionState(addVehicleAction, initialActionState);
  const [open, setOpen] = useState(false);
  const form = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (state.ok) form.current?.reset();
  }, [state]);
  if (!open)
    return (
      <div className="mt-3">
        <FormStatus ok={state.ok} message={state.message} />
        <Button variant="secondary" onClick={() => setOpen(true)}>
          Add a vehicle
        </Button>
      </div>
    );
  return (
    <form
      ref={form}
      action={action}
      noValidate
      className="mt-4 space-y-3 border-t border-ink-100 pt-4"
      aria-label="Add a vehicle"
    >
      <input type="hidden" name="customerId" value={customerId} />
      <VehicleFields prefix="new-vehicle" state={state.ok ? initialActionState : state} />
      <FormStatus ok={state.ok} message={state.message} />
      <div className="flex gap-2">
        <Button type="submit" disabled={pending}>
          {pending ? "Adding…" : "Add vehicle"}
        </Button>
        <Button type="button" variant="ghost" onClick={() => setOpen(false)}>
          Close
        </Button>
      </div>
    </form>
  );
}

/** The customer's vehicles: listed, edited in place, removed after a confirmation, added. */
export function VehiclesPanel({
  customerId,
  vehicles,
  canWrite,
}: {
  customerId: string;
  vehicles: VehicleView[];
  canWrite: boolean;
}) {
  const [editing, setEditing] = useState<string | null>(null);
  return (
    <div>
      {vehicles.length === 0 ? (
        <p className="mt-2 text-sm text-ink-600">No vehicles yet.</p>
      ) : (
        <ul className="mt-2 divide-y divide-ink-100" aria-label="Vehicles">
          {vehicles.map((v) => (
            <li key={v.id} className="py-3">
              {editing === v.id ? (
                <EditVehicle vehicle={v} onDone={() => setEditing(null)} />
              ) : (
                <div className="flex flex-wrap items-start justify-between gap-2">
                  <div>
                    <p className="font-medium">{name(v)}</p>
                    <p className="text-sm text-ink-600">
                      {[v.engine, v.vin ? `VIN ${v.vin}` : null].filter(Boolean).join(" · ") ||
                        "No engine or VIN noted"}
                    </p>
                    {v.notes ? (
                      <p className="mt-1 text-sm whitespace-pre-line text-ink-700">{v.notes}</p>
                    ) : null}
                  </div>
                  {canWrite ? (
                    <div className="flex gap-1">
                      <Button variant="ghost" onClick={() => setEditing(v.id)}>
                        Edit<span className="sr-only"> {name(v)}</span>
                      </Button>
                      <RemoveVehicle vehicle={v} />
                    </div>
                  ) : null}
                </div>
              )}
            </li>
          ))}
        </ul>
      )}
      {canWrite ? <AddVehicle customerId={customerId} /> : null}
    </div>
  );
}
