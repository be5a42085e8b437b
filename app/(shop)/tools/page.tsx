import type { Metadata } from "next";

import { BlendMixer } from "@/components/tools/blend-mixer";
import { InjectorCheck } from "@/components/tools/injector-check";
import { SafetyNote } from "@/components/tools/safety-note";
import { PageHeader } from "@/components/ui/status";

export const metadata: Metadata = { title: "Tools" };

export default function ToolsPage() {
  return (
    <>
      <PageHeader title="Quick tools" />
      <p className="mb-6 max-w-3xl text-ink-700">
        Nothing here is saved. Figures update as you type.
      </p>
      <div className="grid gap-8 lg:grid-cols-2">
        <InjectorCheck />
        <BlendMixer />
      </div>
      <SafetyNote />
    </>
  );
}
