import type {
  InputHTMLAttributes,
  ReactNode,
  SelectHTMLAttributes,
  TextareaHTMLAttributes,
} from "react";

const control =
  "mt-1 block w-full rounded-md border border-ink-300 bg-white px-3 py-2 text-base text-ink-900 shadow-sm focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-500/30 aria-[invalid=true]:border-danger-600";

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

export function SelectField({
  label,
  name,
  error,
  hint,
  children,
  ...rest
}: Common & SelectHTMLAttributes<HTMLSelectElement>) {
  const id = rest.id ?? `f-${name}`;
  const has = Boolean(error && error.length);
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium text-ink-700">
        {label}
      </label>
      <select
        id={id}
        name={name}
        aria-invalid={has}
        aria-describedby={has ? `${id}-err` : undefined}
        className={control}
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
  return (
    <div>
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
