/** A member's role in a shop. Our words; stored in better-auth's member.role. */
export const ROLES = ["owner", "tuner", "counter", "customer"] as const;
export type Role = (typeof ROLES)[number];
export const STAFF_ROLES = ["owner", "tuner", "counter"] as const satisfies readonly Role[];

export const ROLE_LABELS: Record<Role, string> = {
  owner: "Owner",
  tuner: "Tuner",
  counter: "Counter",
  customer: "Customer",
};

export const isRole = (r: unknown): r is Role =>
  typeof r === "string" && (ROLES as readonly string[]).includes(r);
