"use client";

import { useEffect, useRef, useState } from "react";

import type { FuelSystemResult, UnitSystem } from "@/lib/calc";

import { changedFigures, keyFigures, type KeyFigure } from "./key-figures";

/**
 * A polite live region for screen readers: once typing pauses (`delayMs`), it says only the key
 * figures that changed since it last spoke ("Duty at E85: 84 % (Caution …); Pump margin: 12 %"),
 * never the whole results panel, and nothing while the figures stay the same. Visually hidden.
 */
export function FiguresAnnouncer({
  result,
  units,
  delayMs = 900,
}: {
  result: FuelSystemResult | null;
  units: UnitSystem;
  delayMs?: number;
}) {
  const [message, setMessage] = useState("");
  // What was last said (the figures as the page opened count as said).
  const said = useRef<KeyFigure[] | null | undefined>(undefined);
  useEffect(() => {
    if (said.current === undefined) {
      said.current = result ? keyFigures(result, units) : null;
      return;
    }
    const timer = setTimeout(() => {
      if (!result) {
        if (said.current !== null) setMessage("No figures: check the highlighted fields.");
        said.current = null;
        return;
      }
      const now = keyFigures(result, units);
      const text = changedFigures(said.current ?? null, now);
      said.current = now;
      if (text) setMessage(text);
    }, delayMs);
    return () => clearTimeout(timer);
  }, [result, units, delayMs]);
  return (
    <p
      role="status"
      aria-live="polite"
      aria-atomic="true"
      className="sr-only"
      data-testid="figures-announcer"
    >
      {message}
    </p>
  );
}
