"use client";

import dynamic from "next/dynamic";
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import useSWR from "swr";

import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/field";
import { FormStatus, Signal } from "@/components/ui/status";
import { initialActionState } from "@/lib/actions/state";
import { formatWarning, SEVERITY_LABELS } from "@/lib/calc/messages";
import { formatValue, toShown, unitOf } from "@/lib/calc/quantities";
import type { Warning } from "@/lib/calc/types";
import type { UnitSystem } from "@/lib/calc/units";
import { analyseDatalogAction, verifyDatalogAction } from "@/lib/dyno/dyno-actions";
import { fetcher } from "@/lib/fetcher";

// The pull's chart: the charting library loads when an analysis has a chart to show.
const PullChart = dynamic(() => import("./pull-chart").then((m) => m.PullChart), {
  ssr: false,
  loading: () => (
    <div className="h-72 rounded-lg border border-dashed border-ink-200 bg-white" aria-hidden />
  ),
});

export interface LogItem {
  id: string;
  fileName: string;
  sizeBytes: number;
  rowCount: number;
  uploadedAt: string;
  verifiedAt: string | null;
}
type Mapping = Record<
  string,
  { column?: string; kind?: string; unit?: string; afrStoich?: number } | string | undefined
>;
interface View {
  headers: string[];
  mapping: Mapping;
  remembered: boolean;
}
interface Analysis {
  peakDuty: { pct: number; rpm: number } | null;
  lambda: { meanAbsError: number; worstError: number; worstAtRpm: number } | null;
  fuelPressure: {
    lowBoostDiffKpa: number;
    fullBoostDiffKpa: number;
    dropKpa: number;
    dropPct: number;
  } | null;
  measuredFlow: { ccPerMin: number; gPerMin: number } | null;
  measuredBsfc: { gPerKwh: number; atRpm: number; powerKw: number } | null;
  warnings: Warning[];
  targetLambda: number;
  predictedPeakDutyPct: number;
}
export interface Point {
  rpm: number;
  dutyMeasured: number | null;
  dutyPredicted: number | null;
  lambda: number | null;
  lambdaTarget: number;
  fuelDiffKpa: number | null;
}

const ROLES: {
  key: string;
  label: string;
  kinds?: [string, string][];
  units?: string[];
  optional: boolean;
}[] = [
  {
    key: "duty",
    label: "Injector duty or pulse width",
    kinds: [
      ["duty_pct", "duty %"],
      ["pulse_ms", "pulse width ms"],
    ],
    optional: false,
  },
  {
    key: "mixture",
    label: "Lambda or AFR",
    kinds: [
      ["lambda", "lambda"],
      ["afr", "AFR (gasoline 14.7 scale)"],
    ],
    optional: true,
  },
  {
    key: "boost",
    label: "Boost or MAP",
    kinds: [
      ["gauge", "gauge (boost)"],
      ["absolute", "absolute (MAP)"],
    ],
    units: ["kPa", "bar", "psi"],
    optional: true,
  },
  {
    key: "fuelPressure",
    label: "Fuel pressure",
    kinds: [
      ["rail", "rail (gauge)"],
      ["differential", "differential"],
    ],
    units: ["kPa", "bar", "psi"],
    optional: true,
  },
  { key: "ethanol", label: "Ethanol content", optional: true },
  { key: "power", label: "Measured power", units: ["kW", "hp"], optional: true },
];

/** Upload a dyno log with progress; the XHR is used because fetch reports no upload progress. */
function uploadWithProgress(
  buildId: string,
  file: File,
  onProgress: (pct: number) => void,
): Promise<{
  ok: boolean;
  body: { datalog?: { id: string }; cutShort?: boolean; error?: { message: string } };
}> {
  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", `/api/v1/builds/${buildId}/datalogs`);
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
        body: {
          error: {
            message: "The upload did not reach the server; check the connection and try again",
          },
        },
      });
    xhr.send(file);
  });
}

