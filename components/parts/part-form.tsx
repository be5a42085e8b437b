"use client";

import { useRouter } from "next/navigation";
import { useRef, useState, useTransition } from "react";

import { Button } from "@/components/ui/button";
import { EditConflict } from "@/components/ui/edit-conflict";
import { Field, SelectField } from "@/components/ui/field";
import { FormStatus } from "@/components/ui/status";
import { initialActionState, type ActionState } from "@/lib/actions/state";
import type { UnitSystem } from "@/lib/calc/units";
import { CSV_COLUMNS, flatOf, type FlatPart, type StoredPartFields } from "@/lib/catalog/flat-part";
import { CATEGORY_LABELS, PART_CATEGORIES, type PartCategory } from "@/lib/domain/parts";
import { createPartAction, deletePartAction, updatePartAction } from "@/lib/parts/part-actions";
import {
  partCanonical,
  partFieldMessage,
  partHints,
  partShown,
  partUnit,
} from "@/lib/parts/part-units";

type StoredPart = StoredPartFields & { version: number };

/** The spec fields each category shows, in the viewer's units: [column, label, hint]. */
function specFields(units: UnitSystem): Record<PartCategory, [keyof FlatPart, string, string?][]> {
  const u = (k: Parameters<typeof partUnit>[0]) => partUnit(k, units);
  const hint = partHints(units);
  return {
    injector: [
      ["flow_cc_min", `Rated flow (${u("flow_cc_min")})`],
      ["rated_kpa", `Rated at (${u("rated_kpa")})`, hint.rated_kpa],
      ["min_pulse_ms", "Minimum pulse width (ms)"],
      ["impedance", "Impedance (high or low)"],
      ["connector", "Connector"],
      ["ethanol_ok", "Rated for ethanol (yes/no)"],
      ["test_fluid_kg_l", `Rating fluid density (${u("test_fluid_kg_l")})`, hint.test_fluid_kg_l],
      ["dead_time_ms", "Dead time table", hint.dead_time_ms],
    ],
    pump: [
      ["pump_curve", "Flow curve", hint.pump_curve],
      ["current_a", "Current draw (A)"],
      ["mounting", "Mounting (in-tank or inline)"],
      ["ethanol_ok", "Rated for ethanol (yes/no)"],
    ],
    regulator: [
      ["regulator_type", "Type (boost-referenced or fixed)"],
      ["min_kpa", `Lowest setting (${u("min_kpa")})`],
      ["max_kpa", `Highest setting (${u("max_kpa")})`],
      ["an_dash", "Port size (AN dash)"],
    ],
    line: [
      ["an_dash", "AN dash size"],
      ["inside_mm", `Inside diameter (${u("inside_mm")})`],
      ["material", "Material"],
      ["ethanol_ok", "Rated for ethanol (yes/no)"],
    ],
    fitting: [["an_dash", "AN dash size"]],
    filter: [
      ["micron", "Rating (µm)"],
      ["drop_kpa", `Pressure drop at rated flow (${u("drop_kpa")})`],
      ["an_dash", "Port size (AN dash)"],
      ["ethanol_ok", "Rated for ethanol (yes/no)"],
    ],
    sensor: [],
    other: [],
  };
}

