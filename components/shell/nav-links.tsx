"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

export function NavLinks({ items }: { items: { href: string; label: string }[] }) {
  const path = usePathname();
  return (
    <ul className="flex gap-1">
      {items.map((i) => {
        const active = path === i.href || path.startsWith(`${i.href}/`);
        return (
          <li key={i.href}>
            <Link
              href={i.href}
              aria-current={active ? "page" : undefined}
              className={`block rounded px-3 py-2 text-sm font-medium ${active ? "bg-ink-700 text-white underline decoration-copper-500 decoration-2 underline-offset-4" : "text-ink-200 hover:bg-ink-800 hover:text-white"}`}
            >
              {i.label}
            </Link>
          </li>
        );
      })}
    </ul>
  );
}
