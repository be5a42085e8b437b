"use client";

import dynamic from "next/dynamic";
import {
  createContext,
  memo,
  useCallback,
  useContext,
  useEffect,
  useLayoutEffect,
  useMemo,
  useRef,
  useState,
  useTransition,
  type SelectHTMLAttributes,
} from "react";
import { useForm, useWatch, type Control, type UseFormRegister } from "react-hook-form";

import { ChartPlaceholder, WhenVisible } from "@/components/charts/when-visible";
import { Button } from "@/components/ui/button";
import { ConflictTable } from "@/components/ui/conflict-table";
import { SelectField } from "@/components/ui/field";
import { useLeaveGuard } from "@/components/ui/leave-guard";
import { LocalTime } from "@/components/ui/local-time";
import { FormStatus } from "@/components/ui/status";
import { UnitNumberField } from "@/components/ui/unit-number-field";
import { initialActionState, type ActionState } from "@/lib/actions/state";
import { saveBuildAction } from "@/lib/builds/build-actions";
import type { BuildResult, CurrentBuildData } from "@/lib/builds/build-data";
import { diffInputs, stableJson, type InputChange } from "@/lib/builds/diff";
import {
  AN_SIZES,
  ASPIRATION_CLASS_LABELS,
  convertInputs,
  entryUnitOf,
  formatValue,
  FUEL_CLASS_LABELS,
  FuelSystemInputSchema,
  inputField,
  parseNumberText,
  shopBsfcFor,
  toShown,
  unitOf,
  type FuelSystemInput,
  type FuelSystemResult,
  type ParsedFuelSystemInput,
  type ShopBsfcRow,
  type UnitSystem,
} from "@/lib/calc";
import {
  STATUS_LABELS,
  statusMoves,
  type BuildStatus,
  type BuildStatusFacts,
} from "@/lib/domain/builds";
import { setUnitsAction } from "@/lib/preferences/preference-actions";
import {
  DEFAULT_DRIVE_TYPE,
  type DriveType,
  type SizingSettings,
} from "@/lib/sizing/effective-inputs";

import { useAfterPaint } from "./after-paint";
import { DeadTimeGrid } from "./dead-time-grid";
import { FiguresAnnouncer } from "./figures-announcer";
import { LiveSizing, useLive, type LiveState } from "./live-sizing";
import { PinnedSummary } from "./pinned-summary";
import { PumpCurves } from "./pump-curves";
import { ResultsPanel } from "./results-panel";
import { SettingsChangedNote } from "./settings-changed-note";
import { SizingSettingsNote } from "./sizing-settings-note";
import { UnitToggle } from "./unit-toggle";

// The charts (plain SVG, components/charts/line-plot.tsx) load and draw when they scroll near the
// screen, after the sheet is usable: their code stays out of the page's first load.
const SizingCharts = dynamic(() => import("./sizing-charts").then((m) => m.SizingCharts), {
  ssr: false,
  loading: () => <ChartPlaceholder minHeight={CHARTS_HEIGHT} label="Loading the charts…" />,
});
const CHARTS_HEIGHT = 1200;

/**
 * The charts and the settings note follow the typing a beat behind the key figures (`useAfterPaint`):
 * a keystroke's figures are painted first, the charts after that frame.
 */
const LaterFigures = memo(function LaterFigures({
  input,
  result,
  units,
}: {
  input: ParsedFuelSystemInput;
  result: FuelSystemResult;
  units: UnitSystem;
}) {
  return (
    <>
      <SizingSettingsNote input={input} result={result} units={units} />
      <div className="mt-4 print:hidden">
        <WhenVisible minHeight={CHARTS_HEIGHT} label="The charts load as you scroll to them">
          <SizingCharts input={input} result={result} units={units} />
        </WhenVisible>
      </div>
    </>
  );
});

/** The optional parts of a build, switched on and off in the form. */
const OPTIONAL = ["feed", "return", "wiring", "deadTime", "pump2", "bypass"] as const;
type Optional = (typeof OPTIONAL)[number];
type Values = FuelSystemInput & {
  title: string;
  status: BuildStatus;
  include: Record<Optional, boolean>;
};

const OPTIONAL_DEFAULTS = {
  feed: {
    insideDiameterMm: AN_SIZES[1].typicalHoseIdMm,
    lengthM: 5,
    fittingsK: 4,
  },
  return: {
    insideDiameterMm: AN_SIZES[1].typicalHoseIdMm,
    lengthM: 5,
    fittingsK: 3,
  },
  wiring: { sourceVoltage: 14, gaugeAwg: 12, roundTripLengthM: 7, currentA: 15 },
  bypass: { flowLPerH: 400, atPressureKpa: 300 },
  /** A second pump: another model, or a stage switched on by boost. */
  pump2: {
    quantity: 1,
    curves: [
      {
        voltage: 13.5,
        points: [
          { pressureKpa: 300, flowLPerH: 250 },
          { pressureKpa: 600, flowLPerH: 180 },
        ],
      },
    ],
  },
  deadTime: {
    voltages: [10, 12, 14],
    pressuresKpa: [300, 400],
    deadTimeMs: [
      [1.3, 1.4],
      [0.9, 1.0],
      [0.7, 0.75],
    ],
  },
};

