import { requireMember } from "@/lib/auth/member";
import { shopBsfc } from "@/lib/dyno/log-analysis";
import { handle } from "@/lib/http/handler";

/** GET — the shop's measured BSFC by fuel class and aspiration, learnt from its verified builds. */
export const GET = handle(async () => {
  const m = await requireMember("builds:read");
  return Response.json({ rows: await shopBsfc(m.shopId) });
});
