/**
 * At boot: validates the environment, so a missing or default secret fails loudly at start, and
 * has the server note each request's client address for the rate limits (lib/http/client-address.ts).
 */
export async function register() {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { serverEnv } = await import("./lib/env");
    const env = serverEnv();
    const { installClientAddress } = await import("./lib/http/client-address");
    await installClientAddress(env.TRUSTED_PROXY_HEADER);
  }
}
