import { readdirSync } from "node:fs";
import { join, relative, sep } from "node:path";

import type { APIRequestContext, Page } from "playwright-core";

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
 * it found by following links from the static pages (breadth first, up to `perRoute` pages of
 * each route, as the signed-in client of `request`), else `fixtures[route]`. Lists drawn in the
 * browser (SWR) have no links in their HTML: `rendered(url)` (a page's links once drawn) is asked
 * for the pages visited, in order, while a route is still missing. Returns the URLs by route and
 * the routes nothing led to.
 */
export async function urlsFor(
  request: APIRequestContext,
  pages: AppPage[],
  {
    fixtures = {},
    rendered,
    perRoute = 2,
    maxFetches = 60,
  }: {
    fixtures?: Record<string, string>;
    rendered?: (url: string) => Promise<string[]>;
    perRoute?: number;
    maxFetches?: number;
  } = {},
): Promise<{ urls: Map<string, string>; missing: string[] }> {
  const urls = new Map<string, string>();
  for (const p of pages) if (!p.dynamic) urls.set(p.route, p.route);
  const queue = [...urls.values()];
  const visits = new Map<string, number>();
  const queued = new Set(queue);
  const visited: string[] = [];
  const pageOf = (href: string) =>
    // `/builds/new` is the static page, not `/builds/[id]`: the fewest parameters win.
    pages
      .filter((p) => p.pattern.test(href.split("?")[0]!))
      .sort((a, b) => params(a) - params(b))[0];
  const take = (hrefs: string[]) => {
    for (const href of hrefs) {
      const page = pageOf(href);
      if (!page) continue;
      if (!urls.has(page.route)) urls.set(page.route, href);
      const n = visits.get(page.route) ?? 0;
      if (n < perRoute && !queued.has(href)) {
        visits.set(page.route, n + 1);
        queued.add(href);
        queue.push(href);
      }
    }
  };
  const missing = () => pages.filter((p) => !urls.has(p.route));
  while (queue.length && visited.length < maxFetches && missing().length) {
    const url = queue.shift()!;
    visited.push(url);
    const res = await request.get(url, { maxRedirects: 0 });
    if (res.ok()) take(hrefsIn(await res.text()));
  }
  for (const url of rendered ? visited : []) {
    if (!missing().length) break;
    take(await rendered!(url));
  }
  for (const p of missing()) if (fixtures[p.route]) urls.set(p.route, fixtures[p.route]!);
  return { urls, missing: missing().map((p) => p.route) };
}

/** The same-site links of a page as the browser draws it (for `urlsFor`'s `rendered`). */
export async function renderedLinks(page: Page, url: string): Promise<string[]> {
  // A page that moves on by itself (a redirect once drawn) is read again where it lands.
  for (let attempt = 0; attempt < 3; attempt++) {
    try {
      if (attempt === 0) await page.goto(url);
      await page.waitForLoadState("networkidle");
      return await page.evaluate(() =>
        Array.from(document.querySelectorAll("a[href]"))
          .map((a) => a.getAttribute("href")!)
          .filter((h) => h.startsWith("/")),
      );
    } catch (e) {
      if (!/context was destroyed|navigat/i.test(String(e))) throw e;
    }
  }
  return [];
}
