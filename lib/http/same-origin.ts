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

/**
 * Why a state-changing request must be refused as cross-site, or null when it may go on.
 * A browser names the page that sent it (`Origin`, and `Sec-Fetch-Site` in every current browser);
 * a write must come from one of our own origins. A write naming neither is refused too: our own
 * pages always send them, and so do the API's clients (they sign in through better-auth, which
 * asks the same).
 */
export function crossSiteRefusal(req: Request): string | null {
  if (!UNSAFE.has(req.method.toUpperCase())) return null;
  const origin = req.headers.get("origin");
  const site = req.headers.get("sec-fetch-site");
  if (origin && origin !== "null") {
    return allowedOrigins().has(origin) ? null : "This request came from another site";
  }
  if (site === "same-origin") return null;
  return site
    ? "This request came from another site"
    : "Send the Origin header with requests that change data";
}
