import { APIError, createAuthMiddleware, getIP, getSessionFromCtx } from "better-auth/api";

import { roleInShop } from "@/db/queries/members";
import { can } from "@/lib/auth/permissions";
import { isRole, ROLES } from "@/lib/domain/roles";
import { serverEnv } from "@/lib/env";

import {
  accountKey,
  addressKey,
  AUTH_LIMITS,
  consumeAttempt,
  refundAttempt,
  type LimitRule,
} from "./rate-limit-commands";

/**
 * better-auth's before/after hooks (lib/auth/server.ts). They run for its HTTP endpoints and for
 * `auth.api.*` calls made by the app's server actions alike, so a rule here has no way around it.
 */

type HookCtx = Parameters<Parameters<typeof createAuthMiddleware>[0]>[0];

const SIGN_IN = "/sign-in/email";
const SIGN_UP = "/sign-up/email";

const field = (bag: unknown, key: string): unknown =>
  bag && typeof bag === "object" ? (bag as Record<string, unknown>)[key] : undefined;
const text = (v: unknown): string | undefined => (typeof v === "string" && v ? v : undefined);

async function spend(key: string, rule: LimitRule) {
  const r = await consumeAttempt(key, rule);
  if (!r.allowed)
    throw new APIError(
      "TOO_MANY_REQUESTS",
      { message: "Too many attempts. Wait a moment and try again." },
      { "Retry-After": String(r.retryAfter ?? rule.window) },
    );
}

/**
 * Sign-in counts against the client's address and against the account it names; sign-up
 * against the address. The address is the one the server noted (lib/http/client-address.ts);
 * a request without one shares a single bucket.
 */
async function limitSignInAndSignUp(ctx: HookCtx) {
  if (ctx.path !== SIGN_IN && ctx.path !== SIGN_UP) return;
  if (serverEnv().AUTH_RATE_LIMIT === "off") return;
  const address = getIP(ctx.headers ?? new Headers(), ctx.context.options) ?? "unknown";
  if (ctx.path === SIGN_UP)
    return spend(addressKey(address, SIGN_UP), AUTH_LIMITS.signUpPerAddress);
  await spend(addressKey(address, SIGN_IN), AUTH_LIMITS.signInPerAddress);
  const email = text(field(ctx.body, "email"))?.trim().toLowerCase();
  if (email) await spend(accountKey(email, SIGN_IN), AUTH_LIMITS.signInPerAccount);
}

/** A sign-in that worked gives its account attempt back: only failures lock an account. */
async function giveBackSignIn(ctx: HookCtx) {
  if (ctx.path !== SIGN_IN || serverEnv().AUTH_RATE_LIMIT === "off") return;
  const email = ctx.context.newSession?.user.email?.toLowerCase();
  if (email) await refundAttempt(accountKey(email, SIGN_IN));
}

/**
 * better-auth's organization endpoints (/api/auth/organization/*) are for the shop's staff:
 * customers are not shop members there (they would list every member and invitation). The
 * caller must hold a staff role in each shop the request names (by id or slug), or in the active
 * shop when it names none. Roles must be the app's; the shop's name and details change through
 * the Settings page only (lib/settings), never the plugin's update.
 */
async function guardOrganizationEndpoints(ctx: HookCtx) {
  if (!ctx.path.startsWith("/organization/")) return;
  if (ctx.path === "/organization/update")
    throw new APIError("FORBIDDEN", {
      message: "Change the shop's name and details on the Settings page.",
    });
  const session = await getSessionFromCtx(ctx);
  if (!session) throw new APIError("UNAUTHORIZED", { message: "Sign in first" });
  const id = text(field(ctx.body, "organizationId")) ?? text(field(ctx.query, "organizationId"));
  const slug =
    text(field(ctx.body, "organizationSlug")) ?? text(field(ctx.query, "organizationSlug"));
  const active = text(session.session.activeOrganizationId);
  const shops: ({ id: string } | { slug: string })[] = [];
  if (id) shops.push({ id });
  if (slug) shops.push({ slug });
  if (!shops.length && active) shops.push({ id: active });
  if (!shops.length) throw new APIError("FORBIDDEN", { message: "Your role does not allow this" });
  for (const shop of shops) {
    const role = await roleInShop(session.user.id, shop);
    if (!isRole(role) || !can(role, "organization:use"))
      throw new APIError("FORBIDDEN", { message: "Your role does not allow this" });
  }
  if (
    ctx.path === "/organization/invite-member" ||
    ctx.path === "/organization/update-member-role"
  ) {
    const raw = field(ctx.body, "role");
    const roles = (Array.isArray(raw) ? raw : [raw]).flatMap((r) =>
      typeof r === "string" ? r.split(",").map((x) => x.trim()) : [r],
    );
    if (!roles.length || roles.some((r) => !isRole(r)))
      throw new APIError("BAD_REQUEST", {
        message: `Choose a role: ${ROLES.join(", ")}`,
        code: "UNKNOWN_ROLE",
      });
  }
}

/**
 * A new password ends every other session the person has, as a reset does, whatever the caller
 * asks (the auth library's change-password takes `revokeOtherSessions: false` otherwise).
 */
function revokeOnPasswordChange(ctx: HookCtx) {
  if (ctx.path !== "/change-password" || !ctx.body || typeof ctx.body !== "object") return;
  (ctx.body as Record<string, unknown>).revokeOtherSessions = true;
}

export const beforeAuthHook = createAuthMiddleware(async (ctx) => {
  await limitSignInAndSignUp(ctx);
  await guardOrganizationEndpoints(ctx);
  revokeOnPasswordChange(ctx);
});

export const afterAuthHook = createAuthMiddleware(async (ctx) => {
  await giveBackSignIn(ctx);
});
