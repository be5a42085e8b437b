import type { Role } from "@/lib/domain/roles";

export interface NavItem {
  href: string;
  label: string;
  roles: readonly Role[];
  /** Other paths that belong to this section (pages with no list of their own). */
  also?: readonly string[];
}

/** The app frame's navigation, by role. */
export const NAV_ITEMS: NavItem[] = [
  { href: "/builds", label: "Builds", roles: ["owner", "tuner", "counter"] },
  { href: "/customers", label: "Customers", roles: ["owner", "tuner", "counter"] },
  { href: "/parts", label: "Parts", roles: ["owner", "tuner", "counter"] },
  { href: "/quotes", label: "Quotes", roles: ["owner", "counter", "tuner"] },
  // An invoice is raised from a job: its page sits under Jobs (there is no list of invoices).
  { href: "/jobs", label: "Jobs", roles: ["owner", "tuner", "counter"], also: ["/invoices"] },
  { href: "/purchasing", label: "Purchasing", roles: ["owner", "tuner", "counter"] },
  { href: "/tools", label: "Tools", roles: ["owner", "tuner", "counter"] },
  { href: "/settings", label: "Settings", roles: ["owner", "tuner", "counter"] },
  { href: "/my", label: "My builds", roles: ["customer"] },
];

export const navFor = (role: Role) => NAV_ITEMS.filter((i) => i.roles.includes(role));

/** Whether `path` lies in the section of `item`: its own path, a page beneath, or one it claims. */
export const inSection = (item: Pick<NavItem, "href" | "also">, path: string) =>
  [item.href, ...(item.also ?? [])].some((h) => path === h || path.startsWith(`${h}/`));
