import type { Role } from "@/lib/domain/roles";

export interface NavItem {
  href: string;
  label: string;
  roles: readonly Role[];
}

/** The app frame's navigation, by role. */
export const NAV_ITEMS: NavItem[] = [
  { href: "/builds", label: "Builds", roles: ["owner", "tuner", "counter"] },
  { href: "/customers", label: "Customers", roles: ["owner", "tuner", "counter"] },
  { href: "/parts", label: "Parts", roles: ["owner", "tuner", "counter"] },
  { href: "/quotes", label: "Quotes", roles: ["owner", "counter", "tuner"] },
  { href: "/jobs", label: "Jobs", roles: ["owner", "tuner", "counter"] },
  { href: "/purchasing", label: "Purchasing", roles: ["owner", "tuner", "counter"] },
  { href: "/tools", label: "Tools", roles: ["owner", "tuner", "counter"] },
  { href: "/settings", label: "Settings", roles: ["owner", "tuner", "counter"] },
  { href: "/my", label: "My builds", roles: ["customer"] },
];

export const navFor = (role: Role) => NAV_ITEMS.filter((i) => i.roles.includes(role));
