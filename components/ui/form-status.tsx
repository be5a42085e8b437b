"use client";

import { useEffect, useRef } from "react";

/**
 * Form status line, announced to screen readers. When a message arrives and the focus has been
 * lost (the button that acted was disabled while it worked, or is gone: "Record deposit paid"
 * once the deposit is recorded), the focus moves to the message, so the next Tab goes on from
 * the form rather than from the top of the page.
 */
export function FormStatus({ ok, message }: { ok?: boolean; message?: string }) {
  const ref = useRef<HTMLParagraphElement>(null);
  useEffect(() => {
    const active = document.activeElement;
    if (message && (!active || active === document.body)) ref.current?.focus();
  }, [message, ok]);
  return (
    <p
      ref={ref}
      tabIndex={-1}
      aria-live="polite"
      data-testid="form-status"
      className={`min-h-6 text-sm font-medium ${ok ? "text-ok-700" : "text-danger-700"}`}
    >
      {message ? (ok ? "✓ " : "✕ ") + message : ""}
    </p>
  );
}
