import { requireMember } from "@/lib/auth/member";
import { handle } from "@/lib/http/handler";
import { reorderRows } from "@/lib/purchasing/reorder";

/**
 * GET — parts to order: back-ordered by accepted quotes, or under their minimum, with what is on
 * order and a suggested quantity and supplier (staff only).
 */
export const GET = handle(async () => {
  const m = await requireMember("purchasing:read");
  return Response.json({ parts: await reorderRows(m.shopId) });
});
