import type { ReactNode } from "react";

import { Logo } from "@/components/shell/logo";

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <main
      id="main"
      tabIndex={-1}
      className="flex min-h-screen flex-col items-center justify-center bg-ink-900 px-4 py-10 focus:outline-none"
    >
      <div className="mb-6 text-white">
        <Logo />
      </div>
      <div className="w-full max-w-md rounded-xl bg-white p-6 shadow-xl sm:p-8">{children}</div>
      <p className="mt-6 max-w-md text-center text-xs text-ink-300">
        Fuel-system figures are estimates to be verified on the dyno. Installation follows local
        codes and licensed practice.
      </p>
    </main>
  );
}
