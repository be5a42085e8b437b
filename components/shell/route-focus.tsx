"use client";

import { usePathname } from "next/navigation";
import { useEffect, useRef } from "react";

/**
 * After an in-app move to another page ("Copy as next power step" opens the new build), the
 * button that was pressed is gone and the focus would fall back to the page itself, so the next
 * Tab would start again at the skip link. When nothing has the focus, it goes to the content
 * (`#main`), from where Tab reaches the new page's first control. The first load is left alone.
 */
export function RouteFocus() {
  const pathname = usePathname();
  // The path last seen (not a "first run" flag: React's strict mode runs an effect twice).
  const last = useRef(pathname);
  useEffect(() => {
    if (last.current === pathname) return;
    last.current = pathname;
    const active = document.activeElement;
    if (!active || active === document.body)
      document.getElementById("main")?.focus({ preventScroll: true });
  }, [pathname]);
  return null;
}
