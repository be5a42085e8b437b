import type { InputHTMLAttributes } from "react";

/** A labelled number box with its unit in the label and its error under it. */
export function UnitNumberField({
  id,
  label,
  unit,
  error,
  announce = false,
  ...input
}: {
  id: string;
  label: string;
  unit: string;
  error?: string;
  announce?: boolean;
} & InputHTMLAttributes<HTMLInputElement>) {
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium text-ink-700">
        {label} <span className="text-ink-500">({unit})</span>
      </label>
      <input
        id={id}
        inputMode="decimal"
        aria-invalid={Boolean(error)}
        aria-describedby={error ? `${id}-err` : undefined}
        className="figure mt-1 block w-full rounded-md border border-ink-300 bg-white px-3 py-2 aria-[invalid=true]:border-danger-600 aria-[invalid=true]:ring-2 aria-[invalid=true]:ring-danger-600/30"
        {...input}
      />
      {error ? (
        <p
          id={`${id}-err`}
          role={announce ? "alert" : undefined}
          className="mt-1 text-sm text-danger-700"
        >
          ✕ {error}
        </p>
      ) : null}
    </div>
  );
}
