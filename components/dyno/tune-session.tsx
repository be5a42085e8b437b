"use client";

import Link from "next/link";
import { useRef, useState, useTransition } from "react";
import useSWR from "swr";

import { Button, LinkButton } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { EmptyState, FormStatus, Signal } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import { formatWarning } from "@/lib/calc/messages";
import { parseNumberText } from "@/lib/calc/number-text";
import { converter, fillTemplate, formatNumber, formatValue, unitOf } from "@/lib/calc/quantities";
import type {
  LimitCheck,
  NextStep,
  TuneLimitKey,
  TuneLimits,
  TunePoint,
  TunePullSummary,
} from "@/lib/calc/tune";
import { LIMIT_LABELS, type LimitStatus } from "@/lib/calc/tune-labels";
import type { Warning } from "@/lib/calc/types";
import type { UnitSystem } from "@/lib/calc/units";
import { fetcher } from "@/lib/fetcher";
import {
  pullFromText,
  pullText,
  pullTextErrors,
  type PullFields,
  type PullText,
} from "@/lib/tune/pull-form";
import type { StepBasis } from "@/lib/tune/step-target";
import {
  deleteTunePullAction,
  nextPowerStepAction,
  updateTunePullAction,
} from "@/lib/tune/tune-actions";

import { limitName, pullBadge } from "./limit-badge";
import { basisText, type StepAsk } from "./step-basis";
import { CHART_GROUPS, TuneChart, type ChartPull } from "./tune-chart";
import { cleanMapping, TuneColumnPicker, type PickerMapping } from "./tune-column-picker";
import { TuneLimitsEditor, type LimitSource } from "./tune-limits-editor";

interface PullView {
  id: string;
  position: number;
  fileName: string;
  ethanolPct: number;
  boostTargetKpa: number | null;
  notes: string;
  powerMeasuredAt: "crank" | "wheel" | "hub";
  drivetrainLossPct: number;
  excluded: boolean;
  verified: boolean;
  summary: TunePullSummary;
  logNotes: Warning[];
  points: TunePoint[];
  checks: LimitCheck[];
}
interface Session {
  limits: TuneLimits;
  limitsSource: "build" | "shop" | "library";
  limitSources: Record<TuneLimitKey, LimitSource>;
  shopLimits: TuneLimits;
  shopLimitsSource: "shop" | "library";
  pulls: PullView[];
  next: { from: string; step: NextStep; basis?: StepBasis } | { from: null; reason: string };
}

const STATUS: Record<LimitStatus, { level: "ok" | "info" | "caution" | "danger"; text: string }> = {
  within: { level: "ok", text: "Within" },
  near: { level: "caution", text: "Near" },
  over: { level: "danger", text: "Over" },
  "no-data": { level: "info", text: "Not logged" },
  "not-set": { level: "info", text: "No limit set" },
};
const AT_LABEL = { crank: "crank (engine dyno)", wheel: "wheels", hub: "hubs" } as const;
const PART_LABEL = {
  injectors: "the injectors",
  pump: "the fuel pump",
  "feed-line": "the feed line",
};

/** Upload a pull: the CSV as the body, its fields in the query string (XHR for progress). */
function uploadPull(
  buildId: string,
  file: File,
  query: URLSearchParams,
  onProgress: (pct: number) => void,
): Promise<{ ok: boolean; body: UploadBody }> {
  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", `/api/v1/builds/${buildId}/tune/pulls?${query.toString()}`);
    xhr.setRequestHeader("content-type", "text/csv");
    xhr.setRequestHeader("x-file-name", file.name.replace(/[^\x20-\x7e]/g, "_"));
    xhr.upload.onprogress = (e) =>
      e.lengthComputable && onProgress(Math.round((100 * e.loaded) / e.total));
    xhr.onload = () =>
      resolve({
        ok: xhr.status < 300,
        body: (() => {
          try {
            return JSON.parse(xhr.responseText);
          } catch {
            return { error: { message: `Upload failed (${xhr.status})` } };
          }
        })(),
      });
    xhr.onerror = () =>
      resolve({
        ok: false,
        body: { error: { message: "The upload did not reach the server; try again" } },
      });
    xhr.send(file);
  });
}

/**
 * A build's tune session on its dyno page: add pulls in order (fuel, boost target, where power
 * was measured, notes, the log), overlay any of them, each pull's limits with their reasons,
 * exclude or delete a pull, the next step predicted, and "Copy as next power step".
 */
