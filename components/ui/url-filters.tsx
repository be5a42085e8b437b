"use client";

import { usePathname, useRouter, useSearchParams } from "next/navigation";
import { useEffect, useRef, useState } from "react";

/**
 * Filters kept in the page's URL (searchParams): typing in `q` (after a short pause) and each
 * change of a select replace the URL, so a filtered list can be reloaded, bookmarked and shared,
 * and Back returns to it. An empty value or a select's default leaves its key out.
 */
export function useUrlFilters<K extends string>(defaults: Record<K, string>) {
  const router = useRouter();
  const pathname = usePathname();
  const params = useSearchParams();
  const read = () =>
    Object.fromEntries(
      (Object.keys(defaults) as K[]).map((k) => [k, params.get(k) ?? defaults[k]]),
    ) as Record<K, string>;
  const [values, setValues] = useState<Record<K, string>>(read);
  const timer = useRef<ReturnType<typeof setTimeout>>(undefined);

  // Back/forward or a link changes the URL: the controls follow it (not the URL this box just
  // wrote, which may lack the space being typed). Adjusted while rendering, as React advises.
  const key = params.toString();
  const [seenKey, setSeenKey] = useState(key);
  if (key !== seenKey) {
    setSeenKey(key);
    const url = read();
    if (!(Object.keys(defaults) as K[]).every((k) => (values[k].trim() || defaults[k]) === url[k]))
      setValues(url);
  }

  const push = (next: Record<K, string>) => {
    const p = new URLSearchParams(params.toString());
    for (const k of Object.keys(defaults) as K[]) {
      const v = next[k].trim();
      if (v && v !== defaults[k]) p.set(k, v);
      else p.delete(k);
    }
    const qs = p.toString();
    if (qs !== params.toString())
      router.replace(qs ? `${pathname}?${qs}` : pathname, { scroll: false });
  };

  /** Sets one filter; `typing` waits for a pause before the URL changes. */
  const set = (k: K, v: string, typing = false) => {
    const next = { ...values, [k]: v };
    setValues(next);
    clearTimeout(timer.current);
    if (typing) timer.current = setTimeout(() => push(next), 250);
    else push(next);
  };
  useEffect(() => () => clearTimeout(timer.current), []);
  return { values, set };
}
