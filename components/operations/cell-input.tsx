import type { InputHTMLAttributes } from "react";

const cell =
  "figure block w-full rounded-md border border-ink-300 bg-white px-2 py-1 text-ink-900 focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-500/30 aria-[invalid=true]:border-danger-600 aria-[invalid=true]:ring-2 aria-[invalid=true]:ring-danger-600/30";

/**
 * An input inside a table cell: named for screen readers by `label` (the column header says it
 * to the eye; below 640 px the card's `data-label`), its message under it, tied by
 * aria-describedby. On paper a controlled input prints as its text in full (a long line
 * description wraps instead of being cut off at the box's edge).
 */
export function CellInput({
  id,
  label,
  error,
  className = "",
  ...rest
}: { id: string; label: string; error?: string | string[] } & Omit<
  InputHTMLAttributes<HTMLInputElement>,
  "id"
>) {
  const msg = Array.isArray(error) ? error.join(" ") : error;
  return (
    <>
      <input
        id={id}
        aria-label={label}
        aria-invalid={Boolean(msg)}
        aria-describedby={msg ? `${id}-err` : undefined}
        className={`${cell} ${className} ${typeof rest.value === "string" ? "print:hidden" : ""}`}
        {...rest}
      />
      {typeof rest.value === "string" ? (
        <span className={`print-only figure ${className}`}>{rest.value}</span>
      ) : null}
      {msg ? (
        <p id={`${id}-err`} role="alert" className="mt-1 text-xs font-medium text-danger-700">
          <span aria-hidden="true">✕ </span>
          {msg}
        </p>
      ) : null}
    </>
  );
}