export function PartForm({
  id,
  version: loadedVersion,
  initial,
  canDelete,
  units,
}: {
  id?: string;
  /** The version the edit starts from (an existing part). */
  version?: number;
  /** The part as stored: canonical text (the CSV's columns). */
  initial: FlatPart;
  canDelete: boolean;
  /** The viewer's units: flows, pressures, sizes and tables are shown and typed in them. */
  units: UnitSystem;
}) {
  const router = useRouter();
  // What the form shows and holds: in the viewer's units; sent back canonical (partCanonical).
  const [values, setValues] = useState<FlatPart>(() => partShown(initial, units));
  const SPEC_FIELDS = specFields(units);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [status, setStatus] = useState<{ ok: boolean; message: string } | null>(null);
  const [pending, start] = useTransition();
  // A stale save: the part as saved meanwhile. What was typed stays in `values`.
  const [conflict, setConflict] = useState<StoredPart | null>(null);
  const [version, setVersion] = useState(loadedVersion);
  const formRef = useRef<HTMLFormElement>(null);
  const category = (values.category || "injector") as PartCategory;
  const set = (k: keyof FlatPart) => (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement>) =>
    setValues((v) => ({ ...v, [k]: e.target.value }));
  const field = (k: keyof FlatPart, label: string, hint?: string) => (
    <Field
      key={k}
      label={label}
      name={k}
      id={`p-${k}`}
      value={values[k] ?? ""}
      onChange={set(k)}
      error={errors[k]}
      hint={hint}
    />
  );

  const refused = (res: ActionState) => {
    if (res.status === 409 && res.current) {
      // The conflict notice says it all, with what was saved meanwhile.
      setConflict(res.current as StoredPart);
      setStatus(null);
      return;
    }
    setErrors(
      Object.fromEntries(
        Object.entries(res.fieldErrors ?? {}).map(([path, msgs]) => [
          path,
          [...new Set(msgs.map((msg) => partFieldMessage(path, msg, units, category)))].join(" "),
        ]),
      ),
    );
    setStatus({ ok: false, message: res.message ?? "Not saved" });
    // Once the messages are drawn, go to the first highlighted field.
    requestAnimationFrame(() =>
      formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus(),
    );
  };

  // Every field the form holds is sent, with the version it was loaded at; the update changes
  // only what it is given and writes nothing when nothing differs.
  const submit = (from = version) =>
    start(async () => {
      const sent = partCanonical(values, initial, units);
      const res = id
        ? await updatePartAction(initialActionState, { ...sent, category, id, version: from })
        : await createPartAction(initialActionState, { ...sent, category });
      if (res.ok) {
        setErrors({});
        setConflict(null);
        setStatus({ ok: true, message: "Saved" });
        router.push("/parts");
        router.refresh();
      } else refused(res);
    });

  return (
    <form
      ref={formRef}
      noValidate
      className="max-w-3xl space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        submit();
      }}
    >
      <fieldset className="grid gap-3 rounded-lg border border-ink-200 bg-white p-4 sm:grid-cols-2">
        <legend className="px-1 font-display text-lg font-semibold">Part</legend>
        {field("sku", "SKU")}
        <SelectField
          label="Category"
          name="category"
          id="p-category"
          value={category}
          onChange={set("category")}
          error={errors.category}
        >
          {PART_CATEGORIES.map((c) => (
            <option key={c} value={c}>
              {CATEGORY_LABELS[c]}
            </option>
          ))}
        </SelectField>
        {field("brand", "Brand")}
        {field("name", "Name")}
        {field("price", "Price", "e.g. 189.00")}
        {field("cost", "Cost")}
        {field("stock", "In stock")}
        {field("reorder_level", "Reorder at")}
        {field(
          "lead_time_days",
          "Lead time (days)",
          "From ordering to the shelf; blank: not known",
        )}
        {field(
          "restock_on",
          "Expected restock",
          "YYYY-MM-DD, a supplier's promised day; blank: none",
        )}
      </fieldset>
      {SPEC_FIELDS[category].length ? (
        <fieldset className="grid gap-3 rounded-lg border border-ink-200 bg-white p-4 sm:grid-cols-2">
          <legend className="px-1 font-display text-lg font-semibold">
            {CATEGORY_LABELS[category]} data
          </legend>
          {SPEC_FIELDS[category].map(([k, label, hint]) => field(k, label, hint))}
        </fieldset>
      ) : null}
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={pending}>
          {pending ? "Saving…" : "Save part"}
        </Button>
        {id && canDelete ? (
          <Button
            type="button"
            variant="danger"
            disabled={pending}
            onClick={() => {
              if (
                !window.confirm(`Delete ${values.sku} from the catalog? Quotes keep their lines.`)
              )
                return;
              start(async () => {
                const res = await deletePartAction(initialActionState, { id });
                if (res.ok) {
                  router.push("/parts");
                  router.refresh();
                } else refused(res);
              });
            }}
          >
            Delete part
          </Button>
        ) : null}
        <FormStatus ok={status?.ok} message={status?.message} />
        {conflict ? (
          <EditConflict
            what="this part"
            version={conflict.version}
            disabled={pending}
            rows={CSV_COLUMNS.map((c) => ({
              label: c,
              yours: (values[c] ?? "").trim(),
              theirs: partShown(flatOf(conflict), units)[c] ?? "",
            }))}
            onOverwrite={() => {
              setVersion(conflict.version);
              setConflict(null);
              submit(conflict.version);
            }}
          />
        ) : null}
      </div>
    </form>
  );
}
