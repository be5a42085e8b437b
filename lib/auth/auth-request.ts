/**
 * The auth library's own endpoints (`/api/auth/*`) called with one plain request from the
 * signed-out pages (sign-in, forgot and reset password), as the sign-out button does: no auth
 * client library in their JavaScript (≈ 15 KiB gzipped; `npm run bench:bundle`). The browser
 * sends its origin and takes the session cookie from the answer as with the client.
 */
export interface AuthRequestError {
  status: number;
  /** The library's error code, e.g. `EMAIL_NOT_VERIFIED`; absent when the answer had none. */
  code?: string;
}

export async function authRequest(
  path: "/sign-in/email" | "/request-password-reset" | "/reset-password",
  body: Record<string, string>,
): Promise<{ error: AuthRequestError | null }> {
  const res = await fetch(`/api/auth${path}`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify(body),
    credentials: "same-origin",
  });
  if (res.ok) return { error: null };
  const answer: unknown = await res.json().catch(() => null);
  const code =
    answer && typeof answer === "object" && "code" in answer && typeof answer.code === "string"
      ? answer.code
      : undefined;
  return { error: { status: res.status, ...(code ? { code } : {}) } };
}
