import { Forbidden } from "@/lib/domain/errors";
import type { Role } from "@/lib/domain/roles";

/**
 * The one permissions table: every action a member can take, and the roles that may take it.
 * Server components, server actions and route handlers all ask `can()` through requireMember().
 */
export const PERMISSIONS = {
  "staff:view": ["owner", "tuner", "counter"],
  "portal:view": ["customer"],
  "settings:read": ["owner", "tuner", "counter"],
  "settings:update": ["owner"],
  "members:manage": ["owner"],
  "customers:read": ["owner", "tuner", "counter"],
  "customers:write": ["owner", "tuner", "counter"],
  "builds:read": ["owner", "tuner", "counter"],
  "builds:write": ["owner", "tuner"],
  /** Starting a build from a caller's goal, in "needs sizing" for a tuner (the counter may). */
  "builds:draft": ["owner", "tuner", "counter"],
  /** Reading builds through the API; customers see only their own (see ownRecordsOnly). */
  "builds:view": ["owner", "tuner", "counter", "customer"],
  /** Dyno datalogs: tuners upload them; staff read them. */
  "datalogs:upload": ["owner", "tuner"],
  "datalogs:read": ["owner", "tuner", "counter"],
  "parts:read": ["owner", "tuner", "counter"],
  "parts:write": ["owner", "counter"],
  /** Choosing a build's parts from the catalog writes a build revision (the counter may too). */
  "kit:choose": ["owner", "tuner", "counter"],
  "quotes:read": ["owner", "tuner", "counter"],
  "quotes:write": ["owner", "counter"],
  /** Reading quotes through the API; customers see only their own. */
  "quotes:view": ["owner", "tuner", "counter", "customer"],
  /** A customer accepts or declines their own sent quote. */
  "quotes:respond": ["customer"],
  /** A customer pays the deposit on their own accepted quote. */
  "quotes:pay": ["customer"],
  "shares:manage": ["owner", "tuner", "counter"],
  /** Suppliers and purchase orders: staff only (customers never see them). */
  "purchasing:read": ["owner", "tuner", "counter"],
  "purchasing:write": ["owner", "counter"],
  /** Jobs: staff run them (the tuner fits); customers read their own through the API. */
  "jobs:read": ["owner", "tuner", "counter"],
  "jobs:write": ["owner", "tuner", "counter"],
  "jobs:view": ["owner", "tuner", "counter", "customer"],
  /** Invoices and credit notes: raised by the owner and the counter; customers read their own. */
  "invoices:read": ["owner", "tuner", "counter"],
  "invoices:write": ["owner", "counter"],
  "invoices:view": ["owner", "tuner", "counter", "customer"],
  /** A customer pays the balance of their own issued invoice. */
  "invoices:pay": ["customer"],
  /** Resending a notice that failed, and choosing to get the shop's notices. */
  "notices:manage": ["owner", "tuner", "counter"],
  "calc:use": ["owner", "tuner", "counter", "customer"],
  /**
   * better-auth's organization endpoints (/api/auth/organization/*): staff only — customers are
   * not shop members there (lib/auth/auth-hooks.ts); what each staff role may do there is the
   * plugin's access control in lib/auth/server.ts (only the owner manages).
   */
  "organization:use": ["owner", "tuner", "counter"],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof PERMISSIONS;

/** May a member with this role take this action? */
export function can(role: Role, action: Action): boolean {
  return (PERMISSIONS[action] as readonly Role[]).includes(role);
}

/** Roles that see only the records tied to their own sign-in (their builds, quotes, files). */
export function ownRecordsOnly(role: Role): boolean {
  return role === "customer";
}

/** For commands: the member may take `action`, or Forbidden is thrown. */
export function authorize(member: { role: Role }, action: Action): void {
  if (!can(member.role, action)) throw new Forbidden();
}
