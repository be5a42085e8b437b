import { consumeRateLimit, pruneRateLimits, refundRateLimit } from "@/db/queries/rate-limits";

/**
 * The auth rate limits' writes. No member: they run before anyone is signed in, keyed by the
 * client's address (lib/http/client-address.ts) and, for sign-in, by the account it names.
 * Counters live in PostgreSQL, so every app instance counts against the same ones.
 */

export interface LimitRule {
  /** Seconds. */
  window: number;
  max: number;
}

/** Sign-in and sign-up, whether through the HTTP endpoint or the sign-up page's server action. */
export const AUTH_LIMITS = {
  /** Attempts from one address (better-auth's own figure for these paths). */
  signInPerAddress: { window: 10, max: 3 },
  /** Failed attempts on one account, from any number of addresses (a success gives its attempt back). */
  signInPerAccount: { window: 60, max: 5 },
  signUpPerAddress: { window: 10, max: 3 },
} as const satisfies Record<string, LimitRule>;

const PRUNE_EVERY_MS = 60_000;
let lastPrune = 0;

/** Counts one attempt against `key`; `allowed: false` once the window's allowance is used up. */
export async function consumeAttempt(
  key: string,
  rule: LimitRule,
): Promise<{ allowed: boolean; retryAfter: number | null }> {
  const now = Date.now();
  if (now - lastPrune > PRUNE_EVERY_MS) {
    lastPrune = now;
    pruneRateLimits().catch((e) => console.error("rate limits: pruning failed:", e));
  }
  return consumeRateLimit(key, rule.window, rule.max);
}

/** Gives one attempt back (a sign-in that succeeded does not count against its account). */
export async function refundAttempt(key: string): Promise<void> {
  await refundRateLimit(key);
}

/** better-auth's rate-limit storage (its other paths' limits), in the same table. */
export const rateLimitStorage = { consume: consumeAttempt };

/** The key better-auth uses for an address and a path; the app's own limits use the same. */
export const addressKey = (address: string, path: string) => `${address}|${path}`;
export const accountKey = (email: string, path: string) => `account:${email}|${path}`;
