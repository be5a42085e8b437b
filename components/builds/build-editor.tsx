"use client";

import { useEffect, useMemo, useState, useTransition } from "react";
import { useFieldArray, useForm, useWatch, type UseFormRegister } from "react-hook-form";
import { saveBuildAction, type SaveBuildState } from "@/app/(shop)/builds/[id]/actions";
import { Button } from "@/components/ui/button";
import { FormStatus } from "@/components/ui/status";
import { UnitNumberField } from "@/components/ui/unit-number-field";
import { FuelSystemInputSchema, sizeParsedFuelSystem, type FuelSystemInput } from "@/lib/calc";
import type { BuildStatus } from "@/db/schema/builds";
import { STATUS_LABELS, STATUS_NEXT } from "@/lib/validations/builds";
import { ResultsPanel } from "./results-panel";
import { SizingCharts } from "./sizing-charts";

type Values = FuelSystemInput & { title: string; status: BuildStatus };

const toNumber = (v: unknown) => (v === "" || v === null || v === undefined ? undefined : typeof v === "number" ? v : Number(String(v).replace(",", ".")));

function NumberField({ register, name, label, unit, error }: { register: UseFormRegister<Values>; name: string; label: string; unit: string; error?: string }) {
  return <UnitNumberField id={`b-${name.replace(/\./g, "-")}`} label={label} unit={unit} error={error} announce {...register(name as never, { setValueAs: toNumber })} />;
}

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <fieldset className="rounded-lg border border-ink-200 bg-white p-4">
      <legend className="px-1 font-display text-lg font-semibold">{title}</legend>
      <div className="grid gap-3 sm:grid-cols-2">{children}</div>
    </fieldset>
  );
}

