import { redirect } from "next/navigation";

import { currentMember } from "@/lib/auth/member";

export default async function Home() {
  const m = await currentMember();
  if (!m) redirect("/sign-in");
  redirect(m.role === "customer" ? "/my" : "/builds");
}
