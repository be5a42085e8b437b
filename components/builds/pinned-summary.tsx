"use client";

import { useEffect, useRef, type RefObject } from "react";

import { Signal } from "@/components/ui/status";
import type { FuelSystemResult, UnitSystem } from "@/lib/calc";

import { keyFigures } from "./key-figures";

/**
 * The build sheet's key figures pinned to the top of the screen while the inputs scroll by, at
 * every width (on a wide screen the full results stand beside the inputs but scroll away with
 * the page): duty, pump margin, power ceiling and the worst warning, with a jump to the full
 * results. Fed the result the editor already has; hidden on paper.
 *
 * It also keeps the focused field clear of the sticky bars: the page's scroll padding is the
 * height of this bar at the top and of the form's `data-sticky-bar="bottom"` (the "Save build"
 * bar) at the bottom, so Tab and Shift+Tab scroll a field fully into view.
 */
export function PinnedSummary({
  result,
  units,
  resultsId,
}: {
  result: FuelSystemResult | null;
  units: UnitSystem;
  /** The id of the full results, for the "All results" link. */
  resultsId: string;
}) {
  const ref = useRef<HTMLElement>(null);
  useStickyScrollPadding(ref);
  const figures = result ? keyFigures(result, units) : null;
  const warning = figures?.find((f) => f.key === "warning");
  return (
    <aside
      ref={ref}
      aria-label="Key figures"
      data-testid="pinned-summary"
      className="sticky top-0 z-20 -mx-4 mb-4 border-b border-ink-200 bg-white/95 px-4 py-2 shadow-sm backdrop-blur-sm print:hidden"
    >
      {figures ? (
        <>
          <dl className="grid grid-cols-3 gap-x-3 text-sm">
            {figures
              .filter((f) => f.key !== "warning")
              .map((f) => (
                <div key={f.key} className="min-w-0" data-testid={`pinned-${f.key}`}>
                  <dt className="truncate text-xs text-ink-600">{f.label}</dt>
                  <dd className="figure font-bold">
                    {f.level !== "ok" ? (
                      <Signal level={f.level}>{f.text}</Signal>
                    ) : (
                      <span>{f.text}</span>
                    )}
                  </dd>
                </div>
              ))}
          </dl>
          <div className="mt-1 flex items-baseline gap-2 text-xs">
            <p className="line-clamp-2 min-w-0 flex-1 text-ink-700" data-testid="pinned-warning">
              {warning?.badge ? (
                <>
                  <Signal level={warning.level}>{warning.badge}</Signal> {warning.text}
                </>
              ) : (
                <span className="text-ok-700">✓ No warnings</span>
              )}
            </p>
            <a href={`#${resultsId}`} className="shrink-0 font-semibold text-copper-700 underline">
              All results ↓
            </a>
          </div>
        </>
      ) : (
        <p className="text-sm text-ink-700">No figures yet: fix the highlighted fields.</p>
      )}
    </aside>
  );
}

/** Sets the page's scroll padding to the heights of the sticky bars while they are on screen. */
function useStickyScrollPadding(top: RefObject<HTMLElement | null>) {
  useEffect(() => {
    const bar = top.current;
    if (!bar) return;
    const root = document.documentElement;
    const bottom = () =>
      bar.closest("form")?.querySelector<HTMLElement>('[data-sticky-bar="bottom"]');
    const measure = () => {
      // A little room beyond the bars, so the focus ring shows too.
      root.style.scrollPaddingTop = `${Math.ceil(bar.getBoundingClientRect().height) + 8}px`;
      const b = bottom();
      root.style.scrollPaddingBottom = b
        ? `${Math.ceil(b.getBoundingClientRect().height) + 8}px`
        : "";
    };
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(bar);
    const b = bottom();
    if (b) observer.observe(b);
    return () => {
      observer.disconnect();
      root.style.scrollPaddingTop = "";
      root.style.scrollPaddingBottom = "";
    };
  }, [top]);
}
