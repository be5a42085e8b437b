import type { Metadata, Viewport } from "next";
import { connection } from "next/server";

import { bodyFont, displayFont } from "./fonts";

import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Fuelwright", template: "%s · Fuelwright" },
  description: "Fuel-system sizing, quotes and spec sheets for performance shops.",
  icons: {
    icon: [
      { url: "/favicon.ico", sizes: "16x16 32x32 48x48" },
      { url: "/icon.svg", type: "image/svg+xml" },
    ],
    apple: { url: "/apple-touch-icon.png", sizes: "180x180" },
  },
};

export const viewport: Viewport = {
  width: "device-width",
  initialScale: 1,
  themeColor: "#141a20",
};

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page renders per request, so each carries its request's CSP nonce.
  await connection();
  return (
    <html lang="en" className={`${bodyFont.variable} ${displayFont.variable}`}>
      <body className="min-h-screen">
        {/* The first Tab of every page: past the header and its menu, to the page's content. */}
        <a
          href="#main"
          className="skip-link rounded-md bg-white px-4 py-2 font-semibold text-ink-900 shadow-lg ring-2 ring-copper-500"
        >
          Skip to content
        </a>
        {children}
      </body>
    </html>
  );
}
