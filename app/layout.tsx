import type { Metadata, Viewport } from "next";
import { connection } from "next/server";

import { bodyFont, displayFont } from "./fonts";

import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Fuelwright", template: "%s · Fuelwright" },
  description: "Fuel-system sizing, quotes and spec sheets for performance shops.",
};

export const viewport: Viewport = { width: "device-width", initialScale: 1 };

export default async function RootLayout({ children }: { children: React.ReactNode }) {
  // Every page renders per request, so each carries its request's CSP nonce.
  await connection();
  return (
    <html lang="en" className={`${bodyFont.variable} ${displayFont.variable}`}>
      <body className="min-h-screen">{children}</body>
    </html>
  );
}