export function TuneSession({
  buildId,
  units,
  canWrite,
  canCopy,
  canSetShopLimits,
  targetMeasuredAt,
}: {
  buildId: string;
  units: UnitSystem;
  canWrite: boolean;
  canCopy: boolean;
  canSetShopLimits: boolean;
  /** Where this build's power target is measured (the next step's target is said the same way). */
  targetMeasuredAt: "wheel" | "crank";
}) {
  const [next, setNext] = useState<StepAsk>({ by: "boost" });
  const query = new URLSearchParams();
  if (next.boost) query.set("nextBoostKpa", next.boost);
  else if (next.power) query.set("nextPowerKw", next.power);
  else if (next.by) query.set("nextBy", next.by);
  const key = `/api/v1/builds/${buildId}/tune${query.size ? `?${query}` : ""}`;
  const { data, error, mutate } = useSWR<Session>(key, fetcher);
  const [overlay, setOverlay] = useState<Set<string> | null>(null);
  if (error)
    return (
      <p role="alert" className="text-sm text-danger-700">
        The tune session could not be loaded: {(error as Error).message}
      </p>
    );
  if (!data) return <p className="text-sm text-ink-600">Loading the tune session…</p>;
  const shown = overlay ?? new Set(data.pulls.filter((p) => !p.excluded).map((p) => p.id));
  const toggle = (id: string) => {
    const s = new Set(shown);
    if (s.has(id)) s.delete(id);
    else s.add(id);
    setOverlay(s);
  };
  const chartPulls: ChartPull[] = data.pulls
    .filter((p) => shown.has(p.id))
    .map((p) => ({
      key: p.id,
      label: `#${p.position} ${formatValue("ethanol", p.ethanolPct, units)}`,
      points: p.points,
      overAt: p.checks
        .filter((c) => c.status === "over" && c.atRpm !== null)
        .map((c) => ({ rpm: c.atRpm!, label: limitName(c.key) })),
    }));
  return (
    <section aria-labelledby="tune-heading" className="mb-8 space-y-4" data-testid="tune-session">
      <h2 id="tune-heading" className="text-lg font-semibold">
        Tune session
      </h2>
      <p className="text-sm text-ink-600">
        The pulls of this build in order. Power logged at the hubs or wheels is carried to the crank
        with the build&apos;s drivetrain loss before BSFC is worked out. Limits:{" "}
        {data.limitsSource === "build"
          ? `this build's own where it sets them, else ${data.shopLimitsSource === "shop" ? "the shop's defaults" : "Fuelwright's defaults"}`
          : data.limitsSource === "shop"
            ? "the shop's defaults"
            : "Fuelwright's defaults"}
        .
      </p>
      {canWrite ? <AddPull buildId={buildId} units={units} onAdded={() => mutate()} /> : null}
      {data.pulls.length === 0 ? (
        <EmptyState title="No pulls yet">
          Add the first pull&apos;s log: its fuel, the boost asked and where the dyno measured
          power.
        </EmptyState>
      ) : (
        <>
          <PullList
            pulls={data.pulls}
            units={units}
            shown={shown}
            onToggle={toggle}
            canWrite={canWrite}
            onChanged={() => mutate()}
          />
          {chartPulls.length ? (
            <div className="grid gap-4 xl:grid-cols-2">
              {CHART_GROUPS.map((g) => (
                <TuneChart key={g.id} group={g} pulls={chartPulls} units={units} />
              ))}
            </div>
          ) : (
            <p className="text-sm text-ink-600">Tick a pull to draw it.</p>
          )}
        </>
      )}
      <NextStepPanel
        session={data}
        units={units}
        buildId={buildId}
        canCopy={canCopy}
        targetMeasuredAt={targetMeasuredAt}
        onAsk={setNext}
      />
      <TuneLimitsEditor
        scope="build"
        buildId={buildId}
        units={units}
        limits={data.limits}
        sources={data.limitSources}
        base={data.shopLimits}
        baseSource={data.shopLimitsSource}
        canWrite={canWrite}
        canSetShopLimits={canSetShopLimits}
        onSaved={() => mutate()}
      />
    </section>
  );
}

interface UploadBody {
  cutShort?: boolean;
  error?: { code?: string; message: string; issues?: { path: string; message: string }[] };
  current?: { columns: string[]; units: string[]; mapping: PickerMapping; remembered: boolean };
}

