"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { useEffect, useRef, useState } from "react";

/**
 * The main nav's links. On a narrow screen they scroll sideways; while more links lie to the
 * right, a "More" arrow over a fade says so (and scrolls them on when pressed). The page's own
 * link is scrolled into view.
 */
export function NavLinks({ items }: { items: { href: string; label: string }[] }) {
  const path = usePathname();
  const list = useRef<HTMLUListElement>(null);
  const [more, setMore] = useState(false);

  useEffect(() => {
    const ul = list.current;
    if (!ul) return;
    const check = () => setMore(ul.scrollLeft + ul.clientWidth < ul.scrollWidth - 1);
    ul.querySelector<HTMLElement>("[aria-current=page]")?.scrollIntoView({
      block: "nearest",
      inline: "nearest",
    });
    check();
    ul.addEventListener("scroll", check, { passive: true });
    const resized = new ResizeObserver(check);
    resized.observe(ul);
    return () => {
      ul.removeEventListener("scroll", check);
      resized.disconnect();
    };
  }, [path]);

  return (
    <div className="relative">
      <ul ref={list} className="flex gap-1 overflow-x-auto">
        {items.map((i) => {
          const active = path === i.href || path.startsWith(`${i.href}/`);
          return (
            <li key={i.href} className="shrink-0">
              <Link
                href={i.href}
                aria-current={active ? "page" : undefined}
                className={`block rounded px-3 py-2 text-sm font-medium whitespace-nowrap ${active ? "bg-ink-700 text-white underline decoration-copper-500 decoration-2 underline-offset-4" : "text-ink-200 hover:bg-ink-800 hover:text-white"}`}
              >
                {i.label}
              </Link>
            </li>
          );
        })}
      </ul>
      {more ? (
        <button
          type="button"
          data-testid="nav-more"
          aria-label="More links: scroll the menu"
          tabIndex={-1}
          onClick={() => list.current?.scrollBy({ left: list.current.clientWidth * 0.7 })}
          className="absolute inset-y-0 right-0 flex items-center bg-gradient-to-l from-ink-900 via-ink-900/90 to-transparent pr-1 pl-6 text-sm font-semibold text-white"
        >
          More <span aria-hidden="true">›</span>
        </button>
      ) : null}
    </div>
  );
}
