import { createHmac } from "node:crypto";

import { describe, expect, it, vi } from "vitest";

vi.mock("server-only", () => ({}));
const { cookieValue, signedSessionToken } = await import("@/lib/auth/session-cookie");

// The auth library's cookie format: `token.signature`, the signature being base64 HMAC-SHA-256 of
// the token under the install's secret (better-auth's signed cookies; common practice, no source).
const NAME = "better-auth.session_token";
const SECRET = "a-test-secret-of-more-than-32-characters-0001";
const sign = (token: string, secret = SECRET) =>
  `${token}.${createHmac("sha256", secret).update(token).digest("base64")}`;
const header = (value: string) => `theme=dark; ${NAME}=${encodeURIComponent(value)}; other=1`;

describe("the signed session cookie", () => {
  it("gives the token of a cookie signed with the secret, the same on every request", () => {
    const cookie = header(sign("tok-one"));
    expect(signedSessionToken(cookie, NAME, SECRET)).toBe("tok-one");
    expect(signedSessionToken(cookie, NAME, SECRET)).toBe("tok-one");
  });

  it("refuses a cookie signed with another secret, even one already seen under its own", () => {
    const cookie = header(sign("tok-two", SECRET));
    expect(signedSessionToken(cookie, NAME, SECRET)).toBe("tok-two");
    expect(signedSessionToken(cookie, NAME, `${SECRET}-rotated`)).toBeNull();
  });

  it("refuses a forged, altered or unsigned cookie, again and again", () => {
    const good = sign("tok-three");
    const forged = `tok-three.${"A".repeat(43)}=`;
    const altered = `tok-threE.${good.split(".")[1]}`;
    for (let i = 0; i < 2; i++) {
      expect(signedSessionToken(header(forged), NAME, SECRET)).toBeNull();
      expect(signedSessionToken(header(altered), NAME, SECRET)).toBeNull();
      expect(signedSessionToken(header("tok-three"), NAME, SECRET)).toBeNull();
    }
    expect(signedSessionToken(header(good), NAME, SECRET)).toBe("tok-three");
    expect(signedSessionToken(null, NAME, SECRET)).toBeNull();
  });

  it("reads a cookie's value unquoted and decoded", () => {
    expect(cookieValue(`a=1; ${NAME}="x%2By"`, NAME)).toBe("x+y");
    expect(cookieValue("a=1", NAME)).toBeNull();
  });
});