/** A log the mapping could not place, held while the tuner chooses its columns. */
interface Placing {
  file: File;
  columns: string[];
  units: string[];
  mapping: PickerMapping;
  remembered: boolean;
  issues: Record<string, string>;
}

/** The field a pull's field error belongs to on the add form (`boostTargetKpa` → boostTarget). */
const ADD_FIELD: Record<string, string> = {
  ethanolPct: "ethanolPct",
  boostTargetKpa: "boostTarget",
  powerMeasuredAt: "powerMeasuredAt",
  notes: "notes",
};

function AddPull({
  buildId,
  units,
  onAdded,
}: {
  buildId: string;
  units: UnitSystem;
  onAdded: () => void;
}) {
  const formRef = useRef<HTMLFormElement>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [status, setStatus] = useState<{ ok: boolean; message: string } | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [placing, setPlacing] = useState<Placing | null>(null);

  /** Sends the file with the form's fields (and a mapping, from the column picker). */
  const send = async (file: File, mapping?: PickerMapping) => {
    const form = new FormData(formRef.current!);
    const text: PullText = {
      ethanolPct: String(form.get("ethanolPct") ?? ""),
      boostTarget: String(form.get("boostTarget") ?? ""),
      notes: String(form.get("notes") ?? "").trim(),
      powerMeasuredAt: String(form.get("powerMeasuredAt") ?? ""),
    };
    const local = pullTextErrors(text, units);
    if (Object.keys(local).length) {
      setFieldErrors(
        Object.fromEntries(Object.entries(local).map(([k, v]) => [ADD_FIELD[k] ?? k, v])),
      );
      return setStatus({ ok: false, message: "Some fields are not valid: see the fields marked" });
    }
    setFieldErrors({});
    const q = new URLSearchParams();
    const values = pullFromText(text, units, {
      ethanolPct: NaN,
      boostTargetKpa: null,
      notes: "",
      powerMeasuredAt: "wheel",
    });
    q.set("ethanolPct", String(values.ethanolPct));
    q.set("powerMeasuredAt", text.powerMeasuredAt);
    if (values.boostTargetKpa !== null) q.set("boostTargetKpa", String(values.boostTargetKpa));
    if (text.notes) q.set("notes", text.notes);
    if (mapping) q.set("mapping", JSON.stringify(cleanMapping(mapping)));
    setStatus(null);
    setProgress(0);
    const r = await uploadPull(buildId, file, q, setProgress);
    setProgress(null);
    if (r.ok) {
      setStatus({
        ok: true,
        message: `${file.name} added${r.body.cutShort ? " — the file stops mid-row, so its partial last row was left out" : ""}${mapping ? "; its columns are remembered for this logger" : ""}`,
      });
      setPlacing(null);
      formRef.current?.reset();
      onAdded();
      return;
    }
    const issues = r.body.error?.issues ?? [];
    const byField = Object.fromEntries(
      issues.filter((i) => ADD_FIELD[i.path]).map((i) => [ADD_FIELD[i.path]!, i.message]),
    );
    // Mapping issues (`mapping.duty.column`) go to their channel in the column picker.
    const byChannel = Object.fromEntries(
      issues
        .filter((i) => i.path.startsWith("mapping."))
        .map((i) => [i.path.split(".")[1]!, i.message]),
    );
    setFieldErrors(byField);
    const cur = r.body.current;
    if (r.body.error?.code === "unplaced_log" && cur)
      setPlacing({
        file,
        columns: cur.columns,
        units: cur.units,
        mapping: placing?.mapping ?? cur.mapping,
        remembered: cur.remembered,
        issues: byChannel,
      });
    else if (placing) setPlacing({ ...placing, issues: byChannel });
    setStatus({ ok: false, message: r.body.error?.message ?? "The pull was not added" });
  };

  const onSubmit = async (e: React.FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const file = new FormData(e.currentTarget).get("log");
    if (!(file instanceof File) || (!file.size && !file.name)) {
      setFieldErrors({ log: "Choose the pull's log (CSV)" });
      return setStatus({ ok: false, message: "Choose the pull's log (CSV)" });
    }
    if (!file.size) {
      setFieldErrors({ log: "This file is empty: choose the pull's log (CSV)" });
      return setStatus({
        ok: false,
        message: `The file "${file.name}" is empty: it holds no log. Choose the pull's log (CSV)`,
      });
    }
    if (file.size > 20 * 1024 * 1024) {
      setFieldErrors({ log: "The log is larger than 20 MB" });
      return setStatus({ ok: false, message: "The log is larger than 20 MB" });
    }
    setPlacing(null);
    await send(file);
  };
  return (
    <div className="space-y-3">
      <form
        ref={formRef}
        onSubmit={onSubmit}
        noValidate
        className="grid gap-3 rounded-lg border border-ink-200 bg-white p-4 sm:grid-cols-2 lg:grid-cols-5"
        aria-label="Add a pull"
      >
        <Field
          label="Pull log (CSV)"
          name="log"
          type="file"
          accept=".csv,text/csv,text/plain"
          error={fieldErrors.log}
          onChange={() => setPlacing(null)}
        />
        <Field
          label="Ethanol content (%)"
          name="ethanolPct"
          inputMode="decimal"
          defaultValue="85"
          required
          error={fieldErrors.ethanolPct}
        />
        <Field
          label={`Boost target (${unitOf("pressure", units)})`}
          name="boostTarget"
          inputMode="decimal"
          hint="Blank: not stated"
          error={fieldErrors.boostTarget}
        />
        <SelectField
          label="Power measured at"
          name="powerMeasuredAt"
          defaultValue="wheel"
          error={fieldErrors.powerMeasuredAt}
        >
          <option value="wheel">the wheels</option>
          <option value="hub">the hubs</option>
          <option value="crank">the crank (engine dyno)</option>
        </SelectField>
        <Field label="Notes" name="notes" maxLength={2000} error={fieldErrors.notes} />
        <div className="flex flex-wrap items-center gap-3 sm:col-span-2 lg:col-span-5">
          <Button type="submit" disabled={progress !== null}>
            {progress !== null ? `Uploading… ${progress} %` : "Add pull"}
          </Button>
          <div aria-live="polite">
            {status ? <FormStatus ok={status.ok} message={status.message} /> : null}
          </div>
        </div>
      </form>
      {placing ? (
        <TuneColumnPicker
          fileName={placing.file.name}
          columns={placing.columns}
          units={placing.units}
          mapping={placing.mapping}
          remembered={placing.remembered}
          issues={placing.issues}
          pending={progress !== null}
          onChange={(mapping) => setPlacing({ ...placing, mapping })}
          onRetry={() => void send(placing.file, placing.mapping)}
          onCancel={() => {
            setPlacing(null);
            setStatus(null);
          }}
        />
      ) : null}
    </div>
  );
}

