"use client";

import { useRef, type KeyboardEvent } from "react";

import type { UnitSystem } from "@/lib/calc";

const OPTIONS: { value: UnitSystem; label: string }[] = [
  { value: "metric", label: "Metric (kPa, kW, cc/min)" },
  { value: "imperial", label: "Imperial (psi, hp, lb/h)" },
];

/**
 * Metric or imperial, as a radio group (WAI-ARIA radio group pattern): one Tab stop, the
 * arrow keys (and Home/End) move to the other system and choose it, Space or a click chooses.
 */
export function UnitToggle({
  value,
  onChange,
}: {
  value: UnitSystem;
  onChange: (next: UnitSystem) => void;
}) {
  const refs = useRef<(HTMLButtonElement | null)[]>([]);
  const onKeyDown = (e: KeyboardEvent<HTMLButtonElement>, i: number) => {
    const n = OPTIONS.length;
    const to =
      e.key === "ArrowRight" || e.key === "ArrowDown"
        ? (i + 1) % n
        : e.key === "ArrowLeft" || e.key === "ArrowUp"
          ? (i - 1 + n) % n
          : e.key === "Home"
            ? 0
            : e.key === "End"
              ? n - 1
              : -1;
    if (to < 0) return;
    e.preventDefault();
    onChange(OPTIONS[to]!.value);
    refs.current[to]?.focus();
  };
  return (
    <div
      role="radiogroup"
      aria-label="Units"
      className="mt-3 inline-flex flex-wrap rounded-md border border-ink-300 bg-white p-0.5 text-sm print:hidden"
    >
      {OPTIONS.map((o, i) => (
        <button
          key={o.value}
          ref={(el) => {
            refs.current[i] = el;
          }}
          type="button"
          role="radio"
          aria-checked={value === o.value}
          tabIndex={value === o.value ? 0 : -1}
          onClick={() => onChange(o.value)}
          onKeyDown={(e) => onKeyDown(e, i)}
          className={`rounded px-3 py-1 ${value === o.value ? "bg-ink-800 text-white" : "text-ink-700"}`}
        >
          {o.label}
        </button>
      ))}
    </div>
  );
}