export function DynoWorkbench({
  buildId,
  logs,
  canUpload,
  verifyRefusal,
  units = "metric",
}: {
  buildId: string;
  logs: LogItem[];
  canUpload: boolean;
  /**
   * Why "Mark verified" is not offered for this build now (lib/domain/builds.ts#canVerifyWithLog,
   * the dyno command's own rule), or null when it is.
   */
  verifyRefusal: string | null;
  /** The person's unit system: figures and flags are shown in it. */
  units?: UnitSystem;
}) {
  const router = useRouter();
  const [selected, setSelected] = useState<string | null>(logs[0]?.id ?? null);
  const [progress, setProgress] = useState<number | null>(null);
  const [status, setStatus] = useState<{ ok: boolean; message: string } | null>(null);
  const onFile = async (file: File | undefined) => {
    if (!file) return;
    if (file.size > 20 * 1024 * 1024)
      return setStatus({ ok: false, message: "The log is larger than 20 MB" });
    setStatus(null);
    setProgress(0);
    const r = await uploadWithProgress(buildId, file, setProgress);
    setProgress(null);
    if (r.ok && r.body.datalog) {
      setStatus({
        ok: true,
        message: `${file.name} uploaded${r.body.cutShort ? " — the file stops mid-row, so its partial last row was left out" : ""}`,
      });
      setSelected(r.body.datalog.id);
      router.refresh();
    } else setStatus({ ok: false, message: r.body.error?.message ?? "Upload failed" });
  };
  return (
    <div className="grid gap-6 lg:grid-cols-[18rem_1fr]">
      <aside className="space-y-4">
        {canUpload ? (
          <div className="rounded-lg border border-ink-200 bg-white p-4">
            <label className="block text-sm font-medium text-ink-800">
              Upload a dyno log <span className="font-normal text-ink-600">(CSV, up to 20 MB)</span>
              <input
                type="file"
                accept=".csv,text/csv"
                className="mt-2 block w-full text-sm"
                disabled={progress !== null}
                onChange={(e) => {
                  void onFile(e.target.files?.[0]);
                  e.target.value = "";
                }}
              />
            </label>
            {progress !== null ? (
              <div className="mt-3" role="status">
                <progress
                  max={100}
                  value={progress}
                  className="w-full"
                  aria-label="Upload progress"
                />
                <p className="text-sm text-ink-700">
                  {progress < 100 ? `Uploading… ${progress} %` : "Checking the log…"}
                </p>
              </div>
            ) : null}
            <FormStatus ok={status?.ok} message={status?.message} />
          </div>
        ) : null}
        <div className="rounded-lg border border-ink-200 bg-white p-4">
          <h2 className="font-semibold">Logs</h2>
          {logs.length === 0 ? (
            <p className="mt-1 text-sm text-ink-600">
              No logs yet. Export the pull from the ECU or logger as CSV and upload it here.
            </p>
          ) : (
            <ul className="mt-2 space-y-1 text-sm">
              {logs.map((l) => (
                <li key={l.id}>
                  <button
                    type="button"
                    onClick={() => setSelected(l.id)}
                    aria-pressed={selected === l.id}
                    className={`w-full rounded px-2 py-1 text-left ${selected === l.id ? "bg-copper-50 font-semibold" : "hover:bg-ink-100"}`}
                  >
                    {l.fileName}{" "}
                    <span className="text-ink-600">
                      · {l.rowCount} rows{l.verifiedAt ? " · verified" : ""}
                    </span>
                  </button>
                </li>
              ))}
            </ul>
          )}
        </div>
      </aside>
      {selected ? (
        <LogPanel
          key={selected}
          id={selected}
          canWrite={canUpload}
          verifyRefusal={verifyRefusal}
          units={units}
        />
      ) : (
        <p className="text-ink-600">Upload a log to compare the measured pull with the sizing.</p>
      )}
    </div>
  );
}