function PullList({
  pulls,
  units,
  shown,
  onToggle,
  canWrite,
  onChanged,
}: {
  pulls: PullView[];
  units: UnitSystem;
  shown: Set<string>;
  onToggle: (id: string) => void;
  canWrite: boolean;
  onChanged: () => void;
}) {
  const [pending, start] = useTransition();
  const [confirming, setConfirming] = useState<string | null>(null);
  const [editing, setEditing] = useState<string | null>(null);
  const [message, setMessage] = useState<{ ok: boolean; message: string } | null>(null);
  const run = (fn: () => Promise<{ ok: boolean; message?: string }>, done: string) =>
    start(async () => {
      const r = await fn();
      setMessage({ ok: r.ok, message: r.ok ? done : (r.message ?? "That did not work") });
      setConfirming(null);
      if (r.ok) onChanged();
    });
  return (
    <div className="space-y-3">
      <div aria-live="polite">{message ? <FormStatus {...message} /> : null}</div>
      <ol className="space-y-3" aria-label="Pulls in order">
        {pulls.map((p) => {
          const badge = pullBadge(p.checks);
          const s = p.summary;
          return (
            <li
              key={p.id}
              className={`rounded-lg border bg-white p-3 ${p.excluded ? "border-dashed border-ink-300 opacity-75" : "border-ink-200"}`}
              data-testid={`pull-${p.position}`}
            >
              <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
                <label className="flex items-center gap-2 font-semibold">
                  <input
                    type="checkbox"
                    checked={shown.has(p.id)}
                    onChange={() => onToggle(p.id)}
                    aria-label={`Overlay pull ${p.position}`}
                  />
                  Pull {p.position}
                </label>
                <span>{formatValue("ethanol", p.ethanolPct, units)}</span>
                <span className="text-sm text-ink-600">
                  boost target{" "}
                  {p.boostTargetKpa === null
                    ? "not stated"
                    : formatValue("pressure", p.boostTargetKpa, units)}
                </span>
                <span className="text-sm break-all text-ink-600">{p.fileName}</span>
                {p.excluded ? <Signal level="info">Excluded</Signal> : null}
                {badge ? (
                  <Signal level={STATUS[badge.status].level}>
                    <span data-testid="pull-badge">{badge.text}</span>
                  </Signal>
                ) : null}
              </div>
              <dl className="mt-2 grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-4">
                <div>
                  <dt className="text-ink-600">Peak power at the crank</dt>
                  <dd className="figure">
                    {s.peakPower
                      ? `${formatValue("power", s.peakPower.crankKw, units)} at ${formatValue("speed", s.peakPower.rpm, units)}`
                      : "not logged"}
                  </dd>
                  {s.peakPower && p.powerMeasuredAt !== "crank" ? (
                    <dd className="text-xs text-ink-500">
                      {formatValue("power", s.peakPower.loggedKw, units)} at the{" "}
                      {AT_LABEL[p.powerMeasuredAt]},{" "}
                      {formatValue("percent", p.drivetrainLossPct, units, 0)} loss
                    </dd>
                  ) : null}
                </div>
                <div>
                  <dt className="text-ink-600">Peak torque</dt>
                  <dd className="figure">
                    {s.peakTorque ? formatValue("torque", s.peakTorque.nm, units) : "—"}
                  </dd>
                </div>
                <div>
                  <dt className="text-ink-600">Measured BSFC</dt>
                  <dd className="figure">
                    {s.measuredBsfc ? formatValue("bsfc", s.measuredBsfc.gPerKwh, units) : "—"}
                  </dd>
                </div>
                <div>
                  <dt className="text-ink-600">Peak duty</dt>
                  <dd className="figure">
                    {s.peakDuty ? formatValue("percent", s.peakDuty.pct, units) : "—"}
                  </dd>
                </div>
              </dl>
              {p.notes ? <p className="mt-1 text-sm text-ink-700">{p.notes}</p> : null}
              <details className="mt-2">
                <summary className="cursor-pointer text-sm text-copper-700">
                  Limits and what was done to the log
                </summary>
                <ul className="mt-2 space-y-1 text-sm" aria-label={`Limits of pull ${p.position}`}>
                  {p.checks.map((c) => (
                    <li key={c.key} data-testid={`limit-${c.key}`}>
                      <Signal level={STATUS[c.status].level}>{STATUS[c.status].text}</Signal>{" "}
                      <span className="font-medium">{LIMIT_LABELS[c.key]}</span>:{" "}
                      {fillTemplate(c.message, c.params, units)}
                    </li>
                  ))}
                  {[...p.logNotes, ...s.warnings].map((w, i) => {
                    const f = formatWarning(w, units);
                    return (
                      <li key={`${w.code}-${i}`} className="text-ink-700">
                        <Signal level={f.severity}>
                          {f.severity === "info" ? "Note" : "Flag"}
                        </Signal>{" "}
                        {f.message}
                        {f.fix ? ` ${f.fix}` : ""}
                      </li>
                    );
                  })}
                </ul>
              </details>
              {canWrite && editing === p.id ? (
                <PullEditor
                  pull={p}
                  units={units}
                  onDone={(saved) => {
                    setEditing(null);
                    if (saved) {
                      setMessage({ ok: true, message: saved });
                      onChanged();
                    }
                  }}
                />
              ) : null}
              {canWrite && editing !== p.id ? (
                <div className="mt-2 flex flex-wrap items-center gap-3 text-sm">
                  <LinkButton
                    disabled={pending}
                    onClick={() => {
                      setMessage(null);
                      setEditing(p.id);
                    }}
                    aria-label={`Edit pull ${p.position}`}
                  >
                    Edit
                  </LinkButton>
                  <LinkButton
                    disabled={pending}
                    onClick={() =>
                      run(
                        () =>
                          updateTunePullAction(initialActionState, {
                            id: p.id,
                            excluded: !p.excluded,
                          }),
                        p.excluded
                          ? `Pull ${p.position} is back in the session`
                          : `Pull ${p.position} excluded`,
                      )
                    }
                  >
                    {p.excluded ? "Include again" : "Exclude"}
                  </LinkButton>
                  {confirming === p.id ? (
                    <span
                      role="group"
                      aria-label={`Delete pull ${p.position}?`}
                      className="flex flex-wrap items-center gap-2"
                    >
                      <span>Delete pull {p.position} and its log? This cannot be undone.</span>
                      <Button
                        variant="danger"
                        disabled={pending}
                        onClick={() =>
                          run(
                            () => deleteTunePullAction(initialActionState, { id: p.id }),
                            `Pull ${p.position} deleted`,
                          )
                        }
                      >
                        Delete pull
                      </Button>
                      <Button variant="secondary" onClick={() => setConfirming(null)}>
                        Keep it
                      </Button>
                    </span>
                  ) : (
                    <LinkButton
                      disabled={pending || p.verified}
                      title={
                        p.verified ? "This log verified the build: exclude it instead" : undefined
                      }
                      onClick={() => setConfirming(p.id)}
                    >
                      Delete…
                    </LinkButton>
                  )}
                </div>
              ) : null}
            </li>
          );
        })}
      </ol>
    </div>
  );
}

