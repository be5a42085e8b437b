import { getSessionCookie } from "better-auth/cookies";
import { NextResponse, type NextRequest } from "next/server";

import { databaseAnswering, UNAVAILABLE_HTML } from "@/lib/http/db-health";
import { crossSiteRefusal } from "@/lib/http/same-origin";
import { pageCsp } from "@/lib/http/security";

const PUBLIC = [
  "/share",
  "/sign-in",
  "/sign-up",
  "/forgot-password",
  "/reset-password",
  "/accept-invitation",
  "/check-email",
];

/**
 * Every page request: a fresh CSP nonce (Next applies it to its own scripts), a 503 page while
 * the database is away, and the quick cookie check — no cookie on an app page → sign-in.
 * The real session and role checks are on the server.
 */
export async function proxy(req: NextRequest) {
  const nonce = Buffer.from(crypto.randomUUID()).toString("base64");
  const csp = pageCsp(nonce);
  if (!(await databaseAnswering())) {
    return new NextResponse(UNAVAILABLE_HTML, {
      status: 503,
      headers: {
        "content-type": "text/html; charset=utf-8",
        "retry-after": "5",
        "cache-control": "no-store",
        "content-security-policy": csp,
      },
    });
  }
  // Server actions are POSTs to page paths; one from another site is refused before it runs.
  if (req.headers.has("next-action")) {
    const refusal = crossSiteRefusal(req);
    if (refusal) {
      return NextResponse.json(
        { error: { code: "cross_site", message: refusal, issues: [] } },
        { status: 403 },
      );
    }
  }
  const { pathname } = req.nextUrl;
  if (
    !PUBLIC.some((p) => pathname === p || pathname.startsWith(`${p}/`)) &&
    !getSessionCookie(req)
  ) {
    return NextResponse.redirect(new URL("/sign-in", req.url));
  }
  const headers = new Headers(req.headers);
  headers.set("x-nonce", nonce);
  headers.set("content-security-policy", csp);
  const res = NextResponse.next({ request: { headers } });
  res.headers.set("content-security-policy", csp);
  return res;
}

export const config = { matcher: ["/((?!api|_next/static|_next/image|favicon.ico|fonts).*)"] };
