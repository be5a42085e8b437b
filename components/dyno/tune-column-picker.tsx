"use client";

import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/field";

/** A channel's part of the mapping as the picker holds it (lib/calc/log-mapping.ts's shape). */
type Part = {
  column?: string;
  columns?: string[];
  kind?: string;
  unit?: string;
  afrStoich?: number;
};
export type PickerMapping = Record<string, Part | string | undefined>;

interface Channel {
  key: string;
  label: string;
  required?: boolean;
  kinds?: [string, string][];
  units?: [string, string][];
}

const PRESSURE_UNITS: [string, string][] = [
  ["kPa", "kPa"],
  ["bar", "bar"],
  ["psi", "psi"],
];
const TEMPERATURE_UNITS: [string, string][] = [
  ["C", "°C"],
  ["F", "°F"],
];
const GAUGE_OR_ABSOLUTE: [string, string][] = [
  ["gauge", "gauge"],
  ["absolute", "absolute"],
];

/** Every channel a pull's log may carry, in the order a tuner reads a log. */
const CHANNELS: Channel[] = [
  {
    key: "duty",
    label: "Injector duty or pulse width",
    required: true,
    kinds: [
      ["duty_pct", "duty %"],
      ["pulse_ms", "pulse width ms"],
    ],
  },
  {
    key: "mixture",
    label: "Lambda or AFR",
    kinds: [
      ["lambda", "lambda"],
      ["afr", "AFR (gasoline 14.7 scale)"],
    ],
  },
  {
    key: "boost",
    label: "Boost or MAP",
    kinds: [
      ["gauge", "gauge (boost)"],
      ["absolute", "absolute (MAP)"],
    ],
    units: PRESSURE_UNITS,
  },
  {
    key: "fuelPressure",
    label: "Fuel pressure",
    kinds: [
      ["rail", "rail (gauge)"],
      ["differential", "differential"],
    ],
    units: PRESSURE_UNITS,
  },
  { key: "ethanol", label: "Ethanol content" },
  {
    key: "power",
    label: "Measured power",
    units: [
      ["kW", "kW"],
      ["hp", "hp"],
    ],
  },
  {
    key: "exhaustPressure",
    label: "Exhaust manifold pressure",
    kinds: GAUGE_OR_ABSOLUTE,
    units: PRESSURE_UNITS,
  },
  {
    key: "turboSpeed",
    label: "Turbo speed",
    units: [
      ["rpm", "rpm"],
      ["krpm", "krpm"],
    ],
  },
  { key: "intakeTemp", label: "Intake air temperature", units: TEMPERATURE_UNITS },
  { key: "timing", label: "Ignition timing (° before TDC)" },
];

/** The unit a column's units row or name suggests, among a channel's choices. */
function guessUnit(choices: [string, string][] | undefined, said: string): string | undefined {
  if (!choices) return undefined;
  const s = said.toLowerCase();
  const hit = choices.find(
    ([v, l]) =>
      s.includes(l.toLowerCase()) ||
      (v === "F" && /°?\s*f\b|fahrenheit/.test(s)) ||
      (v === "krpm" && /krpm/.test(s)),
  );
  return (hit ?? choices[0])?.[0];
}

/** The mapping as the API takes it: channels with no column left out. */
export function cleanMapping(m: PickerMapping): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(m)) {
    if (v === undefined) continue;
    if (typeof v === "string") {
      if (v) out[k] = v;
    } else if (k === "egt") {
      if (v.columns?.length) out[k] = { columns: v.columns, unit: v.unit ?? "C" };
    } else if (v.column) out[k] = v;
  }
  return out;
}

/**
 * Which column of a pull's log is what, for a log the remembered mapping (or the guess) could not
 * place: every channel of a pull (engine speed and duty needed; EGT any number of cylinders),
 * each column offered with its units row. The file stays chosen; "Add with these columns" sends
 * it again with the mapping, which is remembered for this logger once the pull is added.
 */
