"use client";

import { useEffect, useId, useRef, useState, type ReactNode } from "react";
import useSWR from "swr";

import { fetcher } from "@/lib/fetcher";

export interface ComboOption<T> {
  id: string;
  label: string;
  /** A second line: SKU, price and free stock; e-mail and phone. */
  detail?: ReactNode;
  value: T;
}

/**
 * Search as you type (ARIA 1.2 combobox with a listbox): each change asks the API through SWR
 * (the one fetcher; `url(q)` is the key, null while the text is too short), ↓/↑ move through the
 * answers, Enter picks one, Escape closes the list. What is picked goes to `onPick`; the box then
 * empties for the next search.
 */
export function SearchCombobox<R, T>({
  label,
  placeholder,
  url,
  options,
  onPick,
  empty = "Nothing matches",
  minLength = 1,
}: {
  label: string;
  placeholder?: string;
  url: (q: string) => string | null;
  options: (response: R) => ComboOption<T>[];
  onPick: (value: T) => void;
  empty?: string;
  minLength?: number;
}) {
  const id = useId();
  const [text, setText] = useState("");
  const [query, setQuery] = useState("");
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(0);
  const input = useRef<HTMLInputElement>(null);

  // A short pause after the last keystroke before asking the server.
  useEffect(() => {
    const t = setTimeout(() => setQuery(text.trim()), 150);
    return () => clearTimeout(t);
  }, [text]);

  const key = query.length >= minLength ? url(query) : null;
  const { data, error, isLoading } = useSWR<R>(key, fetcher, { keepPreviousData: true });
  const list = key && data ? options(data) : [];
  const shown = open && key !== null;
  const at = Math.min(active, Math.max(0, list.length - 1));

  const pick = (o: ComboOption<T>) => {
    onPick(o.value);
    setText("");
    setQuery("");
    setOpen(false);
    setActive(0);
    input.current?.focus();
  };

  const status = !key
    ? ""
    : error
      ? `✕ ${(error as Error).message}`
      : isLoading && !data
        ? "Searching…"
        : list.length === 0
          ? empty
          : `${list.length} found; ↓ and Enter to choose`;

  return (
    // A search is an editing aid: not printed.
    <div className="relative w-full max-w-xl print:hidden">
      <label htmlFor={`${id}-input`} className="block text-sm font-medium text-ink-700">
        {label}
      </label>
      <input
        ref={input}
        id={`${id}-input`}
        type="text"
        role="combobox"
        autoComplete="off"
        aria-autocomplete="list"
        aria-expanded={shown && list.length > 0}
        aria-controls={`${id}-list`}
        aria-activedescendant={shown && list[at] ? `${id}-opt-${at}` : undefined}
        aria-describedby={`${id}-status`}
        placeholder={placeholder}
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          setOpen(true);
          setActive(0);
        }}
        onFocus={() => setOpen(true)}
        onBlur={() => setTimeout(() => setOpen(false), 150)}
        onKeyDown={(e) => {
          if (e.key === "ArrowDown") {
            e.preventDefault();
            setOpen(true);
            setActive(Math.min(at + 1, list.length - 1));
          } else if (e.key === "ArrowUp") {
            e.preventDefault();
            setActive(Math.max(at - 1, 0));
          } else if (e.key === "Enter") {
            if (shown && list[at]) {
              e.preventDefault();
              pick(list[at]);
            }
          } else if (e.key === "Escape") {
            setOpen(false);
          }
        }}
        className="mt-1 block w-full rounded-md border border-ink-300 bg-white px-3 py-2 text-base text-ink-900 shadow-sm focus:border-copper-500 focus:ring-2 focus:ring-copper-500/30 focus:outline-none"
      />
      <p id={`${id}-status`} aria-live="polite" className="mt-1 min-h-5 text-sm text-ink-600">
        {status}
      </p>
      <ul
        id={`${id}-list`}
        role="listbox"
        aria-label={label}
        hidden={!shown || list.length === 0}
        className="absolute z-20 mt-1 max-h-72 w-full overflow-y-auto rounded-md border border-ink-300 bg-white shadow-lg"
      >
        {list.map((o, i) => (
          <li
            key={o.id}
            id={`${id}-opt-${i}`}
            role="option"
            aria-selected={i === at}
            // Keep the input's focus: the pick happens on mouse down, before the blur.
            onMouseDown={(e) => {
              e.preventDefault();
              pick(o);
            }}
            onMouseEnter={() => setActive(i)}
            className={`cursor-pointer px-3 py-2 text-sm ${i === at ? "bg-copper-50 text-ink-900" : "text-ink-800"}`}
          >
            <span className="block font-medium">{o.label}</span>
            {o.detail ? <span className="block text-xs text-ink-600">{o.detail}</span> : null}
          </li>
        ))}
      </ul>
    </div>
  );
}
