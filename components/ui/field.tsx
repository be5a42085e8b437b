import type { ComponentProps, InputHTMLAttributes, ReactNode, TextareaHTMLAttributes } from "react";

const control =
  "mt-1 block w-full rounded-md border border-ink-300 bg-white px-3 py-2 text-base text-ink-900 shadow-sm focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-500/30 aria-[invalid=true]:border-danger-600 aria-[invalid=true]:ring-2 aria-[invalid=true]:ring-danger-600/30";

const bareControl =
  "block rounded-md border border-ink-300 bg-white px-3 py-2 text-ink-900 focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-500/30";

interface Common {
  label: string;
  name: string;
  error?: string | string[];
  hint?: ReactNode;
}

function Message({ id, error, hint }: { id: string; error?: string | string[]; hint?: ReactNode }) {
  const msg = Array.isArray(error) ? error.join(" ") : error;
  return (
    <>
      {hint && !msg ? <p className="mt-1 text-sm text-ink-500">{hint}</p> : null}
      {msg ? (
        <p id={id} className="mt-1 text-sm font-medium text-danger-700" role="alert">
          <span aria-hidden="true">✕ </span>
          {msg}
        </p>
      ) : null}
    </>
  );
}

/** A labelled input with its error under it (announced, linked by aria-describedby). */
export function Field({
  label,
  name,
  error,
  hint,
  ...rest
}: Common & InputHTMLAttributes<HTMLInputElement>) {
  const id = rest.id ?? `f-${name}`;
  const has = Boolean(error && error.length);
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium text-ink-700">
        {label}
      </label>
      <input
        id={id}
        name={name}
        aria-invalid={has}
        aria-describedby={has ? `${id}-err` : undefined}
        className={control}
        {...rest}
      />
      <Message id={`${id}-err`} error={error} hint={hint} />
    </div>
  );
}

/**
 * A labelled select with its error under it. `bare` is the compact form for filter bars: the
 * label is for screen readers only and the control takes its own width. A select that is no
 * form field (a picker that fills other fields) may go without a `name`, given an `id`.
 */
export function SelectField({
  label,
  name,
  error,
  hint,
  bare = false,
  children,
  ...rest
}: Omit<Common, "name"> & { name?: string; bare?: boolean } & ComponentProps<"select">) {
  const id = rest.id ?? `f-${name}`;
  const has = Boolean(error && error.length);
  return (
    <div>
      <label htmlFor={id} className={bare ? "sr-only" : "block text-sm font-medium text-ink-700"}>
        {label}
      </label>
      <select
        id={id}
        name={name}
        aria-invalid={has}
        aria-describedby={has ? `${id}-err` : undefined}
        className={bare ? bareControl : control}
        {...rest}
      >
        {children}
      </select>
      <Message id={`${id}-err`} error={error} hint={hint} />
    </div>
  );
}

export function TextAreaField({
  label,
  name,
  error,
  hint,
  ...rest
}: Common & TextareaHTMLAttributes<HTMLTextAreaElement>) {
  const id = rest.id ?? `f-${name}`;
  const has = Boolean(error && error.length);
  // An empty box is an editing aid: not printed (a filled one prints its whole text).
  const empty = typeof rest.value === "string" && rest.value.trim() === "";
  return (
    <div className={empty ? "print:hidden" : undefined}>
      <label htmlFor={id} className="block text-sm font-medium text-ink-700">
        {label}
      </label>
      <textarea
        id={id}
        name={name}
        aria-invalid={has}
        aria-describedby={has ? `${id}-err` : undefined}
        className={control}
        rows={3}
        {...rest}
      />
      <Message id={`${id}-err`} error={error} hint={hint} />
    </div>
  );
}
