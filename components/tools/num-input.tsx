"use client";

/** A labelled number box that keeps what the user typed and says when it is not a number. */
export function NumInput({ id, label, unit, value, onChange, error }: { id: string; label: string; unit: string; value: string; onChange: (v: string) => void; error?: string }) {
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium text-ink-700">
        {label} <span className="text-ink-500">({unit})</span>
      </label>
      <input
        id={id}
        inputMode="decimal"
        value={value}
        onChange={(e) => onChange(e.target.value)}
        aria-invalid={Boolean(error)}
        aria-describedby={error ? `${id}-err` : undefined}
        className="figure mt-1 block w-full rounded-md border border-ink-300 bg-white px-3 py-2 aria-[invalid=true]:border-danger-600"
      />
      {error ? <p id={`${id}-err`} className="mt-1 text-sm text-danger-700">✕ {error}</p> : null}
    </div>
  );
}

export const toNum = (s: string): number | undefined => {
  if (s.trim() === "") return undefined;
  const n = Number(s.replace(",", "."));
  return Number.isFinite(n) ? n : undefined;
};
