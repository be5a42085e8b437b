import type { ReactNode } from "react";

import { AppFrame } from "@/components/shell/app-frame";
import { requirePageMember } from "@/lib/auth/member";

export default async function PortalLayout({ children }: { children: ReactNode }) {
  const member = await requirePageMember("portal:view");
  return <AppFrame member={member}>{children}</AppFrame>;
}
