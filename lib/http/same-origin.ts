import { serverEnv } from "@/lib/env";

/**
 * The origins the app is served from: APP_URL, and localhost / 127.0.0.1 on its port. The one
 * list: better-auth trusts the same (lib/auth/server.ts).
 */
export function allowedOrigins(): Set<string> {
  const app = new URL(serverEnv().APP_URL);
  const port = app.port || "3000";
  return new Set([`http://localhost:${port}`, `http://127.0.0.1:${port}`, app.origin]);
}

const UNSAFE = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/** Does this method change data (and so need the same-origin check)? */
export const isUnsafeMethod = (method: string) => UNSAFE.has(method.toUpperCase());

/**
 * Why a state-changing request must be refused as cross-site, or null when it may go on.
 * Every current browser names the page that sent a POST, PUT, PATCH or DELETE in `Origin` (and
 * says where it came from in `Sec-Fetch-Site`): a write must name one of our own origins, and
 * must not be marked as coming from elsewhere. A write naming no origin, or `Origin: null` (a
 * sandboxed frame, a redirect from another site, a `data:` page), is refused too: our own pages
 * always send it, and so do the API's clients (they sign in through better-auth, which asks the
 * same).
 */
export function crossSiteRefusal(req: Request): string | null {
  if (!isUnsafeMethod(req.method)) return null;
  const origin = req.headers.get("origin");
  const site = req.headers.get("sec-fetch-site");
  if (site && site !== "same-origin") return "This request came from another site";
  if (!origin) return "Send the Origin header with requests that change data";
  if (origin === "null") return "This request came from a page with no origin";
  return allowedOrigins().has(origin) ? null : "This request came from another site";
}
