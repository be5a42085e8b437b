import type { Metadata } from "next";
import { notFound } from "next/navigation";

import { LocalTime, ShopTimeZone } from "@/components/ui/local-time";
import { getBuild } from "@/db/queries/builds";
import { checkShareToken } from "@/db/queries/shares";
import { getShopSettings } from "@/db/queries/shops";

export const metadata: Metadata = { title: "Shared spec sheet", robots: { index: false } };

const REASONS = {
  expired: "This link has expired.",
  revoked: "This link was withdrawn by the shop.",
};

/**
 * The landing page of a share link: the build's name and its spec sheet, or a clear refusal
 * with no data. A link that never existed (or was tampered with) is this route's not-found page.
 */
export default async function SharedSheetPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const check = await checkShareToken(token);
  if (!check.ok) {
    if (check.reason === "invalid") notFound();
    return (
      <main id="main" tabIndex={-1} className="mx-auto max-w-xl p-8 focus:outline-none">
        <h1 className="font-display text-2xl font-semibold">Spec sheet not available</h1>
        <p className="mt-2 text-ink-700" data-testid="share-refused">
          {REASONS[check.reason]} Ask the shop for a new link.
        </p>
      </main>
    );
  }
  const [row, shop] = await Promise.all([
    getBuild(check.link.shopId, check.link.buildId),
    getShopSettings(check.link.shopId),
  ]);
  return (
    <main id="main" tabIndex={-1} className="mx-auto max-w-xl p-8 focus:outline-none">
      <p className="text-sm text-ink-600">{shop?.name}</p>
      <h1 className="font-display text-2xl font-semibold">{row?.build.title}</h1>
      <p className="mt-1 text-ink-700">{row?.build.vehicle}</p>
      <a
        href={`/share/${token}/pdf`}
        className="mt-4 inline-block rounded-md bg-copper-600 px-4 py-2 font-semibold text-white"
      >
        Download the spec sheet (PDF)
      </a>
      <p className="mt-2 text-sm text-ink-600">
        This link works until{" "}
        <ShopTimeZone zone={shop?.settings.timeZone ?? "UTC"}>
          <LocalTime value={check.link.expiresAt} />
        </ShopTimeZone>
        .
      </p>
      <p className="mt-6 text-sm text-ink-600">
        Fuel burns: have the system fitted and checked by qualified people, following local codes.
      </p>
    </main>
  );
}
