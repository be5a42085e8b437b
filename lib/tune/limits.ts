import {
  DEFAULT_TUNE_LIMITS,
  mergeTuneLimits,
  sameLimit,
  TUNE_LIMIT_KEYS,
  TuneLimitsOverrideSchema,
  TuneLimitsSchema,
  type TuneLimitKey,
  type TuneLimits,
  type TuneLimitsOverride,
} from "@/lib/calc/tune";

/*
 * Which tune limits are in force: a build's own fields over the shop's defaults over the
 * library's (pure; read by the session, the dyno analysis, the spec sheet and Settings).
 */

/** Which source the session's limits came from. */
export type LimitsSource = "build" | "shop" | "library";

/**
 * The limits in force for a build, field by field: its own fields over the shop's defaults, else
 * the library's; `sources` says where each field came from, `source` the whole (build when any
 * field is its own), `base` what the build's fields stand apart from.
 */
export function limitsInForce(stored: { build: unknown; shop: unknown }): {
  limits: TuneLimits;
  source: LimitsSource;
  sources: Record<TuneLimitKey, LimitsSource>;
  base: TuneLimits;
  baseSource: Exclude<LimitsSource, "build">;
  own: TuneLimitsOverride | null;
} {
  const s = TuneLimitsSchema.safeParse(stored.shop);
  const shop = stored.shop && s.success ? s.data : null;
  const base = shop ?? DEFAULT_TUNE_LIMITS;
  const baseSource = shop ? "shop" : "library";
  const b = TuneLimitsOverrideSchema.safeParse(stored.build);
  const own = stored.build && b.success && Object.keys(b.data).length ? b.data : null;
  const sources = Object.fromEntries(
    TUNE_LIMIT_KEYS.map((k) => [k, own && own[k] !== undefined ? "build" : baseSource]),
  ) as Record<TuneLimitKey, LimitsSource>;
  return {
    limits: mergeTuneLimits(base, own),
    source: own ? "build" : baseSource,
    sources,
    base,
    baseSource,
    own,
  };
}

/**
 * The shop's default limits after a change: the fields sent over those in force (the shop's,
 * else the library's); null goes back to the library's. `write` is false when nothing would
 * change — the library's defaults saved as they are stay "the library's".
 */
export function shopLimitsAfter(
  stored: unknown,
  sent: TuneLimitsOverride | null,
): { write: boolean; limits: TuneLimits | null } {
  const s = TuneLimitsSchema.safeParse(stored);
  const current = stored && s.success ? s.data : null;
  if (sent === null) return { write: current !== null, limits: null };
  const next = mergeTuneLimits(current ?? DEFAULT_TUNE_LIMITS, sent);
  const same = (a: TuneLimits) => TUNE_LIMIT_KEYS.every((k) => sameLimit(next[k], a[k] as never));
  return { write: !same(current ?? DEFAULT_TUNE_LIMITS), limits: next };
}
