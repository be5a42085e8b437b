import type { Metadata, Viewport } from "next";
import { bodyFont, displayFont } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Fuelwright", template: "%s · Fuelwright" },
  description: "Fuel-system sizing, quotes and spec sheets for performance shops.",
};

export const viewport: Viewport = { width: "device-width", initialScale: 1 };

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${bodyFont.variable} ${displayFont.variable}`}>
      <body className="min-h-screen">{children}</body>
    </html>
  );
}
