import type { ReactNode } from "react";

import { AppFrame } from "@/components/shell/app-frame";
import { requirePageMember } from "@/lib/auth/member";
import { shopTimeZone } from "@/lib/shop/shop-zone";

export default async function PortalLayout({ children }: { children: ReactNode }) {
  const member = await requirePageMember("portal:view");
  return (
    <AppFrame member={member} timeZone={await shopTimeZone(member.shopId)}>
      {children}
    </AppFrame>
  );
}
