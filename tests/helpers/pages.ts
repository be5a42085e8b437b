import { readdirSync } from "node:fs";
import { join, relative, sep } from "node:path";

import type { APIRequestContext } from "playwright-core";

/** Who a page is for, from its route group: staff, the customer portal, signed out, or anyone. */
export type Audience = "shop" | "portal" | "auth" | "public";

export interface AppPage {
  /** The route as the file system says it: `/builds/[id]/revisions/[version]`. */
  route: string;
  audience: Audience;
  /** Matches a path (no query) of this route. */
  pattern: RegExp;
  dynamic: boolean;
}

/**
 * Every page of the app, read from `app/**\/page.tsx` (route groups dropped, `[param]` matching
 * one segment), so a page added tomorrow is walked without editing a list. The root page (a
 * redirect) is left out.
 */
export function appPages(root = join(process.cwd(), "app")): AppPage[] {
  const out: AppPage[] = [];
  const walk = (dir: string) => {
    for (const e of readdirSync(dir, { withFileTypes: true })) {
      const full = join(dir, e.name);
      if (e.isDirectory()) {
        if (e.name !== "api" && !e.name.startsWith("_")) walk(full);
      } else if (e.name === "page.tsx" || e.name === "page.ts") {
        const segs = relative(root, dir).split(sep).filter(Boolean);
        const group = segs.find((s) => /^\(.+\)$/.test(s))?.slice(1, -1);
        const parts = segs.filter((s) => !/^\(.+\)$/.test(s));
        if (parts.length === 0) continue;
        const route = `/${parts.join("/")}`;
        const pattern = new RegExp(
          `^/${parts.map((p) => (/^\[.+\]$/.test(p) ? "[^/?#]+" : p.replace(/[.*+?^${}()|\\]/g, "\\$&"))).join("/")}$`,
        );
        out.push({
          route,
          audience: group === "shop" || group === "portal" || group === "auth" ? group : "public",
          pattern,
          dynamic: parts.some((p) => /^\[.+\]$/.test(p)),
        });
      }
    }
  };
  walk(root);
  return out.sort((a, b) => a.route.localeCompare(b.route));
}

const params = (p: AppPage) => (p.route.match(/\[/g) ?? []).length;

const hrefsIn = (html: string) =>
  [...html.matchAll(/href="(\/[^"#]*)"/g)].map((m) => m[1]!.replace(/&amp;/g, "&"));

/**
 * A URL for every page of `pages`: a static route is itself; a dynamic one is the first link to
 * it found by following links from the static pages (breadth first, as the signed-in client of
 * `request`), else `fixtures[route]`. Returns the URLs by route and the routes no link led to.
 */
export async function urlsFor(
  request: APIRequestContext,
  pages: AppPage[],
  fixtures: Record<string, string> = {},
  maxFetches = 80,
): Promise<{ urls: Map<string, string>; missing: string[] }> {
  const urls = new Map<string, string>();
  for (const p of pages) if (!p.dynamic) urls.set(p.route, p.route);
  const queue = [...urls.values()];
  const seen = new Set(queue);
  let fetched = 0;
  while (queue.length && fetched < maxFetches && urls.size < pages.length) {
    const url = queue.shift()!;
    fetched++;
    const res = await request.get(url, { maxRedirects: 0 });
    if (!res.ok()) continue;
    for (const href of hrefsIn(await res.text())) {
      const path = href.split("?")[0]!;
      // `/builds/new` is the static page, not `/builds/[id]`: the fewest parameters win.
      const page = pages
        .filter((p) => p.pattern.test(path))
        .sort((a, b) => params(a) - params(b))[0];
      if (!page) continue;
      if (!urls.has(page.route)) urls.set(page.route, href);
      // One visit per route is enough to find what it links to.
      if (!seen.has(page.route)) {
        seen.add(page.route);
        queue.push(href);
      }
    }
  }
  for (const p of pages)
    if (!urls.has(p.route) && fixtures[p.route]) urls.set(p.route, fixtures[p.route]!);
  return { urls, missing: pages.filter((p) => !urls.has(p.route)).map((p) => p.route) };
}
