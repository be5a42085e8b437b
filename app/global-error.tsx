"use client";

import { ErrorNotice } from "@/components/ui/error-notice";

import { bodyFont, displayFont } from "./fonts";

import "./globals.css";

/** When the root layout itself fails: its own document, the same notice. */
export default function GlobalError({ error, retry }: { error: unknown; retry: () => void }) {
  return (
    <html lang="en" className={`${bodyFont.variable} ${displayFont.variable}`}>
      <body className="min-h-screen">
        <title>Something went wrong · Fuelwright</title>
        <main id="main" tabIndex={-1} className="px-4 py-10 focus:outline-none">
          <ErrorNotice error={error} retry={retry} />
        </main>
      </body>
    </html>
  );
}
