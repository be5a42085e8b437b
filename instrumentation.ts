/**
 * At boot: validates the environment — a missing variable, or a secret left at a default in
 * production, stops the server here with the reason, before it serves anything — and has the
 * server note each request's client address for the rate limits (lib/http/client-address.ts).
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { serverEnv } = await import("./lib/env");
  let trustedProxyHeader: string;
  try {
    trustedProxyHeader = serverEnv().TRUSTED_PROXY_HEADER;
  } catch (e) {
    console.error((e as Error).message);
    process.exit(1);
  }
  const { installClientAddress } = await import("./lib/http/client-address");
  await installClientAddress(trustedProxyHeader);
}
