"use client";

import { UnitNumberField } from "@/components/ui/unit-number-field";
import { parseNumberText } from "@/lib/calc/number-text";

/** A labelled number box that keeps what the user typed and says when it is not a number. */
export function NumInput({
  id,
  label,
  unit,
  value,
  onChange,
  error,
  placeholder,
}: {
  id: string;
  label: string;
  unit: string;
  value: string;
  onChange: (v: string) => void;
  error?: string;
  placeholder?: string;
}) {
  return (
    <UnitNumberField
      id={id}
      label={label}
      unit={unit}
      error={error}
      value={value}
      placeholder={placeholder}
      onChange={(e) => onChange(e.target.value)}
    />
  );
}

export const toNum = (s: string): number | undefined => {
  if (s.trim() === "") return undefined;
  const n = parseNumberText(s);
  return Number.isFinite(n) ? n : undefined;
};