export function TuneColumnPicker({
  columns,
  units,
  mapping,
  remembered,
  issues,
  pending,
  onChange,
  onRetry,
  onCancel,
  fileName,
}: {
  columns: string[];
  units: string[];
  mapping: PickerMapping;
  remembered: boolean;
  /** Messages by channel key ("rpm", "duty", "egt"…). */
  issues: Record<string, string>;
  pending: boolean;
  onChange: (m: PickerMapping) => void;
  onRetry: () => void;
  onCancel: () => void;
  fileName: string;
}) {
  const unitOfColumn = (c: string) => units[columns.indexOf(c)] ?? "";
  const label = (c: string) => (unitOfColumn(c) ? `${c} (${unitOfColumn(c)})` : c);
  const part = (key: string) => {
    const v = mapping[key];
    return typeof v === "object" ? v : undefined;
  };
  const set = (key: string, v: Part | string | undefined) => onChange({ ...mapping, [key]: v });
  const options = (none: string) => (
    <>
      <option value="">{none}</option>
      {columns.map((c) => (
        <option key={c} value={c}>
          {label(c)}
        </option>
      ))}
    </>
  );
  const egt = part("egt");
  const egtColumns = egt?.columns ?? [];
  return (
    <section
      aria-labelledby="pick-columns-heading"
      className="rounded-lg border border-caution-600 bg-caution-50 p-4"
      data-testid="column-picker"
    >
      <h3 id="pick-columns-heading" className="font-semibold">
        Which column is what in {fileName}?
      </h3>
      <p className="mt-1 text-sm text-ink-700">
        {remembered
          ? "The columns remembered for this logger do not fit this log. "
          : "Fuelwright could not tell which column is which. "}
        Choose them below and add the pull again — the file stays chosen. Nothing was stored; the
        choice is remembered for this logger once the pull is added.
      </p>
      <div className="mt-3 grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
        <fieldset className="rounded border border-ink-200 bg-white p-2">
          <legend className="px-1 text-sm font-medium text-ink-700">Engine speed (needed)</legend>
          <SelectField
            label="Column"
            id="pick-rpm"
            value={typeof mapping.rpm === "string" ? mapping.rpm : ""}
            onChange={(e) => set("rpm", e.target.value || undefined)}
            error={issues.rpm}
          >
            {options("—")}
          </SelectField>
        </fieldset>
        {CHANNELS.map((ch) => {
          const p = part(ch.key);
          return (
            <fieldset key={ch.key} className="rounded border border-ink-200 bg-white p-2">
              <legend className="px-1 text-sm font-medium text-ink-700">
                {ch.label}
                {ch.required ? " (needed)" : ""}
              </legend>
              <SelectField
                label="Column"
                id={`pick-${ch.key}`}
                value={p?.column ?? ""}
                error={issues[ch.key]}
                onChange={(e) => {
                  const c = e.target.value;
                  if (!c) return set(ch.key, undefined);
                  const said = `${unitOfColumn(c)} ${c}`;
                  set(ch.key, {
                    ...(ch.kinds ? { kind: ch.kinds[0]![0] } : {}),
                    ...(ch.units ? { unit: guessUnit(ch.units, said) } : {}),
                    ...(ch.key === "mixture" ? { afrStoich: 14.7 } : {}),
                    ...p,
                    column: c,
                  });
                }}
              >
                {options(ch.required ? "—" : "not logged")}
              </SelectField>
              {p?.column && ch.kinds ? (
                <SelectField
                  label="Is"
                  id={`pick-${ch.key}-kind`}
                  value={p.kind ?? ch.kinds[0]![0]}
                  onChange={(e) => set(ch.key, { ...p, kind: e.target.value })}
                >
                  {ch.kinds.map(([v, l]) => (
                    <option key={v} value={v}>
                      {l}
                    </option>
                  ))}
                </SelectField>
              ) : null}
              {p?.column && ch.units ? (
                <SelectField
                  label="Unit"
                  id={`pick-${ch.key}-unit`}
                  value={p.unit ?? ch.units[0]![0]}
                  onChange={(e) => set(ch.key, { ...p, unit: e.target.value })}
                >
                  {ch.units.map(([v, l]) => (
                    <option key={v} value={v}>
                      {l}
                    </option>
                  ))}
                </SelectField>
              ) : null}
            </fieldset>
          );
        })}
        <fieldset className="rounded border border-ink-200 bg-white p-2 sm:col-span-2 xl:col-span-3">
          <legend className="px-1 text-sm font-medium text-ink-700">
            Exhaust gas temperature, one column per cylinder (in cylinder order)
          </legend>
          <div className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
            {columns.map((c) => (
              <label key={c} className="flex items-center gap-1.5">
                <input
                  type="checkbox"
                  checked={egtColumns.includes(c)}
                  onChange={(e) => {
                    const next = e.target.checked
                      ? columns.filter((x) => x === c || egtColumns.includes(x))
                      : egtColumns.filter((x) => x !== c);
                    set("egt", {
                      unit: egt?.unit ?? guessUnit(TEMPERATURE_UNITS, `${unitOfColumn(c)} ${c}`),
                      columns: next,
                    });
                  }}
                />
                {label(c)}
              </label>
            ))}
          </div>
          {egtColumns.length ? (
            <div className="mt-2 max-w-48">
              <SelectField
                label="EGT unit"
                id="pick-egt-unit"
                value={egt?.unit ?? "C"}
                onChange={(e) => set("egt", { ...egt, columns: egtColumns, unit: e.target.value })}
              >
                {TEMPERATURE_UNITS.map(([v, l]) => (
                  <option key={v} value={v}>
                    {l}
                  </option>
                ))}
              </SelectField>
            </div>
          ) : null}
          {issues.egt ? <p className="mt-1 text-sm text-danger-700">✕ {issues.egt}</p> : null}
        </fieldset>
      </div>
      <div className="mt-3 flex flex-wrap items-center gap-3">
        <Button type="button" onClick={onRetry} disabled={pending}>
          {pending ? "Adding…" : "Add with these columns"}
        </Button>
        <Button type="button" variant="secondary" onClick={onCancel} disabled={pending}>
          Cancel
        </Button>
      </div>
    </section>
  );
}
