/**
 * Validates the environment when the server boots, so a missing secret fails loudly at start,
 * then starts the clock's own jobs (at boot and every QUOTE_SWEEP_MINUTES). Every instance runs
 * them; they are idempotent and skip rows another instance holds.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { serverEnv } = await import("./lib/env");
    const minutes = serverEnv().QUOTE_SWEEP_MINUTES;
    if (minutes === 0) return;
    const { sweepExpiredQuotes } = await import("./lib/quotes/quote-commands");
    const sweep = () =>
      sweepExpiredQuotes().catch((err: unknown) =>
        console.error("Expired-quote sweep failed; it runs again shortly:", err),
      );
    void sweep();
    setInterval(sweep, minutes * 60_000).unref();
  }
}
