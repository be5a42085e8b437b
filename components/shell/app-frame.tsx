import Link from "next/link";
import type { ReactNode } from "react";

import { ShopTimeZone } from "@/components/ui/local-time";
import type { Member } from "@/lib/auth/member";
import { ROLE_LABELS } from "@/lib/domain/roles";

import { Logo } from "./logo";
import { navFor } from "./nav-items";
import { NavLinks } from "./nav-links";
import { RouteFocus } from "./route-focus";
import { SignOutButton } from "./sign-out-button";

/**
 * The frame of every signed-in page. Below 640 px the main nav is a "Menu" button, on its own
 * row under the logo and "Sign out" (a long section name never runs under them), that opens
 * every section; from 640 px to 1024 px the links take their own row and wrap; from 1024 px they
 * sit beside the logo. The root layout's skip link jumps to `#main`.
 */
export function AppFrame({
  member,
  timeZone,
  children,
}: {
  member: Member;
  /** The shop's time zone: every date and time on the page is read in it. */
  timeZone: string;
  children: ReactNode;
}) {
  return (
    <ShopTimeZone zone={timeZone}>
      <div className="min-h-screen">
        <header className="relative bg-ink-900 text-white">
          <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
            <Link href="/" className="text-white">
              <Logo small />
            </Link>
            <nav
              aria-label="Main"
              className="order-last w-full min-w-0 sm:order-3 lg:order-none lg:w-auto lg:flex-1"
            >
              <NavLinks
                items={navFor(member.role).map(({ href, label, also }) => ({ href, label, also }))}
              />
            </nav>
            <div className="ml-auto flex items-center gap-3 text-sm">
              <span className="hidden text-ink-200 lg:inline" data-testid="who">
                {member.user.name} · {ROLE_LABELS[member.role]} · {member.shopName}
              </span>
              <SignOutButton />
            </div>
          </div>
        </header>
        <main id="main" tabIndex={-1} className="mx-auto max-w-7xl px-4 py-6 focus:outline-none">
          {children}
        </main>
        <RouteFocus />
      </div>
    </ShopTimeZone>
  );
}