const NONE_INCLUDED: Record<Optional, boolean> = {
  feed: false,
  return: false,
  wiring: false,
  deadTime: false,
  pump2: false,
  bypass: false,
};

const toNumber = (v: unknown) =>
  v === "" || v === null || v === undefined
    ? undefined
    : typeof v === "number"
      ? v
      : parseNumberText(String(v));
const idOf = (name: string) => `b-${name.replace(/\./g, "-")}`;

/** Form values (shown units, optional parts kept while switched off) → the canonical inputs. */
function inputsOf(values: Values, units: UnitSystem, baseline: FuelSystemInput): FuelSystemInput {
  const { title, status, include, ...rest } = values;
  void title;
  void status;
  const v = structuredClone(rest) as FuelSystemInput;
  const inc = include ?? NONE_INCLUDED;
  const lines = {
    ...(inc.feed ? { feed: v.lines?.feed } : {}),
    ...(inc.return ? { return: v.lines?.return } : {}),
  };
  if (lines.feed || lines.return) v.lines = lines;
  else delete v.lines;
  if (!inc.wiring && v.electrical) delete v.electrical.wiring;
  if (!inc.deadTime && v.injectors) delete v.injectors.deadTime;
  if (!inc.bypass && v.regulator) delete v.regulator.bypass;
  // Without the second pump, the first (and any the API added beyond the second) stay.
  if (!inc.pump2 && Array.isArray(v.pumps)) v.pumps = [v.pumps[0]!, ...v.pumps.slice(2)];
  return convertInputs(v, units, "toCanonical", withOptionalDefaults(baseline));
}

/**
 * Canonical inputs with the optional parts filled in (their canonical defaults where the build
 * has none): what the form shows, and the original a shown value converts back to — so a default
 * nobody changed comes back exactly (400 L/h at 300 kPa, never 400.1 at 299.9 after a switch).
 */
function withOptionalDefaults(inputs: FuelSystemInput): FuelSystemInput {
  return {
    ...inputs,
    injectors: {
      ...inputs.injectors,
      deadTime: inputs.injectors.deadTime ?? OPTIONAL_DEFAULTS.deadTime,
    },
    electrical: {
      ...inputs.electrical,
      wiring: inputs.electrical.wiring ?? OPTIONAL_DEFAULTS.wiring,
    },
    regulator: {
      ...inputs.regulator,
      bypass: inputs.regulator.bypass ?? OPTIONAL_DEFAULTS.bypass,
    },
    pumps: [inputs.pumps[0]!, inputs.pumps[1] ?? OPTIONAL_DEFAULTS.pump2, ...inputs.pumps.slice(2)],
    lines: {
      feed: inputs.lines?.feed ?? OPTIONAL_DEFAULTS.feed,
      return: inputs.lines?.return ?? OPTIONAL_DEFAULTS.return,
    },
  };
}

/** Canonical inputs → form values in the shown units, with the optional parts filled in. */
function valuesOf(
  inputs: FuelSystemInput,
  units: UnitSystem,
  title: string,
  status: BuildStatus,
): Values {
  const include = {
    feed: Boolean(inputs.lines?.feed),
    return: Boolean(inputs.lines?.return),
    wiring: Boolean(inputs.electrical?.wiring),
    deadTime: Boolean(inputs.injectors?.deadTime),
    pump2: inputs.pumps.length > 1,
    bypass: Boolean(inputs.regulator?.bypass),
  };
  const full = withOptionalDefaults(inputs);
  return { ...convertInputs(full, units, "toShown"), title, status, include };
}

/** On a page the reader may not edit: the label every section carries (whose fields they are). */
const LockedLabel = createContext<string | null>(null);

function Section({
  title,
  children,
  toggle,
  when,
}: {
  title: string;
  children?: React.ReactNode;
  toggle?: React.ReactNode;
  /** The fields show only while this optional part is switched on. */
  when?: { control: Control<Values>; part: Optional };
}) {
  const locked = useContext(LockedLabel);
  const fields = children ? <div className="mt-2 grid gap-3 sm:grid-cols-2">{children}</div> : null;
  return (
    <fieldset className="rounded-lg border border-ink-200 bg-white p-4">
      <legend className="px-1 font-display text-lg font-semibold">
        {title}
        {locked ? (
          <span className="ml-2 rounded bg-ink-100 px-2 py-0.5 align-middle font-sans text-xs font-medium text-ink-700">
            {locked}
          </span>
        ) : null}
      </legend>
      {toggle}
      {when ? (
        <Included control={when.control} part={when.part}>
          {fields}
        </Included>
      ) : (
        fields
      )}
    </fieldset>
  );
}

