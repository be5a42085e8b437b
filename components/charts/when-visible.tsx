"use client";

import { useEffect, useRef, useState, type ReactNode } from "react";

/**
 * Renders its children once the place they go scrolls near the screen, and a placeholder of
 * `minHeight` until then — so a chart's code (loaded with next/dynamic) is fetched only when
 * someone is about to look at it, and the page does not jump when it arrives.
 */
export function WhenVisible({
  children,
  minHeight,
  label,
}: {
  children: ReactNode;
  minHeight: number;
  /** What the placeholder says while the content loads. */
  label: string;
}) {
  const ref = useRef<HTMLDivElement>(null);
  const [seen, setSeen] = useState(false);
  useEffect(() => {
    const el = ref.current;
    if (!el || seen) return;
    const io = new IntersectionObserver(
      (entries) => {
        if (entries.some((e) => e.isIntersecting)) setSeen(true);
      },
      { rootMargin: "400px 0px" },
    );
    io.observe(el);
    return () => io.disconnect();
  }, [seen]);
  if (seen) return <>{children}</>;
  return <ChartPlaceholder ref={ref} minHeight={minHeight} label={label} />;
}

/** The room a chart takes while its code loads. */
export function ChartPlaceholder({
  minHeight,
  label,
  ref,
}: {
  minHeight: number;
  label: string;
  ref?: React.Ref<HTMLDivElement>;
}) {
  return (
    <div
      ref={ref}
      style={{ minHeight }}
      className="flex items-center justify-center rounded-lg border border-dashed border-ink-200 bg-white text-sm text-ink-600"
    >
      {label}
    </div>
  );
}