/** The build sheet: inputs on one side, the live sizing beside them, recomputed in the browser. */
export function BuildEditor(props: { buildId: string; title: string; status: BuildStatus; version: number; inputs: FuelSystemInput; readOnly: boolean }) {
  const [version, setVersion] = useState(props.version);
  const [saved, setSaved] = useState<SaveBuildState | null>(null);
  const [pending, start] = useTransition();
  const { register, control, formState, reset, getValues } = useForm<Values>({ defaultValues: { ...props.inputs, title: props.title, status: props.status } });
  const points = useFieldArray({ control, name: "pumps.0.curves.0.points" as never });
  const values = useWatch({ control }) as Values;

  const { title, status, ...inputs } = values;
  void title;
  void status;
  const parsed = useMemo(() => FuelSystemInputSchema.safeParse(inputs), [inputs]);
  const result = useMemo(() => (parsed.success ? sizeParsedFuelSystem(parsed.data) : null), [parsed]);
  const errors = useMemo(() => {
    const out: Record<string, string> = {};
    if (!parsed.success) for (const i of parsed.error.issues) out[i.path.join(".")] ??= i.message;
    for (const [k, v] of Object.entries((saved && !saved.ok && saved.fieldErrors) || {})) out[k.replace(/^inputs\./, "")] ??= v;
    return out;
  }, [parsed, saved]);

  // Unsaved changes are not lost by leaving the page by accident.
  useEffect(() => {
    if (!formState.isDirty) return;
    const warn = (e: BeforeUnloadEvent) => e.preventDefault();
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, [formState.isDirty]);

  const save = () =>
    start(async () => {
      const v = getValues();
      const { title: t, status: s, ...rest } = v;
      const res = await saveBuildAction(props.buildId, { version, title: t, status: s, inputs: rest });
      setSaved(res);
      if (res.ok) {
        setVersion(res.version);
        reset(v);
      }
    });

  const num = (name: string, label: string, unit: string) => <NumberField key={name} register={register} name={name} label={label} unit={unit} error={errors[name]} />;
  const select = (name: string, label: string, options: [string, string][]) => (
    <div key={name}>
      <label htmlFor={`b-${name.replace(/\./g, "-")}`} className="block text-sm font-medium text-ink-700">{label}</label>
      <select id={`b-${name.replace(/\./g, "-")}`} className="mt-1 block w-full rounded-md border border-ink-300 bg-white px-3 py-2" {...register(name as never)}>
        {options.map(([v, l]) => (
          <option key={v} value={v}>{l}</option>
        ))}
      </select>
      {errors[name] ? <p role="alert" className="mt-1 text-sm text-danger-700">✕ {errors[name]}</p> : null}
    </div>
  );

  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
      <form
        aria-label="Build inputs"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          if (parsed.success) save();
          else setSaved({ ok: false, message: "Check the highlighted fields" });
        }}
      >
        <fieldset disabled={props.readOnly} className="space-y-4">
          <div className="flex flex-wrap items-end gap-3">
            <div className="min-w-64 flex-1">
              <label htmlFor="b-title" className="block text-sm font-medium text-ink-700">Title</label>
              <input id="b-title" className="mt-1 block w-full rounded-md border border-ink-300 bg-white px-3 py-2 font-display text-xl font-semibold" {...register("title")} />
            </div>
            {select("status", "Status", [[props.status, STATUS_LABELS[props.status]], ...STATUS_NEXT[props.status].map((s) => [s, STATUS_LABELS[s]] as [string, string])])}
          </div>
          <Section title="Engine">
            {num("engine.cylinders", "Cylinders", "count")}
            {num("engine.displacementL", "Displacement", "L")}
            {select("engine.aspiration", "Aspiration", [["na", "Naturally aspirated"], ["turbo", "Turbocharged"], ["supercharged", "Supercharged"]])}
            {num("engine.maxBoostKpa", "Boost", "kPa")}
            {num("engine.redlineRpm", "Redline", "rpm")}
            {num("engine.idleRpm", "Idle", "rpm")}
          </Section>
          <Section title="Power goal">
            {num("target.powerKw", "Target power", "kW")}
            {select("target.measuredAt", "Measured at", [["wheel", "the wheels"], ["crank", "the crank"]])}
            {num("target.drivetrainLossPct", "Drivetrain loss", "%")}
          </Section>
          <Section title="Fuel and blend range">
            {num("fuel.ethanolMinVolPct", "Lowest ethanol", "%")}
            {num("fuel.ethanolMaxVolPct", "Highest ethanol", "%")}
            {num("fuel.bsfcGPerKwh", "BSFC (blank: rule of thumb)", "g/kWh")}
            {num("fuel.targetLambda", "Target lambda (blank: reference)", "λ")}
          </Section>
          <Section title="Injectors">
            {num("injectors.count", "Injectors", "count")}
            {num("injectors.ratedFlowCcPerMin", "Rated flow", "cc/min")}
            {num("injectors.ratedPressureKpa", "Rated at", "kPa")}
            {num("injectors.minPulseWidthMs", "Minimum pulse width", "ms")}
          </Section>
          <Section title="Regulator and electrical">
            {select("regulator.type", "Regulator", [["boost-referenced", "Boost-referenced (1:1)"], ["fixed", "Fixed (not referenced)"]])}
            {num("regulator.basePressureKpa", "Base pressure", "kPa")}
            {num("electrical.voltageAtPump", "Voltage at the pump", "V")}
          </Section>
          <Section title="Pump">
            {num("pumps.0.quantity", "Pumps in parallel", "count")}
            {num("pumps.0.curves.0.voltage", "Curve tested at", "V")}
            <div className="sm:col-span-2">
              <p className="text-sm font-medium text-ink-700">Flow curve</p>
              {errors["pumps.0.curves.0.points"] ? <p role="alert" className="text-sm text-danger-700">✕ {errors["pumps.0.curves.0.points"]}</p> : null}
              <div className="mt-1 space-y-2">
                {points.fields.map((p, i) => (
                  <div key={p.id} className="grid grid-cols-[1fr_1fr_auto] items-end gap-2">
                    {num(`pumps.0.curves.0.points.${i}.pressureKpa`, `Point ${i + 1} pressure`, "kPa")}
                    {num(`pumps.0.curves.0.points.${i}.flowLPerH`, `Point ${i + 1} flow`, "L/h")}
                    <Button type="button" variant="ghost" aria-label={`Remove point ${i + 1}`} onClick={() => points.remove(i)}>✕</Button>
                  </div>
                ))}
              </div>
              <Button type="button" variant="secondary" className="mt-2" onClick={() => points.append({ pressureKpa: undefined, flowLPerH: undefined } as never)}>Add point</Button>
            </div>
          </Section>
          {!props.readOnly ? (
            <div className="sticky bottom-0 flex flex-wrap items-center gap-4 border-t border-ink-200 bg-ink-50 py-3">
              <Button type="submit" disabled={pending}>{pending ? "Saving…" : "Save build"}</Button>
              <span className="figure text-sm text-ink-600">version {version}{formState.isDirty ? " · unsaved changes" : ""}</span>
              <FormStatus ok={saved?.ok} message={saved?.message} />
              {saved && !saved.ok && saved.conflict ? (
                <p className="w-full text-sm text-caution-700">
                  ▲ Version {saved.conflict.version} (“{saved.conflict.title}”) was saved at {saved.conflict.updatedAt.replace("T", " ").slice(0, 16)} UTC. Your entries are still here; reload to see theirs, then re-apply yours.
                </p>
              ) : null}
            </div>
          ) : null}
        </fieldset>
      </form>
      <div>
        <ResultsPanel result={result} />
        {result && parsed.success ? (
          <div className="mt-4">
            <SizingCharts input={parsed.data} result={result} />
          </div>
        ) : null}
      </div>
    </div>
  );
}
