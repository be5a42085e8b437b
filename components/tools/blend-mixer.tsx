"use client";

import { useState } from "react";

import { ethanolFromFlexSensorHz, volumeToAdd, type VolumeToAddQuery } from "@/lib/calc/blend";
import { volumeToAddIssues } from "@/lib/calc/blend-bounds";
import { converter, fillTemplate, formatValue } from "@/lib/calc/quantities";
import type { UnitSystem } from "@/lib/calc/units";

import { NumInput, toNum } from "./num-input";

/** Starting volumes a person would type in each system (20 L / 60 L; 5 gal / 16 gal). */
const START_VOLUMES = {
  metric: { tank: "20", capacity: "60" },
  imperial: { tank: "5", capacity: "16" },
} as const;

export function BlendMixer({ units }: { units: UnitSystem }) {
  const [f, setF] = useState({
    tankVolumeL: START_VOLUMES[units].tank,
    tankEthanolVolPct: "10",
    addedEthanolVolPct: "83",
    targetEthanolVolPct: "50",
    tankCapacityL: START_VOLUMES[units].capacity,
    hz: "",
  });
  const volume = converter("volume", units);
  const volUnit = volume.unit;
  /** A volume typed in the person's units, in litres (exactly: nothing here is stored). */
  const litres = (s: string) => {
    const n = toNum(s);
    return n === undefined ? undefined : volume.from(n);
  };
  const vol = (l: number) => formatValue("volume", l, units);
  const set = (k: keyof typeof f) => (v: string) => setF((s) => ({ ...s, [k]: v }));
  const query = {
    tankVolumeL: litres(f.tankVolumeL),
    tankEthanolVolPct: toNum(f.tankEthanolVolPct),
    addedEthanolVolPct: toNum(f.addedEthanolVolPct),
    targetEthanolVolPct: toNum(f.targetEthanolVolPct),
    tankCapacityL: litres(f.tankCapacityL),
  };
  // The schema's messages without the schema library (lib/calc/blend-bounds.ts).
  const issues = volumeToAddIssues(query);
  const valid = Object.keys(issues).length === 0;
  const err = (k: keyof typeof issues) => {
    const issue = issues[k];
    if (!issue) return undefined;
    // The schema's bounds are in litres; volumes are said in the person's units.
    if (k === "tankVolumeL" || k === "tankCapacityL") {
      const what = k === "tankVolumeL" ? "Fuel in the tank" : "Tank capacity";
      const min = k === "tankVolumeL" ? 0 : 0.1;
      return toNum(f[k]) === undefined
        ? `Enter ${what.toLowerCase()}`
        : `${what} must be between ${vol(min)} and ${vol(100000)}`;
    }
    return issue;
  };
  // No issues: every required figure is there and within its limits.
  const result = valid ? volumeToAdd(query as VolumeToAddQuery) : null;
  const hz = toNum(f.hz);
  const sensor =
    hz === undefined
      ? null
      : hz >= 50 && hz <= 150
        ? `E${ethanolFromFlexSensorHz(hz).toFixed(0)}`
        : "Outside 50–150 Hz: sensor fault or water in the fuel";
  return (
    <section aria-labelledby="mixer" className="rounded-lg border border-ink-200 bg-white p-5">
      <h2 id="mixer" className="text-xl font-semibold">
        Blend mixer
      </h2>
      <p className="text-sm text-ink-600">
        How much to add to the tank to reach a target ethanol content.
      </p>
      <div className="mt-4 grid gap-4 sm:grid-cols-2">
        <NumInput
          id="mx-v"
          label="Fuel in the tank"
          unit={volUnit}
          value={f.tankVolumeL}
          onChange={set("tankVolumeL")}
          error={err("tankVolumeL")}
        />
        <NumInput
          id="mx-a"
          label="Its ethanol content"
          unit="%"
          value={f.tankEthanolVolPct}
          onChange={set("tankEthanolVolPct")}
          error={err("tankEthanolVolPct")}
        />
        <NumInput
          id="mx-b"
          label="Ethanol content of the fuel added"
          unit="%"
          value={f.addedEthanolVolPct}
          onChange={set("addedEthanolVolPct")}
          error={err("addedEthanolVolPct")}
        />
        <NumInput
          id="mx-t"
          label="Target"
          unit="%"
          value={f.targetEthanolVolPct}
          onChange={set("targetEthanolVolPct")}
          error={err("targetEthanolVolPct")}
        />
        <NumInput
          id="mx-c"
          label="Tank capacity"
          unit={volUnit}
          value={f.tankCapacityL}
          onChange={set("tankCapacityL")}
          error={err("tankCapacityL")}
        />
      </div>
      <div aria-live="polite" className="mt-4 rounded-md bg-ink-50 p-4">
        {!result ? (
          <p className="text-ink-600">Fill in the fields to see the answer.</p>
        ) : result.ok ? (
          <p className="figure text-2xl font-bold" data-testid="mix-result">
            Add {vol(result.volumeL)}{" "}
            <span className="text-base font-normal text-ink-600">
              → {vol(result.finalVolumeL)} in the tank
            </span>
          </p>
        ) : (
          <p className="font-medium text-caution-700" data-testid="mix-result">
            ▲{" "}
            {result.template
              ? fillTemplate(result.template, result.figures, units)
              : result.message}
          </p>
        )}
        <p className="mt-2 text-xs text-ink-500">
          Volumes add; the small shrink when ethanol and gasoline mix is ignored.
        </p>
      </div>
      <div className="mt-6 max-w-xs">
        <NumInput
          id="mx-hz"
          label="Flex-fuel sensor reading"
          unit="Hz"
          value={f.hz}
          onChange={set("hz")}
        />
        <p aria-live="polite" className="figure mt-2 font-semibold">
          {sensor ?? "50 Hz = E0 … 150 Hz = E100"}
        </p>
      </div>
    </section>
  );
}
