"use client";

import { startTransition, useEffect, useState } from "react";

/**
 * `value`, caught up only after the browser has painted the frame that follows it: what the page
 * draws from the result is a beat behind the key figures (the charts, the working steps, the
 * settings note, the unsaved-changes check). Unlike a deferred value, whose render React may
 * start before the next frame (and whose commit then holds that frame back), this one starts
 * after the paint — a keystroke's figures reach the screen in the first frame, whatever the
 * charts cost — and in a transition, so the next keystroke interrupts it. While keys come faster
 * than frames it waits for a pause.
 */
export function useAfterPaint<T>(value: T): T {
  const [shown, setShown] = useState(value);
  useEffect(() => {
    if (Object.is(shown, value)) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const frame = requestAnimationFrame(() => {
      // The frame's callbacks run before its paint; a task queued from one runs after it.
      timer = setTimeout(() => startTransition(() => setShown(value)), 0);
    });
    return () => {
      cancelAnimationFrame(frame);
      if (timer !== undefined) clearTimeout(timer);
    };
  }, [value, shown]);
  return shown;
}
