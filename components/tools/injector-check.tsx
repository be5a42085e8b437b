"use client";

import { useState } from "react";
import { z } from "zod";

import { Signal } from "@/components/ui/status";
import {
  crankPowerFromWheel,
  defaultBsfc,
  fuelBlend,
  injectorFlowAtPressure,
  powerToKw,
  pressureToKpa,
} from "@/lib/calc";

import { NumInput, toNum } from "./num-input";

const QuickSchema = z.object({
  powerHp: z
    .number({ error: "Enter the wheel power" })
    .min(10, "Power must be between 10 and 5000 hp")
    .max(5000, "Power must be between 10 and 5000 hp"),
  lossPct: z
    .number({ error: "Enter the drivetrain loss" })
    .min(0, "Loss must be between 0 and 50 %")
    .max(50, "Loss must be between 0 and 50 %"),
  ethanolPct: z
    .number({ error: "Enter the ethanol content" })
    .min(0, "Ethanol must be between 0 and 100 %")
    .max(100, "Ethanol must be between 0 and 100 %"),
  count: z
    .number({ error: "Enter the injector count" })
    .int("Whole injectors only")
    .min(1, "At least one injector")
    .max(32, "At most 32 injectors"),
  flowCc: z
    .number({ error: "Enter the injector flow" })
    .min(20, "Flow must be between 20 and 10 000 cc/min")
    .max(10000, "Flow must be between 20 and 10 000 cc/min"),
  basePsi: z
    .number({ error: "Enter the base pressure" })
    .min(10, "Pressure must be between 10 and 145 psi")
    .max(145, "Pressure must be between 10 and 145 psi"),
});

export function InjectorCheck() {
  const [f, setF] = useState({
    powerHp: "500",
    lossPct: "15",
    ethanolPct: "83",
    count: "6",
    flowCc: "1000",
    basePsi: "43.5",
  });
  const set = (k: keyof typeof f) => (v: string) => setF((s) => ({ ...s, [k]: v }));
  const parsed = QuickSchema.safeParse(
    Object.fromEntries(Object.entries(f).map(([k, v]) => [k, toNum(v)])),
  );
  const err = (k: string) =>
    parsed.success ? undefined : parsed.error.issues.find((i) => i.path[0] === k)?.message;
  let out: { duty: number; need: number; ceilingHp: number } | null = null;
  if (parsed.success) {
    const d = parsed.data;
    const crank = crankPowerFromWheel({
      wheelPowerKw: powerToKw(d.powerHp, "hp"),
      drivetrainLossPct: d.lossPct,
    });
    const b = fuelBlend(d.ethanolPct);
    const bsfc = defaultBsfc({ ethanolVolPct: d.ethanolPct, aspiration: "turbo" }).bsfcGPerKwh;
    const mdot = (crank * bsfc) / 60;
    const dp = pressureToKpa(d.basePsi, "psi");
    const q = injectorFlowAtPressure({
      ratedFlowCcPerMin: d.flowCc,
      ratedPressureKpa: 300,
      differentialPressureKpa: dp,
    });
    const duty = (100 * mdot) / (b.densityKgPerL * d.count * q);
    const need = (mdot / (b.densityKgPerL * d.count * 0.8)) * Math.sqrt(300 / dp);
    const ceilingKw = (0.8 * d.count * q * b.densityKgPerL * 60) / bsfc;
    out = { duty, need, ceilingHp: (ceilingKw * (1 - d.lossPct / 100)) / 0.74569987 };
  }
  const level = !out
    ? "info"
    : out.duty >= 100
      ? "danger"
      : out.duty > 90
        ? "danger"
        : out.duty > 80
          ? "caution"
          : "ok";
  const word = { ok: "Fine", caution: "Little headroom", danger: "Too small", info: "" }[level];
  return (
    <section aria-labelledby="quick" className="rounded-lg border border-ink-200 bg-white p-5">
      <h2 id="quick" className="text-xl font-semibold">
        Quick injector check
      </h2>
      <p className="text-sm text-ink-600">
        Boosted engine, boost-referenced regulator, injectors rated at 3 bar (43.5 psi), 80 % design
        duty.
      </p>
      <div className="mt-4 grid gap-4 sm:grid-cols-2">
        <NumInput
          id="qc-p"
          label="Wheel power"
          unit="hp"
          value={f.powerHp}
          onChange={set("powerHp")}
          error={err("powerHp")}
        />
        <NumInput
          id="qc-l"
          label="Drivetrain loss"
          unit="%"
          value={f.lossPct}
          onChange={set("lossPct")}
          error={err("lossPct")}
        />
        <NumInput
          id="qc-e"
          label="Ethanol content (richest)"
          unit="%"
          value={f.ethanolPct}
          onChange={set("ethanolPct")}
          error={err("ethanolPct")}
        />
        <NumInput
          id="qc-n"
          label="Injectors"
          unit="count"
          value={f.count}
          onChange={set("count")}
          error={err("count")}
        />
        <NumInput
          id="qc-q"
          label="Injector flow at 3 bar"
          unit="cc/min"
          value={f.flowCc}
          onChange={set("flowCc")}
          error={err("flowCc")}
        />
        <NumInput
          id="qc-b"
          label="Base fuel pressure"
          unit="psi"
          value={f.basePsi}
          onChange={set("basePsi")}
          error={err("basePsi")}
        />
      </div>
      <dl aria-live="polite" className="mt-4 grid grid-cols-3 gap-4 rounded-md bg-ink-50 p-4">
        <div>
          <dt className="text-xs text-ink-600">Duty at target</dt>
          <dd className="figure text-2xl font-bold" data-testid="quick-duty">
            {out ? `${out.duty.toFixed(1)} %` : "—"}
          </dd>
          {out ? (
            <dd>
              <Signal level={level}>{word}</Signal>
            </dd>
          ) : null}
        </div>
        <div>
          <dt className="text-xs text-ink-600">Smallest rating</dt>
          <dd className="figure text-2xl font-bold">
            {out ? `${Math.ceil(out.need)}` : "—"}{" "}
            <span className="text-sm font-normal">cc/min</span>
          </dd>
        </div>
        <div>
          <dt className="text-xs text-ink-600">Ceiling (wheel)</dt>
          <dd className="figure text-2xl font-bold">
            {out ? `${Math.floor(out.ceilingHp)}` : "—"}{" "}
            <span className="text-sm font-normal">hp</span>
          </dd>
        </div>
      </dl>
    </section>
  );
}