const PULL_FIELD: Record<string, keyof PullText> = {
  ethanolPct: "ethanolPct",
  boostTargetKpa: "boostTarget",
  notes: "notes",
  powerMeasuredAt: "powerMeasuredAt",
};

/**
 * A pull's own fields on screen: fuel, boost target, where power was measured, notes. Figures in
 * the reader's units; one left as shown is saved exactly as loaded, so an unchanged save writes
 * nothing. A new fuel or power site measures the log again; the checks follow on the next read.
 */
function PullEditor({
  pull,
  units,
  onDone,
}: {
  pull: PullView;
  units: UnitSystem;
  onDone: (saved: string | null) => void;
}) {
  const loaded: PullFields = {
    ethanolPct: pull.ethanolPct,
    boostTargetKpa: pull.boostTargetKpa,
    notes: pull.notes,
    powerMeasuredAt: pull.powerMeasuredAt,
  };
  const [text, setText] = useState<PullText>(() => pullText(loaded, units));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [pending, start] = useTransition();
  const id = (f: string) => `pull-${pull.id}-${f}`;
  const set = (k: keyof PullText) => (e: { target: { value: string } }) =>
    setText((t) => ({ ...t, [k]: e.target.value }));
  const save = (e: React.FormEvent) => {
    e.preventDefault();
    const local = pullTextErrors(text, units);
    setErrors(Object.fromEntries(Object.entries(local).map(([k, v]) => [PULL_FIELD[k] ?? k, v])));
    if (Object.keys(local).length) {
      setMessage("Some fields are not valid: see the fields marked");
      // The first invalid field takes the focus.
      const first = Object.keys(local)[0]!;
      document.getElementById(id(PULL_FIELD[first] ?? first))?.focus();
      return;
    }
    if (JSON.stringify(text) === JSON.stringify(pullText(loaded, units)))
      return onDone(`Nothing to save on pull ${pull.position}`);
    start(async () => {
      const r = await updateTunePullAction(initialActionState, {
        id: pull.id,
        ...pullFromText(text, units, loaded),
      });
      if (r.ok) return onDone(`Pull ${pull.position} saved`);
      setErrors(
        Object.fromEntries(
          Object.entries(r.fieldErrors ?? {}).map(([k, v]) => [PULL_FIELD[k] ?? k, v.join(" ")]),
        ),
      );
      setMessage(r.message ?? "The pull was not saved");
    });
  };
  return (
    <form
      onSubmit={save}
      noValidate
      aria-label={`Edit pull ${pull.position}`}
      className="mt-3 grid gap-3 border-t border-ink-100 pt-3 sm:grid-cols-2"
    >
      <Field
        id={id("ethanolPct")}
        label="Ethanol content (%)"
        name="ethanolPct"
        inputMode="decimal"
        value={text.ethanolPct}
        onChange={set("ethanolPct")}
        error={errors.ethanolPct}
      />
      <Field
        id={id("boostTarget")}
        label={`Boost target (${unitOf("pressure", units)})`}
        name="boostTarget"
        inputMode="decimal"
        value={text.boostTarget}
        onChange={set("boostTarget")}
        hint="Blank: not stated"
        error={errors.boostTarget}
      />
      <SelectField
        id={id("powerMeasuredAt")}
        label="Power measured at"
        name="powerMeasuredAt"
        value={text.powerMeasuredAt}
        onChange={set("powerMeasuredAt")}
        error={errors.powerMeasuredAt}
      >
        <option value="wheel">the wheels</option>
        <option value="hub">the hubs</option>
        <option value="crank">the crank (engine dyno)</option>
      </SelectField>
      <Field
        id={id("notes")}
        label="Notes"
        name="notes"
        maxLength={2000}
        value={text.notes}
        onChange={set("notes")}
        error={errors.notes}
      />
      <div className="flex flex-wrap items-center gap-3 sm:col-span-2">
        <Button type="submit" disabled={pending}>
          {pending ? "Saving…" : "Save pull"}
        </Button>
        <Button type="button" variant="secondary" onClick={() => onDone(null)} disabled={pending}>
          Cancel
        </Button>
        <div aria-live="polite">{message ? <FormStatus ok={false} message={message} /> : null}</div>
      </div>
    </form>
  );
}

