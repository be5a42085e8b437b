import Link from "next/link";
import type { ReactNode } from "react";

import type { Member } from "@/lib/auth/member";
import { ROLE_LABELS } from "@/lib/domain/roles";

import { Logo } from "./logo";
import { navFor } from "./nav-items";
import { NavLinks } from "./nav-links";
import { SignOutButton } from "./sign-out-button";

export function AppFrame({ member, children }: { member: Member; children: ReactNode }) {
  return (
    <div className="min-h-screen">
      <header className="bg-ink-900 text-white">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
          <Link href="/" className="text-white">
            <Logo small />
          </Link>
          <nav
            aria-label="Main"
            className="order-3 w-full min-w-0 sm:order-none sm:w-auto sm:flex-1"
          >
            <NavLinks items={navFor(member.role).map(({ href, label }) => ({ href, label }))} />
          </nav>
          <div className="ml-auto flex items-center gap-3 text-sm">
            <span className="hidden text-ink-200 md:inline" data-testid="who">
              {member.user.name} · {ROLE_LABELS[member.role]} · {member.shopName}
            </span>
            <SignOutButton />
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-7xl px-4 py-6">{children}</main>
    </div>
  );
}
