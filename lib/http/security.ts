/**
 * Security headers. Pages get a per-request nonce CSP from proxy.ts (no 'unsafe-inline' for
 * scripts); every response gets the fixed headers from next.config.ts.
 */

/** The CSP of an HTML page: scripts only with this request's nonce (and what they load). */
export function pageCsp(nonce: string, dev = process.env.NODE_ENV !== "production"): string {
  return [
    "default-src 'self'",
    // 'strict-dynamic': the framework's chunks load from the nonced bootstrap. Dev needs eval for fast refresh.
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ""}`,
    // Inline style attributes (charts, progress bars) are allowed; scripts are not.
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self'",
    `connect-src 'self'${dev ? " ws: wss:" : ""}`,
    // The payment page is the provider's (or the local fake's), reached by a top-level redirect.
    "form-action 'self'",
    "frame-ancestors 'none'",
    "object-src 'none'",
    "base-uri 'self'",
  ].join("; ");
}

/** API responses are data: nothing in them may run or be framed. */
export const API_CSP = "default-src 'none'; frame-ancestors 'none'; sandbox";

export const COMMON_HEADERS: { key: string; value: string }[] = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=()" },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
];