function NumberField({
  register,
  name,
  label,
  unit,
  store,
}: {
  register: UseFormRegister<Values>;
  name: string;
  label: string;
  unit: string;
  store: LiveSizing<Values>;
}) {
  // Re-renders when its own message changes, not on every keystroke elsewhere.
  const error = useLive(store, (s) => s.errors[name]);
  return (
    <UnitNumberField
      id={idOf(name)}
      label={label}
      unit={unit}
      error={error}
      announce
      {...register(name as never, { setValueAs: toNumber })}
    />
  );
}

/**
 * The status select: the saved status and only the moves allowed now (the same
 * lib/domain/builds.ts#statusMoves the save command checks); each move not allowed yet is listed
 * under it with what it needs, as text tied to the select.
 */
function StatusControl({
  register,
  status,
  facts,
  store,
}: {
  register: UseFormRegister<Values>;
  status: BuildStatus;
  facts: BuildStatusFacts;
  store: LiveSizing<Values>;
}) {
  const error = useLive(store, (s) => s.errors.status);
  const moves = statusMoves(status, facts);
  const blocked = moves.filter((m) => !m.allowed);
  const describedBy = [error ? "b-status-err" : "", blocked.length ? "b-status-blocked" : ""]
    .filter(Boolean)
    .join(" ");
  return (
    <div className="max-w-md">
      <label htmlFor="b-status" className="block text-sm font-medium text-ink-700">
        Status
      </label>
      <select
        id="b-status"
        aria-invalid={Boolean(error)}
        aria-describedby={describedBy || undefined}
        className="mt-1 block w-full rounded-md border border-ink-300 bg-white px-3 py-2 text-base text-ink-900 shadow-sm focus:border-copper-500 focus:ring-2 focus:ring-copper-500/30 focus:outline-none aria-[invalid=true]:border-danger-600"
        {...register("status")}
      >
        <option value={status}>{STATUS_LABELS[status]}</option>
        {moves
          .filter((m) => m.allowed)
          .map((m) => (
            <option key={m.to} value={m.to}>
              {STATUS_LABELS[m.to]}
            </option>
          ))}
      </select>
      {error ? (
        <p id="b-status-err" role="alert" className="mt-1 text-sm font-medium text-danger-700">
          <span aria-hidden="true">✕ </span>
          {error}
        </p>
      ) : null}
      {blocked.length ? (
        <ul
          id="b-status-blocked"
          className="mt-1 text-sm text-ink-600"
          data-testid="status-blocked"
        >
          {blocked.map((m) => (
            <li key={m.to}>Not yet: {m.reason}</li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}

/** The build sheet: inputs on one side, the live sizing beside them, recomputed in the browser. */
export function BuildEditor(props: {
  buildId: string;
  title: string;
  status: BuildStatus;
  /** What the status moves depend on (the build's quotes, its verified dyno log), read on the server. */
  statusFacts: BuildStatusFacts;
  version: number;
  inputs: FuelSystemInput;
  readOnly: boolean;
  /**
   * Why the reader may not edit, said above the sheet and on every section (the counter: the
   * sizing fields are the tuner's). Left out: the sections are read-only without a word.
   */
  readOnlyReason?: { note: string; label: string };
  units: UnitSystem;
  shopBsfc?: ShopBsfcRow[];
  /** The shop's settings of today: what a save sizes with, so the live results use them too. */
  sizingSettings: SizingSettings;
  /**
   * Where the saved version was sized under other settings than today's: what today's would
   * change in what is sized (empty or left out: nothing).
   */
  settingsChanges?: InputChange[];
}) {
  const [version, setVersion] = useState(props.version);
  // The drive select always shows one; a build that names none is sized as manual anyway.
  const initialInputs = useMemo(
    (): FuelSystemInput => ({
      ...props.inputs,
      target: {
        ...props.inputs.target,
        driveType: props.inputs.target.driveType ?? DEFAULT_DRIVE_TYPE,
      },
    }),
    [props.inputs],
  );
  const [units, setUnits] = useState<UnitSystem>(props.units);
  const [saved, setSaved] = useState<ActionState<BuildResult> | null>(null);
  // On a stale version: the build as someone else saved it meanwhile.
  const conflict =
    saved && !saved.ok && saved.status === 409 ? (saved.current as CurrentBuildData) : null;
  // The canonical inputs, title and status as last saved: what "unsaved changes" compares against.
  const [baseline, setBaseline] = useState({
    inputs: initialInputs,
    title: props.title,
    status: props.status,
  });
  const [pending, start] = useTransition();
  const { register, control, reset, getValues, setValue, subscribe } = useForm<Values>({
    defaultValues: valuesOf(initialInputs, props.units, props.title, props.status),
  });
  // The live sizing lives outside React's render: the form's changes feed it, and each part of
  // the page reads only its slice (live-sizing.ts). Nothing here watches the whole form, so a
  // keystroke does not re-render the inputs.
  const toInputs = useCallback(
    (v: Values, u: UnitSystem) => inputsOf(v, u, baseline.inputs),
    [baseline.inputs],
  );
  const [store] = useState(
    () =>
      new LiveSizing<Values>(
        { units, settings: props.sizingSettings, toInputs },
        getValues() as Values,
      ),
  );
  useEffect(
    () =>
      subscribe({
        formState: { values: true },
        callback: ({ values }) => store.update(values as Values),
      }),
    [subscribe, store],
  );
  const serverErrors = saved && !saved.ok ? saved.fieldErrors : undefined;
  // Units, settings, the baseline or a refused save's messages changed: the store follows.
  const configured = useRef({ units, settings: props.sizingSettings, toInputs, serverErrors });
  useLayoutEffect(() => {
    const c = configured.current;
    if (
      c.units === units &&
      c.settings === props.sizingSettings &&
      c.toInputs === toInputs &&
      c.serverErrors === serverErrors
    )
      return;
    configured.current = { units, settings: props.sizingSettings, toInputs, serverErrors };
    store.configure(configured.current, getValues() as Values);
  }, [store, units, props.sizingSettings, toInputs, serverErrors, getValues]);

  const baselineJson = useMemo(
    () => stableJson(FuelSystemInputSchema.safeParse(baseline.inputs).data ?? baseline.inputs),
    [baseline.inputs],
  );
  /** Whether the form differs from the last saved version, worked out now (for a save). */
  const dirtyNow = () => {
    const s = store.get();
    return isDirty(s, baseline, baselineJson);
  };
  const formRef = useRef<HTMLFormElement>(null);
  /** Moves the focus to the first highlighted field, in the order of the sheet. */
  const focusFirstInvalid = () =>
    requestAnimationFrame(() =>
      formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus(),
    );
  // A save the server refused for a field: highlight it, then go there.
  useEffect(() => {
    if (saved && !saved.ok && saved.fieldErrors && Object.keys(saved.fieldErrors).length)
      focusFirstInvalid();
  }, [saved]);

  const switchUnits = (next: UnitSystem) => {
    if (next === units) return;
    const current = getValues();
    const canonical = inputsOf(current, units, baseline.inputs);
    // Switched-off parts keep their typed values through the switch as well.
    const all = inputsOf(
      {
        ...current,
        include: {
          feed: true,
          return: true,
          wiring: true,
          deadTime: true,
          pump2: true,
          bypass: true,
        },
      },
      units,
      baseline.inputs,
    );
    const shown = valuesOf(
      {
        ...canonical,
        lines: all.lines,
        electrical: { ...canonical.electrical, wiring: all.electrical.wiring },
        injectors: { ...canonical.injectors, deadTime: all.injectors.deadTime },
        pumps: all.pumps,
        regulator: { ...canonical.regulator, bypass: all.regulator.bypass },
      },
      next,
      current.title,
      current.status,
    );
    const toShownValues = { ...shown, include: current.include };
    configured.current = { ...configured.current, units: next };
    store.configure({ units: next }, toShownValues);
    reset(toShownValues);
    setUnits(next);
    void setUnitsAction(initialActionState, { units: next });
  };

  // "Re-size with today's settings": the saved inputs saved again, through the normal save.
  const [resized, setResized] = useState(false);
  const resize = () =>
    start(async () => {
      const res = await saveBuildAction(initialActionState, {
        id: props.buildId,
        version,
        inputs: baseline.inputs,
        note: "Re-sized with today's shop settings",
      });
      if (res.ok && res.data) {
        setVersion(res.data.build.version);
        setResized(true);
        setSaved({
          ...res,
          message: `Re-sized with today's shop settings as version ${res.data.build.version}`,
        });
      } else setSaved(res);
    });

  const save = () =>
    start(async () => {
      if (!dirtyNow()) {
        setSaved({ ok: true, message: `Nothing to save: no changes, still version ${version}` });
        return;
      }
      const v = getValues();
      const { inputs } = store.get();
      const parsed = FuelSystemInputSchema.safeParse(inputs);
      const res = await saveBuildAction(initialActionState, {
        id: props.buildId,
        version,
        title: v.title,
        status: v.status,
        inputs,
      });
      if (res.ok && res.data) {
        const saved = res.data.build.version;
        setSaved({
          ...res,
          message:
            saved === version
              ? `Nothing to save: no changes, still version ${saved}`
              : `Saved as version ${saved}`,
        });
        setVersion(saved);
        setBaseline({
          inputs: parsed.success ? parsed.data : inputs,
          title: v.title,
          status: v.status,
        });
      } else setSaved(res);
    });

  /** A number field: label and unit from the registry, in the person's units. */
  const num = (name: string, label?: string) => {
    const f = inputField(name)!;
    return (
      <NumberField
        key={name}
        register={register}
        name={name}
        label={label ?? f.short ?? f.label}
        unit={entryUnitOf(f.quantity!, units)}
        store={store}
      />
    );
  };
  /** A select of a code field, its options labelled by the registry unless given. */
  /** A select; a field of the sizing takes its label and its options' labels from the registry. */
  const select = (name: string, given?: { label: string; options: [string, string][] }) => {
    const f = inputField(name);
    return (
      <LiveSelectField
        key={name}
        store={store}
        field={name}
        label={given?.label ?? f?.short ?? f?.label ?? name}
        id={idOf(name)}
        {...register(name as never)}
      >
        {(given?.options ?? Object.entries(f?.options ?? {})).map(([v, l]) => (
          <option key={v} value={v}>
            {l}
          </option>
        ))}
      </LiveSelectField>
    );
  };
  const toggle = (key: Optional, label: string) => (
    <label className="flex items-center gap-2 text-sm">
      <input
        type="checkbox"
        className="size-4 accent-copper-600"
        {...register(`include.${key}` as const)}
      />
      {label}
    </label>
  );
  const anPicker = (side: "feed" | "return") => (
    <AnPicker
      side={side}
      store={store}
      units={units}
      onPick={(mm) =>
        setValue(
          `lines.${side}.insideDiameterMm` as never,
          toShown("diameter", mm, units) as never,
          {
            shouldDirty: true,
          },
        )
      }
    />
  );
  const lineFields = (side: "feed" | "return") => [
    <div key={`${side}-an`} className="sm:col-span-2">
      {anPicker(side)}
    </div>,
    num(`lines.${side}.insideDiameterMm`),
    num(`lines.${side}.lengthM`),
    num(`lines.${side}.fittingsK`),
  ];

  const changes = resized ? [] : (props.settingsChanges ?? []);
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
      <SettingsChangedNote
        changes={changes}
        className="lg:col-span-2"
        heading={<>Version {version} was sized with the shop&apos;s settings of the time.</>}
        action={
          !props.readOnly ? (
            <Button
              type="button"
              variant="secondary"
              className="mt-2"
              disabled={pending}
              onClick={resize}
            >
              Re-size with today&apos;s settings
            </Button>
          ) : null
        }
      >
        Today&apos;s settings change what is sized; the figures on this page use today&apos;s, the
        saved version and its spec sheet keep the old ones:
      </SettingsChangedNote>
      {props.readOnly && props.readOnlyReason ? (
        <p
          id="b-readonly-note"
          role="note"
          data-testid="read-only-note"
          className="rounded-lg border border-ink-300 bg-ink-100 p-4 text-sm text-ink-800 lg:col-span-2"
        >
          <span aria-hidden="true">🔒 </span>
          {props.readOnlyReason.note}
        </p>
      ) : null}
      <LockedLabel.Provider value={props.readOnly ? (props.readOnlyReason?.label ?? null) : null}>
        <form
          ref={formRef}
          aria-label="Build inputs"
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            if (pending) return;
            const live = store.get();
            if (live.sized && live.titleOk) save();
            else {
              setSaved({ ok: false, message: "Check the highlighted fields" });
              focusFirstInvalid();
            }
          }}
        >
          {/* The key figures stay pinned above the inputs as they scroll, at every width. */}
          <LivePinnedSummary store={store} units={units} />
          <fieldset
            disabled={props.readOnly}
            aria-describedby={
              props.readOnly && props.readOnlyReason ? "b-readonly-note" : undefined
            }
            className="space-y-4"
          >
            <div className="flex flex-wrap items-end gap-3">
              <div className="min-w-64 flex-1">
                <label htmlFor="b-title" className="block text-sm font-medium text-ink-700">
                  Title
                </label>
                <TitleInput store={store} {...register("title")} />
              </div>
              <StatusControl
                register={register}
                status={baseline.status}
                facts={props.statusFacts}
                store={store}
              />
            </div>
          </fieldset>
          <UnitToggle value={units} onChange={switchUnits} />
          <fieldset
            disabled={props.readOnly}
            aria-describedby={
              props.readOnly && props.readOnlyReason ? "b-readonly-note" : undefined
            }
            className="mt-4 space-y-4"
          >
            <Section title="Engine">
              {num("engine.cylinders")}
              {num("engine.displacementL")}
              {select("engine.aspiration")}
              {num("engine.maxBoostKpa")}
              {num("engine.redlineRpm")}
              {num("engine.idleRpm")}
            </Section>
            <Section title="Idle and air conditions">
              {num("engine.idleManifoldKpaAbs")}
              {num("engine.idleVolumetricEfficiency")}
              {num("engine.intakeTempC")}
              {num("engine.ambientKpaAbs")}
            </Section>
            <Section title="Power goal">
              {num("target.powerKw")}
              {select("target.measuredAt")}
              {select("target.driveType")}
              <div>
                {num("target.drivetrainLossPct")}
                <LossFromShop control={control} settings={props.sizingSettings} units={units} />
              </div>
            </Section>
            <Section title="Fuel and blend range">
              {num("fuel.ethanolMinVolPct")}
              {num("fuel.ethanolMaxVolPct")}
              {num("fuel.bsfcGPerKwh")}
              {num("fuel.bsfcEthanolVolPct")}
              {num("fuel.targetLambda")}
              <ShopBsfcOffer
                store={store}
                shopBsfc={props.shopBsfc ?? []}
                units={units}
                onUse={(g, ethanolVolPct) => {
                  setValue("fuel.bsfcGPerKwh" as never, toShown("bsfc", g, units) as never, {
                    shouldDirty: true,
                  });
                  // The measured figure belongs to the fuel it was measured on (calc-spec §2).
                  setValue("fuel.bsfcEthanolVolPct" as never, ethanolVolPct as never, {
                    shouldDirty: true,
                  });
                }}
              />
            </Section>
            <Section
              title="Injectors"
              toggle={
                <div className="mb-1">
                  {toggle("deadTime", "Use the injector's dead-time table")}
                </div>
              }
            >
              {num("injectors.count")}
              {num("injectors.ratedFlowCcPerMin")}
              {num("injectors.ratedPressureKpa")}
              {num("injectors.minPulseWidthMs")}
              {num("injectors.ratingFluidDensityKgPerL")}
              <Included control={control} part="deadTime">
                <div className="sm:col-span-2">
                  <LiveErrors
                    store={store}
                    render={(errors) => (
                      <DeadTimeGrid
                        control={control as never}
                        register={register as never}
                        setValue={setValue as never}
                        pressureUnit={unitOf("pressure", units)}
                        errors={errors}
                        toNumber={toNumber}
                      />
                    )}
                  />
                </div>
              </Included>
            </Section>
            <Section
              title="Regulator"
              toggle={
                <div className="mb-1">
                  {toggle("bypass", "Check the regulator's bypass (return) capacity")}
                </div>
              }
            >
              {select("regulator.type")}
              {num("regulator.basePressureKpa")}
              <NotFixed control={control}>{num("regulator.risingRateRatio")}</NotFixed>
              <Included control={control} part="bypass">
                {num("regulator.bypass.flowLPerH")}
                {num("regulator.bypass.atPressureKpa")}
              </Included>
            </Section>
            <Section title="Pump">
              {num("pumps.0.quantity")}
              <LiveErrors
                store={store}
                render={(errors) => (
                  <PumpCurves pump={0} control={control as never} num={num} errors={errors} />
                )}
              />
            </Section>
            <Section
              title="Second pump"
              when={{ control, part: "pump2" }}
              toggle={
                <div className="mb-1">
                  {toggle(
                    "pump2",
                    "Add a second pump (another model, or a stage switched on by boost)",
                  )}
                </div>
              }
            >
              {num("pumps.1.quantity")}
              {num("pumps.1.switchOnBoostKpa")}
              <LiveErrors
                store={store}
                render={(errors) => (
                  <PumpCurves pump={1} control={control as never} num={num} errors={errors} />
                )}
              />
            </Section>
            <Section
              title="Electrical"
              toggle={
                <div className="mb-1">
                  {toggle("wiring", "Work out the voltage from the wiring")}
                </div>
              }
            >
              {num("electrical.voltageAtPump")}
              {num("electrical.injectorVoltage")}
              <Included control={control} part="wiring">
                {num("electrical.wiring.sourceVoltage")}
                {num("electrical.wiring.gaugeAwg")}
                {num("electrical.wiring.roundTripLengthM")}
                {num("electrical.wiring.currentA")}
              </Included>
            </Section>
            <Section title="Filters">
              {num("filters.prePumpDropKpa")}
              {num("filters.postPumpDropKpa")}
            </Section>
            <Section
              title="Feed line"
              when={{ control, part: "feed" }}
              toggle={toggle("feed", "Size the feed line (tank to rail)")}
            >
              {lineFields("feed")}
            </Section>
            <Section
              title="Return line"
              when={{ control, part: "return" }}
              toggle={toggle("return", "Size the return line (regulator to tank)")}
            >
              {lineFields("return")}
            </Section>
            {!props.readOnly ? (
              <div
                data-sticky-bar="bottom"
                className="sticky bottom-0 flex flex-wrap items-center gap-4 border-t border-ink-200 bg-ink-50 py-3"
              >
                {/* Not `disabled` while saving: a disabled button drops the focus to the page. */}
                <Button
                  type="submit"
                  aria-disabled={pending}
                  className="aria-disabled:cursor-not-allowed aria-disabled:bg-ink-300"
                >
                  {pending ? "Saving…" : "Save build"}
                </Button>
                <VersionNote
                  store={store}
                  version={version}
                  baseline={baseline}
                  baselineJson={baselineJson}
                />
                <FormStatus ok={saved?.ok} message={saved?.message} />
                {conflict ? (
                  <div
                    className="w-full text-sm text-caution-700"
                    data-testid="conflict"
                    role="status"
                  >
                    <p>
                      ▲ {conflict.updatedByName ?? "Someone"} saved version {conflict.version} (“
                      {conflict.title}”) at <LocalTime value={conflict.updatedAt} />. Your entries
                      are still here; nothing was overwritten. Reload to take theirs, then re-apply
                      yours.
                    </p>
                    <ConflictChanges store={store} theirs={conflict.inputs} units={units} />
                  </div>
                ) : null}
              </div>
            ) : null}
          </fieldset>
        </form>
      </LockedLabel.Provider>
      <div id="results" className="min-w-0 scroll-mt-4">
        <LiveResults store={store} units={units} />
      </div>
    </div>
  );
}

/** Whether the form differs from the last saved version (title, status or what the inputs parse to). */
function isDirty(
  s: Pick<LiveState, "title" | "status" | "inputs">,
  baseline: { title: string; status: BuildStatus },
  baselineJson: string,
) {
  if (s.title !== baseline.title || s.status !== baseline.status) return true;
  const parsed = FuelSystemInputSchema.safeParse(s.inputs);
  return !parsed.success || stableJson(parsed.data) !== baselineJson;
}

/**
 * "version 3 · unsaved changes", and the guard that keeps unsaved changes from being lost by
 * leaving the page by accident (a reload or an in-app link). Worked out after the paint
 * (`useAfterPaint`): the parse it takes runs after the keystroke's figures are on screen.
 */
function VersionNote({
  store,
  version,
  baseline,
  baselineJson,
}: {
  store: LiveSizing<Values>;
  version: number;
  baseline: { title: string; status: BuildStatus };
  baselineJson: string;
}) {
  const title = useLive(store, (s) => s.title);
  const status = useLive(store, (s) => s.status);
  const inputs = useAfterPaint(useLive(store, (s) => s.inputs));
  const inputsChanged = useMemo(
    () =>
      isDirty({ title: baseline.title, status: baseline.status, inputs }, baseline, baselineJson),
    [inputs, baseline, baselineJson],
  );
  const dirty = title !== baseline.title || status !== baseline.status || inputsChanged;
  useLeaveGuard(dirty);
  return (
    <span className="figure text-sm text-ink-600">
      version {version}
      {dirty ? " · unsaved changes" : ""}
    </span>
  );
}

/** The results beside the inputs: the key figures on the keystroke, the rest a beat behind. */
function LiveResults({ store, units }: { store: LiveSizing<Values>; units: UnitSystem }) {
  const result = useLive(store, (s) => s.result);
  const sized = useLive(store, (s) => s.sized);
  const later = useAfterPaint(sized);
  return (
    <>
      <FiguresAnnouncer result={result} units={units} />
      <ResultsPanel result={result} units={units} workingFrom={later?.result ?? null} />
      {later ? <LaterFigures input={later.input} result={later.result} units={units} /> : null}
    </>
  );
}

function LivePinnedSummary({ store, units }: { store: LiveSizing<Values>; units: UnitSystem }) {
  const result = useLive(store, (s) => s.result);
  return <PinnedSummary result={result} units={units} resultsId="results" />;
}

function TitleInput({
  store,
  ...input
}: { store: LiveSizing<Values> } & React.InputHTMLAttributes<HTMLInputElement> & {
    ref?: React.Ref<HTMLInputElement>;
  }) {
  const error = useLive(store, (s) => s.errors.title);
  return (
    <>
      <input
        id="b-title"
        aria-invalid={Boolean(error)}
        aria-describedby={error ? "b-title-err" : undefined}
        className="mt-1 block w-full rounded-md border border-ink-300 bg-white px-3 py-2 font-display text-xl font-semibold aria-[invalid=true]:border-2 aria-[invalid=true]:border-danger-600"
        {...input}
      />
      {error ? (
        <p id="b-title-err" role="alert" className="mt-1 text-sm text-danger-700">
          ✕ {error}
        </p>
      ) : null}
    </>
  );
}

function LiveSelectField({
  store,
  field,
  ...props
}: {
  store: LiveSizing<Values>;
  /** The field's path, whose message it shows. */
  field: string;
  label: string;
  id: string;
  children: React.ReactNode;
} & SelectHTMLAttributes<HTMLSelectElement> & { ref?: React.Ref<HTMLSelectElement> }) {
  const error = useLive(store, (s) => s.errors[field]);
  return <SelectField error={error} {...props} />;
}

/** The form's messages by path, for the grids that mark many cells (dead time, pump curves). */
function LiveErrors({
  store,
  render,
}: {
  store: LiveSizing<Values>;
  render: (errors: Record<string, string>) => React.ReactNode;
}) {
  return <>{render(useLive(store, (s) => s.errors))}</>;
}

/** Its fields while an optional part of the build is switched on. */
function Included({
  control,
  part,
  children,
}: {
  control: Control<Values>;
  part: Optional;
  children: React.ReactNode;
}) {
  const on = useWatch({ control, name: `include.${part}` });
  return on ? <>{children}</> : null;
}

/** Fields that mean something only with a boost-referenced regulator. */
function NotFixed({ control, children }: { control: Control<Values>; children: React.ReactNode }) {
  const type = useWatch({ control, name: "regulator.type" });
  return type !== "fixed" ? <>{children}</> : null;
}

/** Under a blank drivetrain loss: the shop's figure for the drive type chosen. */
function LossFromShop({
  control,
  settings,
  units,
}: {
  control: Control<Values>;
  settings: SizingSettings;
  units: UnitSystem;
}) {
  const [loss, drive] = useWatch({
    control,
    name: ["target.drivetrainLossPct", "target.driveType"],
  });
  if (loss !== undefined && String(loss) !== "") return null;
  return (
    <p className="mt-1 text-sm text-ink-600" data-testid="loss-from-shop">
      Blank: the shop&apos;s{" "}
      {formatValue("percent", settings.drivetrainLossPct[drive ?? DEFAULT_DRIVE_TYPE], units, 0)}{" "}
      for this drive.
    </p>
  );
}

/** The hose size picker of a line: picks the typical inside diameter of an AN size. */
function AnPicker({
  side,
  store,
  units,
  onPick,
}: {
  side: "feed" | "return";
  store: LiveSizing<Values>;
  units: UnitSystem;
  onPick: (insideDiameterMm: number) => void;
}) {
  const idMm = useLive(store, (s) => s.inputs.lines?.[side]?.insideDiameterMm);
  const match = AN_SIZES.find(
    (s) => idMm !== undefined && Math.abs(s.typicalHoseIdMm - idMm) < 0.05,
  );
  return (
    <SelectField
      label="Hose size"
      id={`b-${side}-an`}
      value={match ? String(match.dash) : ""}
      onChange={(e) => {
        const s = AN_SIZES.find((x) => String(x.dash) === e.target.value);
        if (s) onPick(s.typicalHoseIdMm);
      }}
    >
      <option value="">Other (type the inside diameter)</option>
      {AN_SIZES.map((s) => (
        <option key={s.dash} value={s.dash}>
          {formatValue("anDash", s.dash, units)} (typical hose ID{" "}
          {formatValue("diameter", s.typicalHoseIdMm, units)})
        </option>
      ))}
    </SelectField>
  );
}

/** On a stale save: yours beside theirs, field by field. */
function ConflictChanges({
  store,
  theirs,
  units,
}: {
  store: LiveSizing<Values>;
  theirs: FuelSystemInput;
  units: UnitSystem;
}) {
  const inputs = useLive(store, (s) => s.inputs);
  return (
    <ConflictTable
      rows={diffInputs(inputs, theirs, units).map((c) => ({
        key: c.path,
        label: c.label,
        yours: c.before,
        theirs: c.after,
      }))}
    />
  );
}

/** "Use this shop's measured BSFC (n builds)": the shop's own figure beside the rule of thumb. */
function ShopBsfcOffer({
  store,
  shopBsfc,
  units,
  onUse,
}: {
  store: LiveSizing<Values>;
  shopBsfc: ShopBsfcRow[];
  units: UnitSystem;
  onUse: (gPerKwh: number, ethanolVolPct: number) => void;
}) {
  const ethanolMax = useLive(store, (s) => s.inputs.fuel?.ethanolMaxVolPct);
  const aspiration = useLive(store, (s) => s.inputs.engine?.aspiration);
  const current = useLive(store, (s) => s.inputs.fuel?.bsfcGPerKwh);
  const row = shopBsfcFor(shopBsfc, Number(ethanolMax), aspiration ?? "na");
  const fmt = (g: number) => formatValue("bsfc", g, units, units === "metric" ? 0 : 2);
  if (!row) {
    return (
      <p className="text-sm text-ink-600 sm:col-span-2" data-testid="shop-bsfc">
        No verified builds with logged power for this fuel and aspiration yet; the rule of thumb
        applies.
      </p>
    );
  }
  const mean = Math.round(row.meanGPerKwh);
  const inUse = current !== undefined && Math.abs(current - mean) < 0.5;
  return (
    <div
      className="rounded-md border border-copper-100 bg-copper-50 p-3 text-sm sm:col-span-2"
      data-testid="shop-bsfc"
    >
      <p>
        This shop measured <span className="figure font-semibold">{fmt(mean)}</span>
        {` on ${FUEL_CLASS_LABELS[row.fuel]} fuel, ${ASPIRATION_CLASS_LABELS[row.aspiration].toLowerCase()}${row.builds > 1 ? ` (range ${fmt(row.minGPerKwh)} – ${fmt(row.maxGPerKwh)})` : ""}.`}
      </p>
      <div className="mt-2">
        {inUse ? (
          <span className="text-ok-700">✓ Using this shop&apos;s measured BSFC</span>
        ) : (
          <Button
            type="button"
            variant="ghost"
            onClick={() => onUse(mean, Math.round(row.meanEthanolVolPct ?? 0))}
          >
            {`Use this shop's measured BSFC (${row.builds} ${row.builds === 1 ? "build" : "builds"})`}
          </Button>
        )}
      </div>
    </div>
  );
}
