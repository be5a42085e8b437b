"use client";

import { useRouter } from "next/navigation";

import { TuneLimitsEditor, type LimitSource } from "@/components/dyno/tune-limits-editor";
import type { TuneLimitKey, TuneLimits } from "@/lib/calc/tune";
import type { UnitSystem } from "@/lib/calc/units";

/** The shop's default tune limits on the Settings page (the owner edits, others read). */
export function ShopTuneLimits(props: {
  units: UnitSystem;
  limits: TuneLimits;
  sources: Record<TuneLimitKey, LimitSource>;
  source: "shop" | "library";
  canWrite: boolean;
}) {
  const router = useRouter();
  return (
    <TuneLimitsEditor
      scope="shop"
      open
      units={props.units}
      limits={props.limits}
      sources={props.sources}
      base={props.limits}
      baseSource={props.source}
      canWrite={props.canWrite}
      canSetShopLimits={props.canWrite}
      onSaved={() => router.refresh()}
    />
  );
}