function NextStepPanel({
  session,
  units,
  buildId,
  canCopy,
  targetMeasuredAt,
  onAsk,
}: {
  session: Session;
  units: UnitSystem;
  buildId: string;
  canCopy: boolean;
  targetMeasuredAt: "wheel" | "crank";
  onAsk: (q: StepAsk) => void;
}) {
  const [kind, setKind] = useState<"boost" | "power">("boost");
  const [text, setText] = useState("");
  const [fieldError, setFieldError] = useState<string | undefined>();
  const q = kind === "boost" ? "pressure" : "power";
  const ask = (e: React.FormEvent) => {
    e.preventDefault();
    if (!text.trim()) return onAsk({ by: kind });
    const n = parseNumberText(text);
    if (!Number.isFinite(n)) return setFieldError("Enter a number");
    setFieldError(undefined);
    const canonical = converter(q, units).from(n);
    onAsk(kind === "boost" ? { boost: String(canonical) } : { power: String(canonical) });
  };
  const n = session.next;
  const from = n.from ? session.pulls.find((p) => p.id === n.from) : null;
  return (
    <section
      aria-labelledby="next-step-heading"
      className="rounded-lg border border-ink-200 bg-white p-4"
      data-testid="next-step"
    >
      <h3 id="next-step-heading" className="font-semibold">
        The next step, predicted
      </h3>
      <form onSubmit={ask} className="mt-2 flex flex-wrap items-end gap-3">
        <SelectField
          label="Step by"
          id="next-kind"
          value={kind}
          onChange={(e) => setKind(e.target.value as "boost" | "power")}
        >
          <option value="boost">boost</option>
          <option value="power">power at the crank</option>
        </SelectField>
        <Field
          label={`Next ${kind === "boost" ? "boost" : "power"} (${unitOf(q, units)})`}
          name="nextValue"
          inputMode="decimal"
          value={text}
          onChange={(e) => setText(e.target.value)}
          error={fieldError}
          hint={`Blank: the build's ${kind === "boost" ? "boost" : "power"} target`}
        />
        <Button type="submit" variant="secondary">
          Predict
        </Button>
      </form>
      <div aria-live="polite" className="mt-3">
        {n.from === null ? (
          <p className="text-sm text-ink-600">{n.reason}</p>
        ) : (
          <>
            <p className="text-sm text-ink-700">
              From pull {from?.position} ({formatValue("bsfc", n.step.bsfcGPerKwh, units)} measured,{" "}
              {formatValue("ethanol", n.step.ethanolPct, units)}): at{" "}
              <strong>{formatValue("power", n.step.crankKw, units)}</strong> at the crank and{" "}
              <strong>{formatValue("pressure", n.step.boostKpa, units)}</strong> boost —
            </p>
            {n.basis ? (
              <p className="text-xs text-ink-600" data-testid="next-step-basis">
                {basisText(n.basis, from?.position ?? 0, units)}
              </p>
            ) : null}
            <dl className="mt-2 grid grid-cols-2 gap-3 text-sm sm:grid-cols-4">
              <StepFigure
                label="Injector duty"
                value={formatValue("percent", n.step.dutyPct, units)}
                bad={n.step.dutyPct > n.step.dutyLimitPct}
                limit={`limit ${formatValue("percent", n.step.dutyLimitPct, units, 0)}`}
              />
              <StepFigure
                label="Pump margin"
                value={formatValue("percent", n.step.pumpMarginPct, units, 0)}
                bad={n.step.pumpMarginPct < n.step.minPumpMarginPct}
                limit={`at least ${formatValue("percent", n.step.minPumpMarginPct, units, 0)}`}
              />
              <StepFigure
                label="Feed-line drop"
                value={
                  n.step.feedDropKpa === null
                    ? "no feed line given"
                    : formatValue("pressureDrop", n.step.feedDropKpa, units)
                }
                bad={n.step.feedDropKpa !== null && n.step.feedDropKpa > n.step.maxLineDropKpa}
                limit={`at most ${formatValue("pressureDrop", n.step.maxLineDropKpa, units)}`}
              />
              <div>
                <dt className="text-ink-600">Runs out first</dt>
                <dd className="font-semibold" data-testid="runs-out-first">
                  {PART_LABEL[n.step.runsOutFirst.part]}, at{" "}
                  {formatValue("power", n.step.runsOutFirst.ceilingKw, units)}
                </dd>
              </div>
            </dl>
            {canCopy ? (
              <CopyAsNextStep
                buildId={buildId}
                pullId={n.from}
                units={units}
                measuredAt={targetMeasuredAt}
                suggestedCrankKw={n.step.crankKw}
                lossPct={from?.drivetrainLossPct ?? 0}
              />
            ) : null}
          </>
        )}
      </div>
    </section>
  );
}

