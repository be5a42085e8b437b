import type { Metadata } from "next";

import { BlendMixer } from "@/components/tools/blend-mixer";
import { InjectorCheck } from "@/components/tools/injector-check";
import { SafetyNote } from "@/components/tools/safety-note";
import { PageHeader } from "@/components/ui/status";
import { unitSystemOf } from "@/db/queries/preferences";
import { requirePageMember } from "@/lib/auth/member";
import { shopSizingSettings } from "@/lib/sizing/shop-sizing";

export const metadata: Metadata = { title: "Tools" };

export default async function ToolsPage() {
  const m = await requirePageMember("calc:use");
  const [settings, units] = await Promise.all([
    shopSizingSettings(m.shopId),
    unitSystemOf(m.user.id, m.shopId),
  ]);
  return (
    <>
      <PageHeader title="Quick tools" />
      <p className="mb-6 max-w-3xl text-ink-700">
        Nothing here is saved. Figures update as you type, with the shop&apos;s sizing settings.
      </p>
      <div className="grid gap-8 lg:grid-cols-2">
        <InjectorCheck settings={settings} units={units} />
        <BlendMixer units={units} />
      </div>
      <SafetyNote />
    </>
  );
}
