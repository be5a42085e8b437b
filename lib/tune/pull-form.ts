import { parseNumberText } from "@/lib/calc/number-text";
import { formatValue, fromShown, shownText, unitOf } from "@/lib/calc/quantities";
import type { UnitSystem } from "@/lib/calc/units";

/** A pull's own fields as stored (canonical: kPa gauge, %). */
export interface PullFields {
  ethanolPct: number;
  boostTargetKpa: number | null;
  notes: string;
  powerMeasuredAt: "crank" | "wheel" | "hub";
}

/** A pull's fields as the edit form holds them, in the reader's units. */
export type PullText = Record<"ethanolPct" | "boostTarget" | "notes" | "powerMeasuredAt", string>;

/** Boost target bounds (lib/validations/tune.ts#TunePullFields), kPa gauge. */
const BOOST_MIN_KPA = 0;
const BOOST_MAX_KPA = 500;

export function pullText(p: PullFields, units: UnitSystem): PullText {
  return {
    ethanolPct: shownText("percent", p.ethanolPct, units),
    boostTarget: shownText("pressure", p.boostTargetKpa, units),
    notes: p.notes,
    powerMeasuredAt: p.powerMeasuredAt,
  };
}

const num = (text: string) => {
  const n = parseNumberText(text);
  return Number.isFinite(n) ? n : null;
};

/**
 * The form's fields back in canonical units for `updateTunePullAction`. A figure left as shown is
 * exactly what was loaded (100 kPa shown as 14.5 psi stays 100), so an unchanged save writes
 * nothing; a blank boost target is "not stated" (null); text that is no number is sent as typed
 * for the schema to name.
 */
export function pullFromText(t: PullText, units: UnitSystem, loaded: PullFields) {
  const eth = num(t.ethanolPct);
  const boost = num(t.boostTarget);
  return {
    ethanolPct: eth === null ? t.ethanolPct : fromShown("percent", eth, units, loaded.ethanolPct),
    boostTargetKpa: !t.boostTarget.trim()
      ? null
      : boost === null
        ? t.boostTarget
        : fromShown("pressure", boost, units, loaded.boostTargetKpa),
    notes: t.notes,
    powerMeasuredAt: t.powerMeasuredAt,
  };
}

/** Errors the form can say before sending, in the reader's units (the schema states kPa). */
export function pullTextErrors(t: PullText, units: UnitSystem): Record<string, string> {
  const out: Record<string, string> = {};
  const eth = num(t.ethanolPct);
  if (!t.ethanolPct.trim()) out.ethanolPct = "Enter the ethanol content";
  else if (eth === null) out.ethanolPct = "Ethanol content must be a number";
  else if (eth < 0 || eth > 100) out.ethanolPct = "Ethanol content must be between 0 and 100 %";
  if (t.boostTarget.trim()) {
    const b = num(t.boostTarget);
    if (b === null) out.boostTargetKpa = "Boost target must be a number";
    else {
      const kpa = fromShown("pressure", b, units);
      if (kpa < BOOST_MIN_KPA - 0.01 || kpa > BOOST_MAX_KPA + 0.01)
        out.boostTargetKpa = `Boost target must be between ${formatValue("pressure", BOOST_MIN_KPA, units)} and ${formatValue("pressure", BOOST_MAX_KPA, units)}`;
    }
  }
  return out;
}

/** The boost field's label unit. */
export const boostUnit = (units: UnitSystem) => unitOf("pressure", units);
