import "server-only";

import { createHmac, timingSafeEqual } from "node:crypto";

import { LRUCache } from "lru-cache";

/**
 * Cookie values whose signature has been checked, with their token: a signed-in client sends the
 * same cookie on every request, and the HMAC (with its key set-up) was a measurable part of each
 * request's own cost (docs/performance.md). Only the pure check is remembered — the value and
 * secret decide it alone — never whether the session exists: that is read on every request.
 */
const verified = new LRUCache<string, { secret: string; token: string }>({ max: 5000 });

/**
 * The session token a request carries in the auth library's signed cookie, or null when it
 * carries none or its signature does not verify. The cookie holds `token.signature`, the
 * signature being base64 HMAC-SHA-256 of the token under the install's secret — the auth
 * library's own format, read here so that a signed-in request needs one database round trip
 * (lib/auth/member.ts) instead of the library's three.
 */
export function signedSessionToken(
  cookieHeader: string | null,
  cookieName: string,
  secret: string,
): string | null {
  const raw = cookieValue(cookieHeader, cookieName);
  if (!raw) return null;
  const known = verified.get(raw);
  if (known && known.secret === secret) return known.token;
  const dot = raw.lastIndexOf(".");
  if (dot < 1) return null;
  const token = raw.slice(0, dot);
  const signature = raw.slice(dot + 1);
  if (signature.length !== 44 || !signature.endsWith("=")) return null;
  const expected = createHmac("sha256", secret).update(token).digest();
  const given = Buffer.from(signature, "base64");
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) return null;
  verified.set(raw, { secret, token });
  return token;
}

/** The first value of cookie `name` in a Cookie header, unquoted and URI-decoded. */
export function cookieValue(header: string | null, name: string): string | null {
  if (!header) return null;
  for (const part of header.split(";")) {
    const eq = part.indexOf("=");
    if (eq < 0 || part.slice(0, eq).trim() !== name) continue;
    let value = part.slice(eq + 1).trim();
    if (value.startsWith('"') && value.endsWith('"')) value = value.slice(1, -1);
    try {
      return decodeURIComponent(value);
    } catch {
      return value;
    }
  }
  return null;
}
