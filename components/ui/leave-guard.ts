"use client";

import { useEffect } from "react";

export const LEAVE_MESSAGE = "Leave this page? Your unsaved changes will be lost.";

/**
 * While `dirty`, leaving the page asks first — a reload or closing the tab (the browser's own
 * question, `beforeunload`) and a link inside the app (the top menu, a breadcrumb), which Next
 * follows without unloading the page and so without `beforeunload`: a capturing click handler
 * on `window` runs before Next's and asks with `confirm()`; "Cancel" stops the click. Links that
 * open elsewhere (new tab, download, another site, `/api/` files, a `#` on this page) pass.
 */
export function useLeaveGuard(dirty: boolean, message = LEAVE_MESSAGE) {
  useEffect(() => {
    if (!dirty) return;
    // After "OK" on our question, a full page load must not ask again.
    let confirmedAt = 0;
    const beforeUnload = (e: BeforeUnloadEvent) => {
      if (Date.now() - confirmedAt > 2000) e.preventDefault();
    };
    const click = (e: MouseEvent) => {
      if (e.defaultPrevented || e.button !== 0 || e.metaKey || e.ctrlKey || e.shiftKey || e.altKey)
        return;
      const a = (e.target as Element | null)?.closest?.("a[href]");
      if (!(a instanceof HTMLAnchorElement)) return;
      if ((a.target && a.target !== "_self") || a.hasAttribute("download")) return;
      const url = new URL(a.href, window.location.href);
      if (url.origin !== window.location.origin || url.pathname.startsWith("/api/")) return;
      if (url.pathname === window.location.pathname && url.search === window.location.search)
        return;
      if (window.confirm(message)) confirmedAt = Date.now();
      else {
        e.preventDefault();
        e.stopImmediatePropagation();
      }
    };
    window.addEventListener("beforeunload", beforeUnload);
    window.addEventListener("click", click, true);
    return () => {
      window.removeEventListener("beforeunload", beforeUnload);
      window.removeEventListener("click", click, true);
    };
  }, [dirty, message]);
}
