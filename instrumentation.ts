/** Validates the environment when the server boots, so a missing secret fails loudly at start. */
export async function register() {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { serverEnv } = await import("./lib/env");
    serverEnv();
  }
}
