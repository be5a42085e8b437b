/**
 * At boot: validates the environment — a missing variable, or a secret left at a default in
 * production, stops the server here with the reason, before it serves anything — has the
 * server note each request's client address for the rate limits (lib/http/client-address.ts),
 * and starts the clock's own jobs (at boot and every QUOTE_SWEEP_MINUTES). Every instance runs
 * them; they are idempotent and skip rows another instance holds.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { serverEnv } = await import("./lib/env");
  let env: ReturnType<typeof serverEnv>;
  try {
    env = serverEnv();
  } catch (e) {
    console.error((e as Error).message);
    process.exit(1);
  }
  const { installClientAddress } = await import("./lib/http/client-address");
  await installClientAddress(env.TRUSTED_PROXY_HEADER);
  if (env.QUOTE_SWEEP_MINUTES === 0) return;
  const { sweepExpiredQuotes } = await import("./lib/quotes/quote-commands");
  const sweep = () =>
    sweepExpiredQuotes().catch((err: unknown) =>
      console.error("Expired-quote sweep failed; it runs again shortly:", err),
    );
  void sweep();
  setInterval(sweep, env.QUOTE_SWEEP_MINUTES * 60_000).unref();
}
