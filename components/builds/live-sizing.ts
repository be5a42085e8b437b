"use client";

import { useLayoutEffect, useRef, useState } from "react";

import {
  FuelSystemInputSchema,
  issueMessages,
  sizeParsedFuelSystem,
  type FuelSystemInput,
  type FuelSystemResult,
  type ParsedFuelSystemInput,
  type UnitSystem,
} from "@/lib/calc";
import { effectiveInputs, type SizingSettings } from "@/lib/sizing/effective-inputs";
import { BuildCreateSchema } from "@/lib/validations/builds";

/**
 * The build sheet's live sizing, outside React's render: the editor feeds it the form's values on
 * every change (a react-hook-form subscription, not a re-render of the form), and each part of the
 * page reads only the slice it shows (`useLive`), so a keystroke re-renders the key figures and
 * the message of the field typed in — not the other inputs. Per change: the canonical inputs, one
 * schema parse (of the inputs with the shop's settings filled in: what lib/calc sizes and what
 * the field messages come from) and one sizing, both skipped when the inputs are the same as
 * before (a keystroke in the title). Whether anything is unsaved is worked out later, off the
 * keystroke (`isDirty`, fed a deferred value).
 */

export interface LiveConfig<V> {
  units: UnitSystem;
  settings: SizingSettings;
  /** The form's values → the build's canonical inputs (what a save sends). */
  toInputs: (values: V, units: UnitSystem) => FuelSystemInput;
  /** A refused save's field messages (by path; `inputs.` prefixes are taken off). */
  serverErrors?: Record<string, string[] | undefined>;
}

export interface LiveState {
  title: string;
  status: string;
  /** The build's own canonical inputs, as the form holds them now (unvalidated). */
  inputs: FuelSystemInput;
  /** What lib/calc sized (the inputs with the shop's settings filled in), or null when invalid. */
  sized: { input: ParsedFuelSystemInput; result: FuelSystemResult } | null;
  result: FuelSystemResult | null;
  /** Whether the title passes the schema's title rule. */
  titleOk: boolean;
  /** Field messages in the reader's units by path; the same object while they do not change. */
  errors: Record<string, string>;
}

type Values = { title?: string; status?: string };

export class LiveSizing<V extends Values> {
  private listeners = new Set<() => void>();
  private state: LiveState;
  private inputsKey = "";
  private titleKey: string | undefined;
  private titleError: string | undefined;
  private schemaErrors: Record<string, string> = {};

  constructor(
    private config: LiveConfig<V>,
    values: V,
  ) {
    this.state = this.derive(values, true);
  }

  subscribe = (listener: () => void) => {
    this.listeners.add(listener);
    return () => {
      this.listeners.delete(listener);
    };
  };

  get = () => this.state;

  /** The form changed: work out what follows and tell the readers whose slice moved. */
  update(values: V) {
    this.set(this.derive(values, false));
  }

  /** The units, settings or a save's field messages changed: everything is worked out again. */
  configure(config: Partial<LiveConfig<V>>, values: V) {
    this.config = { ...this.config, ...config };
    this.set(this.derive(values, true));
  }

  private set(next: LiveState) {
    if (next === this.state) return;
    this.state = next;
    for (const l of this.listeners) l();
  }

  private derive(values: V, force: boolean): LiveState {
    const prev = this.state as LiveState | undefined;
    const { units, settings, toInputs } = this.config;
    const fresh = toInputs(values, units);
    const key = JSON.stringify(fresh);
    // The same inputs keep their identity, so readers of them do not re-render.
    const inputs = !force && prev && key === this.inputsKey ? prev.inputs : fresh;
    let sized = prev?.sized ?? null;
    let result = prev?.result ?? null;
    let schemaErrors = this.schemaErrors;
    // Memoised by what the inputs are: the same inputs are not parsed or sized again.
    if (force || key !== this.inputsKey) {
      this.inputsKey = key;
      const parsed = safeEffective(settings, inputs);
      const boost = boostMissing(inputs);
      if (parsed.success && !boost) {
        result = sizeParsedFuelSystem(parsed.data);
        sized = { input: parsed.data, result };
        schemaErrors = {};
      } else {
        result = null;
        sized = null;
        schemaErrors = parsed.success ? {} : issueMessages(parsed.error.issues, units);
        if (boost) schemaErrors["engine.maxBoostKpa"] ??= boost;
      }
    }
    const title = values.title ?? "";
    if (force || title !== this.titleKey) {
      this.titleKey = title;
      const check = BuildCreateSchema.shape.title.safeParse(title);
      this.titleError = check.success ? undefined : check.error.issues[0]!.message;
    }
    const errors: Record<string, string> = { ...schemaErrors };
    if (this.titleError) errors.title = this.titleError;
    for (const [k, v] of Object.entries(this.config.serverErrors ?? {}))
      if (v?.[0]) errors[k.replace(/^inputs\./, "")] ??= v[0];
    this.schemaErrors = schemaErrors;
    const same = prev && sameRecord(prev.errors, errors);
    const next: LiveState = {
      title,
      status: values.status ?? "",
      inputs,
      sized,
      result,
      titleOk: this.titleError === undefined,
      errors: same ? prev.errors : errors,
    };
    return next;
  }
}

/**
 * The build's inputs with the shop's settings filled in, validated once: a value the build
 * states wins over the shop's (lib/sizing/effective-inputs), so a field the build gets wrong is
 * wrong here too, at the same path and with the same message; a stated value that clashes with a
 * shop setting (a caution level above the shop's danger level) is caught as well.
 */
function safeEffective(settings: SizingSettings, inputs: FuelSystemInput) {
  try {
    return FuelSystemInputSchema.safeParse(effectiveInputs(settings, inputs));
  } catch {
    // A shape effectiveInputs cannot read (no target or fuel): the schema says what is missing.
    return FuelSystemInputSchema.safeParse(inputs);
  }
}

/**
 * A blank boost on a turbocharged or supercharged engine: the schema reads a missing boost as 0
 * (right for the API and a naturally aspirated engine), but a person who cleared the field has
 * not said the engine makes no boost — the sheet asks rather than sizing it at 0.
 */
export function boostMissing(inputs: FuelSystemInput): string | undefined {
  const e = (inputs as { engine?: { aspiration?: unknown; maxBoostKpa?: unknown } }).engine;
  if (!e || e.aspiration === undefined || e.aspiration === "na") return undefined;
  return e.maxBoostKpa === undefined || e.maxBoostKpa === null || Number.isNaN(e.maxBoostKpa)
    ? "Boost is required for a turbocharged or supercharged engine"
    : undefined;
}

function sameRecord(a: Record<string, string>, b: Record<string, string>) {
  const ka = Object.keys(a);
  if (ka.length !== Object.keys(b).length) return false;
  return ka.every((k) => a[k] === b[k]);
}

/**
 * One slice of the live sizing; the component re-renders only when that slice changes. Kept in
 * React state (set from the store's notice, in the keystroke's own event) rather than read with
 * useSyncExternalStore: a store read that way and changed during a deferred render (the charts)
 * makes React finish that render synchronously, so a keystroke would wait for the charts.
 */
export function useLive<V extends Values, T>(store: LiveSizing<V>, select: (s: LiveState) => T): T {
  const [value, setValue] = useState(() => select(store.get()));
  const selectRef = useRef(select);
  useLayoutEffect(() => {
    selectRef.current = select;
  });
  useLayoutEffect(() => {
    const check = () => {
      const next = selectRef.current(store.get());
      setValue(() => next);
    };
    check();
    return store.subscribe(check);
  }, [store]);
  return value;
}
