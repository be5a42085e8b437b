/** A JSON call to our API from the browser: the body, or the API's error message and field issues. */
export async function api<T>(
  method: string,
  url: string,
  body?: unknown,
  init: RequestInit = {},
): Promise<
  | { ok: true; data: T }
  | {
      ok: false;
      status: number;
      message: string;
      issues: { path: string; message: string }[];
      body: unknown;
    }
> {
  const res = await fetch(url, {
    method,
    headers: {
      accept: "application/json",
      ...(typeof body === "string" ? {} : { "content-type": "application/json" }),
    },
    body: body === undefined ? undefined : typeof body === "string" ? body : JSON.stringify(body),
    ...init,
  });
  const json = await res.json().catch(() => null);
  if (res.ok) return { ok: true, data: json as T };
  return {
    ok: false,
    status: res.status,
    message: json?.error?.message ?? `Request failed (${res.status})`,
    issues: json?.error?.issues ?? [],
    body: json,
  };
}