function LogPanel({
  id,
  canWrite,
  verifyRefusal,
  units,
}: {
  id: string;
  canWrite: boolean;
  verifyRefusal: string | null;
  units: UnitSystem;
}) {
  const v = (q: Parameters<typeof formatValue>[0], x: number, d?: number) =>
    formatValue(q, x, units, d);
  const router = useRouter();
  const { data, error } = useSWR<View>(`/api/v1/datalogs/${id}`, fetcher);
  const [mapping, setMapping] = useState<Mapping | null>(null);
  const [result, setResult] = useState<{ analysis: Analysis; series: Point[] } | null>(null);
  const [issues, setIssues] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ ok: boolean; message: string } | null>(null);
  const [pending, start] = useTransition();
  if (error) return <p className="text-danger-700">✕ {error.message}</p>;
  if (!data)
    return (
      <p role="status" className="text-ink-700">
        Reading the log…
      </p>
    );
  const m = mapping ?? data.mapping;
  const set = (key: string, v: Mapping[string]) => setMapping({ ...m, [key]: v });
  const part = (key: string) =>
    typeof m[key] === "object"
      ? (m[key] as Exclude<Mapping[string], string | undefined>)
      : undefined;
  const analyse = () =>
    start(async () => {
      setMessage(null);
      const clean = Object.fromEntries(
        Object.entries(m).filter(
          ([, v]) => v !== undefined && (typeof v === "string" ? v : v.column),
        ),
      );
      const r = await analyseDatalogAction(initialActionState, { id, mapping: clean });
      if (r.ok && r.data) {
        setResult(r.data);
        setIssues({});
      } else {
        // Field paths like `mapping.duty.column`: the issue goes to its role's column picker.
        setIssues(
          Object.fromEntries(
            Object.entries(r.fieldErrors ?? {}).map(([path, messages]) => [
              path.replace(/^mapping\./, "").split(".")[0]!,
              messages[0] ?? "",
            ]),
          ),
        );
        setMessage({ ok: false, message: r.message ?? "The pull was not analysed" });
      }
    });
  const verify = () => {
    if (!window.confirm("Mark the build verified with this log? It is saved as a new revision."))
      return;
    start(async () => {
      const r = await verifyDatalogAction(initialActionState, { id });
      setMessage(
        r.ok
          ? { ok: true, message: "The build is verified with this log" }
          : { ok: false, message: r.message ?? "The build was not verified" },
      );
      if (r.ok) router.refresh();
    });
  };
  const a = result?.analysis;
  return (
    <div className="space-y-4">
      <section aria-labelledby="map-h" className="rounded-lg border border-ink-200 bg-white p-4">
        <h2 id="map-h" className="font-semibold">
          Columns{" "}
          {data.remembered ? (
            <span className="text-sm font-normal text-ok-700">— remembered from this logger</span>
          ) : null}
        </h2>
        <div className="mt-3 grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
          <SelectField
            label="Engine speed (rpm)"
            name="map-rpm"
            value={typeof m.rpm === "string" ? m.rpm : ""}
            onChange={(e) => set("rpm", e.target.value)}
            error={issues.rpm ? [issues.rpm] : undefined}
          >
            <option value="">—</option>
            {data.headers.map((h) => (
              <option key={h} value={h}>
                {h}
              </option>
            ))}
          </SelectField>
          {ROLES.map((r) => {
            const p = part(r.key);
            return (
              <fieldset key={r.key} className="rounded border border-ink-100 p-2">
                <legend className="px-1 text-sm font-medium text-ink-700">{r.label}</legend>
                <SelectField
                  label="Column"
                  name={`map-${r.key}`}
                  value={p?.column ?? ""}
                  error={issues[r.key] ? [issues[r.key]!] : undefined}
                  onChange={(e) =>
                    set(
                      r.key,
                      e.target.value
                        ? {
                            kind: r.kinds?.[0]?.[0],
                            unit: r.units?.[0],
                            ...(r.key === "mixture" ? { afrStoich: 14.7 } : {}),
                            ...p,
                            column: e.target.value,
                          }
                        : undefined,
                    )
                  }
                >
                  <option value="">{r.optional ? "not logged" : "—"}</option>
                  {data.headers.map((h) => (
                    <option key={h} value={h}>
                      {h}
                    </option>
                  ))}
                </SelectField>
                {p?.column && r.kinds ? (
                  <SelectField
                    label="Is"
                    name={`map-${r.key}-kind`}
                    value={p.kind}
                    onChange={(e) => set(r.key, { ...p, kind: e.target.value })}
                  >
                    {r.kinds.map(([v, l]) => (
                      <option key={v} value={v}>
                        {l}
                      </option>
                    ))}
                  </SelectField>
                ) : null}
                {p?.column && r.units ? (
                  <SelectField
                    label="Unit"
                    name={`map-${r.key}-unit`}
                    value={p.unit}
                    onChange={(e) => set(r.key, { ...p, unit: e.target.value })}
                  >
                    {r.units.map((u) => (
                      <option key={u} value={u}>
                        {u}
                      </option>
                    ))}
                  </SelectField>
                ) : null}
              </fieldset>
            );
          })}
        </div>
        <div className="mt-3 flex flex-wrap items-center gap-3">
          <Button onClick={analyse} disabled={pending || !canWrite}>
            {pending && !a ? "Analysing…" : "Analyse the pull"}
          </Button>
          {a && canWrite && !verifyRefusal ? (
            <Button variant="secondary" onClick={verify} disabled={pending}>
              Mark verified
            </Button>
          ) : null}
          {a && canWrite && verifyRefusal ? (
            <p className="text-sm text-ink-700" data-testid="verify-refusal">
              {verifyRefusal}
            </p>
          ) : null}
          <FormStatus ok={message?.ok} message={message?.message} />
        </div>
      </section>
      {a && result ? (
        <>
          <section aria-label="Measured against predicted" className="grid gap-3 sm:grid-cols-3">
            <Figure
              label="Peak duty, measured"
              value={
                a.peakDuty
                  ? `${v("percent", a.peakDuty.pct)} at ${v("speed", a.peakDuty.rpm)}`
                  : "—"
              }
            />
            <Figure label="Peak duty, predicted" value={v("percent", a.predictedPeakDutyPct)} />
            <Figure
              label="Worst lambda error"
              value={
                a.lambda
                  ? `${a.lambda.worstError >= 0 ? "+" : ""}${v("ratio", a.lambda.worstError, 3)} at ${v("speed", a.lambda.worstAtRpm)} (target ${v("lambda", a.targetLambda)})`
                  : "not logged"
              }
            />
            <Figure
              label="Fuel-pressure differential"
              value={
                a.fuelPressure
                  ? `${v("pressure", a.fuelPressure.lowBoostDiffKpa)} → ${v("pressure", a.fuelPressure.fullBoostDiffKpa)} under boost`
                  : "not logged"
              }
            />
            <Figure
              label="Fuel flow at peak duty"
              value={
                a.measuredFlow
                  ? `${v("volumeFlow", (a.measuredFlow.ccPerMin * 60) / 1000)} (${v("massFlow", a.measuredFlow.gPerMin)})`
                  : "—"
              }
            />
            <Figure
              label="Measured BSFC"
              value={
                a.measuredBsfc
                  ? `${v("bsfc", a.measuredBsfc.gPerKwh)} at ${v("power", a.measuredBsfc.powerKw)}`
                  : "power not logged"
              }
            />
          </section>
          <section aria-label="Flags" className="space-y-2">
            {a.warnings.length === 0 ? (
              <Signal level="ok">No flags: the pull stayed inside the limits</Signal>
            ) : (
              a.warnings.map((raw) => {
                const w = formatWarning(raw, units);
                return (
                  <p key={w.code} className="text-sm">
                    <Signal level={w.severity}>{SEVERITY_LABELS[w.severity]}</Signal> {w.message}
                    {w.fix ? ` ${w.fix}` : ""}
                  </p>
                );
              })
            )}
          </section>
          <PullChart points={result.series} units={units} />
        </>
      ) : null}
    </div>
  );
}

function Figure({ label, value }: { label: string; value: string }) {
  return (
    <div className="rounded-lg border border-ink-200 bg-white p-3">
      <p className="text-sm text-ink-600">{label}</p>
      <p className="figure font-semibold">{value}</p>
    </div>
  );
}
