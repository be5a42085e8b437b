export const BASE_URL = process.env.TEST_BASE_URL ?? "http://localhost:3100";
export const DEMO_PASSWORD = "fuelwright-demo";

// Random start per test file: files run in their own module instances and must not share addresses.
let ip = Math.floor(Math.random() * 60000);
/** A fresh client address, so that each test client has its own sign-in rate-limit bucket. */
export const nextIp = () => {
  ip++;
  return `10.${66 + Math.floor(ip / 62500)}.${Math.floor(ip / 250) % 250}.${(ip % 250) + 1}`;
};

export interface Client {
  cookie: string;
  ip: string;
}

function cookiesFrom(res: Response): string {
  return res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0]!)
    .join("; ");
}

export async function signIn(email: string, password = DEMO_PASSWORD): Promise<Client> {
  const clientIp = nextIp();
  const res = await fetch(`${BASE_URL}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: BASE_URL, "x-forwarded-for": clientIp },
    body: JSON.stringify({ email, password }),
  });
  if (!res.ok) throw new Error(`sign-in of ${email} failed: ${res.status} ${await res.text()}`);
  return { cookie: cookiesFrom(res), ip: clientIp };
}

/** A request as a signed-in client (or signed out with `null`). Redirects are not followed. */
export async function request(
  client: Client | null,
  method: string,
  path: string,
  body?: unknown,
  headers: Record<string, string> = {},
) {
  const res = await fetch(`${BASE_URL}${path}`, {
    method,
    redirect: "manual",
    headers: {
      origin: BASE_URL,
      "x-forwarded-for": client?.ip ?? nextIp(),
      ...(client ? { cookie: client.cookie } : {}),
      ...(body !== undefined && typeof body !== "string"
        ? { "content-type": "application/json" }
        : {}),
      ...headers,
    },
    body: body === undefined ? undefined : typeof body === "string" ? body : JSON.stringify(body),
  });
  const text = await res.text();
  let json: unknown = undefined;
  try {
    json = text ? JSON.parse(text) : undefined;
  } catch {
    /* not JSON */
  }
  return { status: res.status, headers: res.headers, text, json: json as any };
}

/** A GET whose body is binary (a PDF, an image). */
export async function getBytes(client: Client | null, path: string) {
  const res = await fetch(`${BASE_URL}${path}`, {
    redirect: "manual",
    headers: {
      origin: BASE_URL,
      "x-forwarded-for": client?.ip ?? nextIp(),
      ...(client ? { cookie: client.cookie } : {}),
    },
  });
  return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) };
}

/**
 * `attempt` again and again until `done` says yes (its last answer), for at most `ms`: for a
 * change written straight into the database, as another instance of the app would, which the
 * app hears of through the database's notice (db/session-cache.ts) — milliseconds, not at once.
 */
export async function once<T>(
  attempt: () => Promise<T>,
  done: (answer: T) => boolean,
  ms = 3000,
): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const answer = await attempt();
    if (done(answer) || Date.now() > end) return answer;
    await new Promise((r) => setTimeout(r, 10));
  }
}
