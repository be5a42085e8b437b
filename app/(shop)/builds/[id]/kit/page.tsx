import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";

import { SettingsChangedNote } from "@/components/builds/settings-changed-note";
import { KitPicker } from "@/components/kit/kit-picker";
import { SafetyNote } from "@/components/tools/safety-note";
import { PageHeader } from "@/components/ui/status";
import { getBuild } from "@/db/queries/builds";
import { unitSystemOf } from "@/db/queries/preferences";
import { getShopSettings } from "@/db/queries/shops";
import { requirePageMember } from "@/lib/auth/member";
import { can } from "@/lib/auth/permissions";
import { settingsChangesOf } from "@/lib/builds/settings-changes";
import { idOrNotFound } from "@/lib/ids";
import { sizingSettingsOf } from "@/lib/sizing/effective-inputs";

export const metadata: Metadata = { title: "Parts kit" };

export default async function KitPage({ params }: { params: Promise<{ id: string }> }) {
  const m = await requirePageMember("parts:read");
  const id = idOrNotFound((await params).id);
  const row = await getBuild(m.shopId, id);
  if (!row) notFound();
  const [s, units] = await Promise.all([
    getShopSettings(m.shopId),
    unitSystemOf(m.user.id, m.shopId),
  ]);
  // The kit sizes with today's settings: a build sized under others says so, as its sheet does.
  const b = row.build;
  const changes = s ? settingsChangesOf(b, sizingSettingsOf(s.settings), units) : [];
  return (
    <>
      <PageHeader title={`Parts kit — ${row.build.title}`}>
        <Link href={`/builds/${id}`} className="text-sm text-copper-700 underline">
          Back to the build
        </Link>
      </PageHeader>
      <p className="mb-4 text-sm text-ink-700">
        Each part is sized with this build&apos;s inputs: injectors at the worse end of the blend,
        pumps at rail plus boost and the build&apos;s voltage, lines against the shop&apos;s drop
        limit. Parts rank by fit, not by stock: one that is not all on the shelf says so, with the
        day it is expected, and the ranking stays the same after you use the parts.
      </p>
      <SettingsChangedNote
        changes={changes}
        className="mb-4"
        heading={
          <>
            Version {b.version} of this build was sized with the shop&apos;s settings of the time.
          </>
        }
      >
        The parts below are checked with today&apos;s settings, which size it differently; the saved
        version and its spec sheet keep the old ones. Re-size it on the{" "}
        <Link href={`/builds/${id}`} className="text-copper-700 underline">
          build sheet
        </Link>{" "}
        to bring them in step:
      </SettingsChangedNote>
      <KitPicker
        buildId={id}
        currency={s?.settings.currency ?? "USD"}
        canChoose={can(m.role, "kit:choose")}
        canQuote={can(m.role, "quotes:write")}
        quoteOnly={!can(m.role, "builds:write")}
        units={units}
      />
      <SafetyNote />
    </>
  );
}