function StepFigure({
  label,
  value,
  bad,
  limit,
}: {
  label: string;
  value: string;
  bad: boolean;
  limit: string;
}) {
  return (
    <div>
      <dt className="text-ink-600">{label}</dt>
      <dd className="figure font-semibold">
        {value} {bad ? <Signal level="danger">past the limit</Signal> : null}
      </dd>
      <dd className="text-xs text-ink-500">{limit}</dd>
    </div>
  );
}

function CopyAsNextStep({
  buildId,
  pullId,
  units,
  measuredAt,
  suggestedCrankKw,
  lossPct,
}: {
  buildId: string;
  pullId: string;
  units: UnitSystem;
  measuredAt: "wheel" | "crank";
  suggestedCrankKw: number;
  lossPct: number;
}) {
  const [open, setOpen] = useState(false);
  const [pending, start] = useTransition();
  const [result, setResult] = useState<{ ok: boolean; message?: string; id?: string } | null>(null);
  const [fieldError, setFieldError] = useState<string | undefined>();
  const suggested =
    measuredAt === "crank" ? suggestedCrankKw : suggestedCrankKw * (1 - lossPct / 100);
  const power = converter("power", units);
  const where = measuredAt === "crank" ? "at the crank" : "at the wheels";
  if (!open)
    return (
      <Button className="mt-3" variant="secondary" onClick={() => setOpen(true)}>
        Copy as next power step…
      </Button>
    );
  return (
    <form
      className="mt-3 flex flex-wrap items-end gap-3"
      aria-label="Copy as next power step"
      onSubmit={(e) => {
        e.preventDefault();
        const text = String(new FormData(e.currentTarget).get("powerTarget") ?? "");
        const n = parseNumberText(text);
        if (!Number.isFinite(n)) return setFieldError("Enter the new power target");
        setFieldError(undefined);
        start(async () => {
          const r = await nextPowerStepAction(initialActionState, {
            buildId,
            pullId,
            powerKw: power.from(n),
          });
          const id = (r.data as { build?: { id: string } } | undefined)?.build?.id;
          setResult({ ok: r.ok, message: r.message, id });
          if (!r.ok) setFieldError(r.fieldErrors?.powerKw?.join(" "));
        });
      }}
    >
      <Field
        label={`New power target ${where} (${unitOf("power", units)})`}
        name="powerTarget"
        inputMode="decimal"
        defaultValue={formatNumber("power", suggested, units)}
        error={fieldError}
      />
      <Button type="submit" disabled={pending}>
        {pending ? "Copying…" : "Make the next step"}
      </Button>
      <Button type="button" variant="secondary" onClick={() => setOpen(false)}>
        Cancel
      </Button>
      <div aria-live="polite" className="basis-full">
        {result?.ok && result.id ? (
          <p className="text-sm">
            <Signal level="ok">Done</Signal> The next step is a new build that links back here:{" "}
            <Link className="text-copper-700 underline" href={`/builds/${result.id}`}>
              open the next power step
            </Link>
          </p>
        ) : result && !result.ok ? (
          <FormStatus ok={false} message={result.message ?? "The step was not made"} />
        ) : null}
      </div>
    </form>
  );
}
