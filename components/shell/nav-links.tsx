"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { useEffect, useRef, useState } from "react";

import { inSection, type NavItem } from "./nav-items";

/** More links than this and a phone gets the "Menu" button instead of the links themselves. */
const INLINE_ON_PHONE = 2;

/**
 * The main nav's links, every one of them reachable at every width (none hidden off the end):
 * - below 640 px: a "Menu" button naming the section you are in (a page's own section, or the
 *   one that claims it, as Jobs claims an invoice: `inSection`); it opens a panel with every
 *   link in two columns (Escape or choosing a link closes it);
 * - from 640 px: the links themselves, wrapping onto a second line when they do not fit.
 * A nav with few links (the customer's) shows them at every width.
 */
export function NavLinks({ items }: { items: Pick<NavItem, "href" | "label" | "also">[] }) {
  const path = usePathname();
  // Open on the page it was opened on: a link chosen (or Back) closes it.
  const [openOn, setOpenOn] = useState<string | null>(null);
  const open = openOn === path;
  const button = useRef<HTMLButtonElement>(null);
  const current = items.find((i) => inSection(i, path));
  const menu = items.length > INLINE_ON_PHONE;

  useEffect(() => {
    if (!open) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key !== "Escape") return;
      setOpenOn(null);
      button.current?.focus();
    };
    document.addEventListener("keydown", onKey);
    return () => document.removeEventListener("keydown", onKey);
  }, [open]);

  const list = menu
    ? `${open ? "grid" : "hidden"} absolute inset-x-0 top-full z-40 grid-cols-2 gap-1 border-t border-ink-700 bg-ink-900 px-4 pt-2 pb-4 shadow-lg sm:static sm:flex sm:flex-wrap sm:border-0 sm:p-0 sm:shadow-none`
    : "flex flex-wrap gap-1";
  return (
    <>
      {menu ? (
        <button
          ref={button}
          type="button"
          aria-expanded={open}
          aria-controls="main-nav-links"
          onClick={() => setOpenOn(open ? null : path)}
          className="flex min-h-10 items-center gap-2 rounded border border-ink-600 px-3 py-1.5 text-sm font-medium text-white sm:hidden"
          data-testid="nav-menu"
        >
          <span aria-hidden="true">{open ? "✕" : "☰"}</span>
          Menu
          {current ? <span className="text-ink-200">· {current.label}</span> : null}
        </button>
      ) : null}
      <ul id="main-nav-links" className={list}>
        {items.map((i) => {
          const active = i === current;
          return (
            <li key={i.href} className="shrink-0">
              <Link
                href={i.href}
                aria-current={active ? "page" : undefined}
                onClick={() => setOpenOn(null)}
                className={`block rounded px-3 py-2 text-sm font-medium whitespace-nowrap ${active ? "bg-ink-700 text-white underline decoration-copper-500 decoration-2 underline-offset-4" : "text-ink-200 hover:bg-ink-800 hover:text-white"}`}
              >
                {i.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </>
  );
}
