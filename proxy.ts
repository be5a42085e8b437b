import { getSessionCookie } from "better-auth/cookies";
import { NextResponse, type NextRequest } from "next/server";

import { actionRequestRefusal, undecodablePath, type EdgeRefusal } from "@/lib/http/action-request";
import { databaseAnswering, UNAVAILABLE_HTML } from "@/lib/http/db-health";
import { crossSiteRefusal, isUnsafeMethod } from "@/lib/http/same-origin";
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

/** A refusal in the API's JSON error shape. */
const refuse = (r: EdgeRefusal) =>
  NextResponse.json(
    { error: { code: r.code, message: r.message, issues: [] } },
    { status: r.status, headers: { "cache-control": "no-store" } },
  );

/** The page a browser gets for an address that is not valid percent-encoding. */
const BAD_ADDRESS_HTML = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>Not a valid address · Fuelwright</title></head><body style="font-family: system-ui, sans-serif; max-width: 36rem; margin: 4rem auto; padding: 0 1rem; color: #1f2933"><h1>Not a valid address</h1><p>This address has a broken % sign in it, so there is no page to show. Check the link, or <a href="/">go to Fuelwright's start page</a>.</p></body></html>`;

/**
 * Every page request: a fresh CSP nonce (Next applies it to its own scripts), a 503 page while
 * the database is away, and the quick cookie check — no cookie on an app page → sign-in.
 * The real session and role checks are on the server. Before any of it, an address that is not
 * valid percent-encoding is a 400 (the API's as JSON); a POST to a page (a server action) from
 * another site is a 403, and one whose body cannot be decoded a 400 or 415.
 */
export async function proxy(req: NextRequest) {
  const { pathname } = req.nextUrl;
  if (undecodablePath(pathname)) {
    const message = "The address has a % that does not start a valid escape";
    return pathname.startsWith("/api/")
      ? refuse({ status: 400, code: "bad_path", message })
      : new NextResponse(BAD_ADDRESS_HTML, {
          status: 400,
          headers: { "content-type": "text/html; charset=utf-8", "cache-control": "no-store" },
        });
  }
  // The API is matched only for the check above (its routes check the rest themselves).
  if (pathname.startsWith("/api/")) return NextResponse.next();
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
  // Server actions are POSTs to page paths (with scripts or without): one from another site is
  // refused before it runs, and so is one whose arguments cannot be decoded.
  if (isUnsafeMethod(req.method)) {
    const crossSite = crossSiteRefusal(req);
    if (crossSite) return refuse({ status: 403, code: "cross_site", message: crossSite });
    const bad = await actionRequestRefusal(req);
    if (bad) return refuse(bad);
  }
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

// Icons and the web app manifest are public files: no session, no database check, no redirect.
// The API is matched only where its path has a % in it (for the check of its escapes): a proxy
// buffers the bodies it sees, and uploads must stream to their routes.
export const config = {
  matcher: [
    "/((?!api|_next/static|_next/image|favicon\\.ico|icon\\.svg|icon-\\d+\\.png|apple-touch-icon\\.png|manifest\\.webmanifest|fonts).*)",
    "/api/:path(.*%.*)",
  ],
};
